#pragma once

#include "metrics/estimate.hpp"
#include "charts/exportable_chart_view.hpp"

#include <optional>
#include <string>
#include <vector>

namespace plumbline {

// One period's estimate, for a chart over time.
struct PeriodPoint {
    std::string period;   // "2025-03" or "2025-Q1"
    Estimate estimate;
    bool flagged = false; // its interval misses the first year's (drawn hollow)
};

// A measure over time, left to right: each period's estimate and interval joined by a line, the
// first year's interval as a shaded band with its estimate as a dashed line, and an optional
// reference (O/E = 1, intercept = 0).
class PeriodChartView : public ExportableChartView {
    Q_OBJECT
public:
    PeriodChartView(const QString& title, const QString& axisTitle, QWidget* parent = nullptr);

    void setPoints(const std::vector<PeriodPoint>& points, const Estimate& firstYear, std::optional<double> reference, int modelIndex);

private:
    QString m_axisTitle;
};

} // namespace plumbline
