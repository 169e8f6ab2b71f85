#pragma once

#include "run/analysis_snapshot.hpp"
#include "charts/exportable_chart_view.hpp"

#include <QPointF>

#include <vector>

class QAreaSeries;
class QLineSeries;
class QScatterSeries;

namespace plumbline {

// Calibration plot: risk-group points (observed proportion against mean predicted risk) with
// interval whiskers, the smoothed curve with its bootstrap band, the line of ideal calibration,
// and a vertical line at the shared threshold. Hovering a point reports the risk group; a
// selected group is ringed.
class CalibrationChartView : public ExportableChartView {
    Q_OBJECT
public:
    explicit CalibrationChartView(QWidget* parent = nullptr);

    void setSnapshot(SnapshotPointer snapshot);
    void setThreshold(double threshold);
    void setModelVisible(int model, bool visible);
    void highlightRiskGroup(int model, int group); // group −1: none

    double thresholdLineX() const;
    QPointF highlightedPoint() const;
    double axisMaximum() const { return m_maximum; }

signals:
    void riskGroupHovered(int model, int group);
    void riskGroupClicked(int model, int group);

private:
    struct ModelSeries {
        QScatterSeries* groups = nullptr;
        QLineSeries* curve = nullptr;
        QAreaSeries* band = nullptr;
        std::vector<QLineSeries*> whiskers;
    };
    void attach(QAbstractSeries* series, bool inLegend);
    int groupAt(int model, const QPointF& point) const;
    QString groupTip(int model, int group) const;

    SnapshotPointer m_snapshot;
    std::vector<ModelSeries> m_series;
    QLineSeries* m_thresholdLine = nullptr;
    QScatterSeries* m_highlight = nullptr;
    std::vector<bool> m_visible;
    int m_highlightModel = -1;
    double m_maximum = 1.0;
    double m_threshold = 0.2;
};

} // namespace plumbline
