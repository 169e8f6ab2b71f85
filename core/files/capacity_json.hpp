#pragma once

#include "analyses/capacity_analysis.hpp"

#include <nlohmann/json.hpp>
#include <optional>

namespace plumbline {

// The top-level `capacity` block (docs/result-json.md): the capacity as asked, how it became a
// number of patients, and per model and period the threshold that flags it with the metrics
// there; null when no capacity was asked for.
nlohmann::ordered_json capacityJson(const std::optional<CapacityAnalysis>& capacity);

} // namespace plumbline
