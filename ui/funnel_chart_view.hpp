#pragma once

#include "exportable_chart_view.hpp"
#include "subgroup_analysis.hpp"

namespace plumbline {

// O/E of each level against its expected events, inside the exact Poisson 95 % and 99.8 %
// control limits around O/E = 1 (Spiegelhalter 2005). Expected events on a log axis so that
// small and large sites are both readable.
class FunnelChartView : public ExportableChartView {
    Q_OBJECT
public:
    explicit FunnelChartView(QWidget* parent = nullptr);

    void setFunnel(const std::vector<FunnelPoint>& points, const FunnelLimits* limits, int modelIndex);
};

} // namespace plumbline
