#pragma once

#include "charts/exportable_chart_view.hpp"
#include "analyses/subgroup_analysis.hpp"

class QGraphicsSimpleTextItem;

namespace plumbline {

// O/E of each level against its expected events, inside the exact Poisson 95 % and 99.8 %
// control limits around O/E = 1 (Spiegelhalter 2005), each point labelled with its level.
class FunnelChartView : public ExportableChartView {
    Q_OBJECT
public:
    explicit FunnelChartView(QWidget* parent = nullptr);

    void setFunnel(const std::vector<FunnelPoint>& points, const FunnelLimits* limits, int modelIndex);
    // The names drawn beside the points (tests check that none overlaps another).
    const std::vector<QGraphicsSimpleTextItem*>& labels() const { return m_labels; }

private:
    void placeLabels();

    std::vector<FunnelPoint> m_points;
    std::vector<QGraphicsSimpleTextItem*> m_labels;
};

} // namespace plumbline
