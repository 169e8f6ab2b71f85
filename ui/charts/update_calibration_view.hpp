#pragma once

#include "charts/exportable_chart_view.hpp"
#include "metrics/risk_groups.hpp"

#include <vector>

class QLineSeries;

namespace plumbline {

// Risk groups before and after updating a model, against the ideal line, with the shared
// threshold as a vertical line.
class UpdateCalibrationView : public ExportableChartView {
    Q_OBJECT
public:
    explicit UpdateCalibrationView(QWidget* parent = nullptr);
    void setGroups(const std::vector<RiskGroup>& original, const std::vector<RiskGroup>& updated, int modelIndex);
    void setThreshold(double threshold);

private:
    QLineSeries* m_threshold = nullptr;
    double m_top = 1.0;
};

} // namespace plumbline
