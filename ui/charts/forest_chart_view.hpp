#pragma once

#include "metrics/estimate.hpp"
#include "charts/exportable_chart_view.hpp"

#include <optional>
#include <string>
#include <vector>

namespace plumbline {

// One row of a forest chart: a level's estimate with its interval.
struct ForestRow {
    std::string label;
    Estimate estimate;
    bool hollow = false; // a level too small to estimate well, or a period marked as drifting
    std::string mark;    // why it is hollow, shown after the label
};

// A forest chart: each level's estimate and interval on its own line, the overall value as a
// vertical line (and the first row), and an optional reference such as O/E = 1.
class ForestChartView : public ExportableChartView {
    Q_OBJECT
public:
    explicit ForestChartView(const QString& title, const QString& axisTitle, QWidget* parent = nullptr);

    void setRows(const std::vector<ForestRow>& rows, const Estimate& overall, std::optional<double> reference, int modelIndex);

private:
    QString m_axisTitle;
};

} // namespace plumbline
