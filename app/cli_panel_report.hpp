#pragma once

#include "analyses/validation.hpp"

#include <ostream>

namespace plumbline::cli {

// The metric panel as readable text: per model, each metric with its estimate, interval and a
// plain reading; the calibration tests; the threshold table; then the warnings.
void printPanel(std::ostream& out, const ValidationResult& result);

} // namespace plumbline::cli
