#pragma once

#include "run/analysis_snapshot.hpp"
#include "charts/exportable_chart_view.hpp"

#include <vector>

class QAreaSeries;
class QLineSeries;

namespace plumbline {

// Net benefit of each model, of treating everyone and of treating no one over the decision
// range, with the bootstrap band when there is one, and a vertical line at the shared threshold.
// The y axis stops a little below zero: treat-all falls steeply at high thresholds and would
// otherwise flatten the curves that matter.
class DecisionCurveView : public ExportableChartView {
    Q_OBJECT
public:
    explicit DecisionCurveView(QWidget* parent = nullptr);

    void setSnapshot(SnapshotPointer snapshot);
    void setThreshold(double threshold);
    void setModelVisible(int model, bool visible);
    double thresholdLineX() const;

private:
    struct ModelSeries {
        QLineSeries* curve = nullptr;
        QAreaSeries* band = nullptr;
    };
    SnapshotPointer m_snapshot;
    std::vector<ModelSeries> m_series;
    QLineSeries* m_thresholdLine = nullptr;
    double m_bottom = -0.05, m_top = 0.1;
    double m_threshold = 0.2;
};

} // namespace plumbline
