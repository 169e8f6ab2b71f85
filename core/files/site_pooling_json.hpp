#pragma once

#include "analyses/validation.hpp"

#include <nlohmann/json.hpp>

namespace plumbline {

// The `site_pooling` block of the result file: per model and measure the site estimates, the
// pooled value (REML τ²) with its HKSJ interval and the prediction interval, τ² by REML and by
// DerSimonian–Laird, I², Q, and the probability of acceptable performance in a new site. Null
// when the run had no --cluster.
nlohmann::ordered_json sitePoolingJson(const ValidationResult& result);

} // namespace plumbline
