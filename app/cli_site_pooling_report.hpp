#pragma once

#include "analyses/validation.hpp"

#include <ostream>

namespace plumbline::cli {

// Pooling across sites (--cluster) in a few lines per model: each measure pooled with its HKSJ
// and prediction intervals, τ² and I², then the probability of acceptable performance in a new site.
void printSitePooling(std::ostream& out, const ValidationResult& result);

} // namespace plumbline::cli
