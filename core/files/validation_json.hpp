#pragma once

#include "analyses/validation.hpp"

#include <nlohmann/json.hpp>

namespace plumbline {

// The `models` block of the result file (interface page) and the panel's settings.
nlohmann::ordered_json modelsJson(const ValidationResult& result);
nlohmann::ordered_json panelSettingsJson(const PanelSettings& settings);
// The top-level `bootstrap` block: replicates, seed, interval type, resampling, redraws.
nlohmann::ordered_json bootstrapJson(const ValidationResult& result);

// The `comparisons` block: every pair, differences model_b − model_a with intervals and tests,
// net benefit differences by threshold, the reclassification table and the cautions.
nlohmann::ordered_json comparisonsJson(const ValidationResult& result);

// The subgroup, heterogeneity, funnel, period and precision blocks (null when not part of the run).
void addUsefulnessFairnessDriftJson(nlohmann::ordered_json& json, const ValidationResult& result);

// A number or null: undefined values are written as null, never as NaN.
nlohmann::ordered_json numberOrNull(const std::optional<double>& value);

} // namespace plumbline
