#pragma once

#include "analyses/validation.hpp"
#include "report/report_document.hpp"

#include <cstddef>

namespace plumbline {

// The monitoring part of the report's section on subgroups, sites and time: a summary per
// model and scope (the limits' simulation, signals, the latest year's PSI and the coding-shift
// question), the signals by month, the mean predicted risk and PSI per period, and the charts
// of the whole cohort. Aggregates only: a signal is given by its month, not its day, and a count
// of patients below `minimumCell` is suppressed; observed rates per period stay in the period
// table, under the small-cell plan.
void addMonitoring(ReportSection& section, const ValidationResult& v, std::size_t minimumCell);

} // namespace plumbline
