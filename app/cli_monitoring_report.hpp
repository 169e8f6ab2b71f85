#pragma once

#include "analyses/validation.hpp"

#include <ostream>

namespace plumbline::cli {

// Monitoring over time in a few lines per model and scope: the last expected-minus-observed
// value, each CUSUM's limit, achieved run length and signals, the latest year's PSI and the
// coding-shift question when it is asked. The charts and lists are in the JSON and the report.
void printMonitoring(std::ostream& out, const ValidationResult& result);

} // namespace plumbline::cli
