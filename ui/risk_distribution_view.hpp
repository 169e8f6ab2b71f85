#pragma once

#include "analysis_snapshot.hpp"
#include "exportable_chart_view.hpp"

class QLineSeries;

namespace plumbline {

// How predicted risk is spread among patients with and without the event (share of each class
// per bin of 0.02), for one model, with the shared threshold as a vertical line.
class RiskDistributionView : public ExportableChartView {
    Q_OBJECT
public:
    explicit RiskDistributionView(QWidget* parent = nullptr);

    void setSnapshot(SnapshotPointer snapshot, int model, double axisMaximum);
    void setThreshold(double threshold);
    double thresholdLineX() const;

private:
    SnapshotPointer m_snapshot;
    QLineSeries* m_thresholdLine = nullptr;
    double m_top = 0.1;
    double m_threshold = 0.2;
};

} // namespace plumbline
