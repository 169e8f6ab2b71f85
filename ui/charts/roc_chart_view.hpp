#pragma once

#include "run/analysis_snapshot.hpp"
#include "charts/exportable_chart_view.hpp"

#include <QPointF>

#include <vector>

class QLineSeries;
class QAreaSeries;
class QScatterSeries;

namespace plumbline {

// ROC curves of every model (C and its interval in the legend), the bootstrap band when there
// is one, the chance diagonal, and a marker at the shared decision threshold.
class RocChartView : public ExportableChartView {
    Q_OBJECT
public:
    explicit RocChartView(QWidget* parent = nullptr);

    void setSnapshot(SnapshotPointer snapshot);
    void setThreshold(double threshold);
    void setModelVisible(int model, bool visible);

    // Where a model's threshold marker sits: (1 − specificity, sensitivity).
    QPointF markerPosition(int model) const;

private:
    struct ModelSeries {
        QLineSeries* curve = nullptr;
        QAreaSeries* band = nullptr;
        QScatterSeries* marker = nullptr;
    };
    void addAxes(QAbstractSeries* series);

    SnapshotPointer m_snapshot;
    std::vector<ModelSeries> m_series;
    QScatterSeries* m_thresholdKey = nullptr; // an empty series: the legend's entry for the dots
    double m_threshold = 0.2;
};

// Index into a model's operating points (every 0.005) nearest to a threshold.
std::size_t operatingPointIndex(double threshold);

} // namespace plumbline
