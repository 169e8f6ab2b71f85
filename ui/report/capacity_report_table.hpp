#pragma once

#include "report/report_document.hpp"

#include <optional>

namespace plumbline {

// The report's capacity table (docs/methods.md §21c): per model, then per model and period, the
// threshold that flags the capacity, what it flags and its metrics. The small-cell rule: a row
// any of whose counts (TP, FP, TN, FN) lies between 1 and the minimum cell shows no counts and
// withholds what is built on them, and so does a period whose patients or events the report
// suppresses elsewhere; a tie of 2 to the minimum cell at the threshold is suppressed on its own
// (one patient there is the printed threshold itself). A model's counts flagged by the whole
// cohort's threshold add up over the periods, so one small cell hides that column for all of the
// model's periods. Nothing when no capacity was asked for.
std::optional<ReportTable> capacityTable(const ValidationResult& result, const DisclosurePlan& plan);

} // namespace plumbline
