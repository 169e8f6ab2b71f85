#pragma once

#include "charts/exportable_chart_view.hpp"

#include <string>
#include <vector>

namespace plumbline {

// One period's case mix as the core computed it (analyses/monitoring_analysis): mean predicted
// risk beside the observed rate, and the scores' PSI against the first year.
struct CaseMixPoint {
    std::string period;
    double meanPredicted = 0.0, observedRate = 0.0, psi = 0.0;
};

// Mean predicted risk and observed rate per period, left to right; a period's PSI in its tooltip.
class CaseMixView : public ExportableChartView {
    Q_OBJECT
public:
    explicit CaseMixView(QWidget* parent = nullptr);

    void setPoints(const std::vector<CaseMixPoint>& points, int modelIndex);
};

} // namespace plumbline
