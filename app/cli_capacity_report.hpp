#pragma once

#include "analyses/validation.hpp"

#include <ostream>

namespace plumbline::cli {

// The capacity lines of the printed summary: per model the threshold that flags the capacity,
// ties said in words, and the metrics there; per period how many the capacity and the whole
// cohort's threshold flag.
void printCapacity(std::ostream& out, const ValidationResult& result);

} // namespace plumbline::cli
