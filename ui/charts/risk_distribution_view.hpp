#pragma once

#include "run/analysis_snapshot.hpp"
#include "charts/exportable_chart_view.hpp"

class QLineSeries;

namespace plumbline {

// How predicted risk is spread among patients with and without the event (share of each class
// per bin of 0.02), for one model in its own colour, with the shared threshold as a line.
class RiskDistributionView : public ExportableChartView {
    Q_OBJECT
public:
    explicit RiskDistributionView(QWidget* parent = nullptr);

    // `model` −1 clears the chart (no model is shown).
    void setSnapshot(SnapshotPointer snapshot, int model, double axisMaximum);
    void setModel(int model);
    int model() const { return m_model; }
    void setThreshold(double threshold);
    double thresholdLineX() const;

private:
    void draw();

    SnapshotPointer m_snapshot;
    QLineSeries* m_thresholdLine = nullptr;
    int m_model = -1;
    double m_axisMaximum = 1.0;
    double m_top = 0.1;
    double m_threshold = 0.2;
};

} // namespace plumbline
