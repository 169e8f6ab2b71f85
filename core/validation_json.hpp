#pragma once

#include "validation.hpp"

#include <nlohmann/json.hpp>

namespace plumbline {

// The `models` block of the result file (interface page) and the panel's settings.
nlohmann::ordered_json modelsJson(const ValidationResult& result);
nlohmann::ordered_json panelSettingsJson(const PanelSettings& settings);
// The top-level `bootstrap` block: replicates, seed, interval type, resampling, redraws.
nlohmann::ordered_json bootstrapJson(const ValidationResult& result);

// A number or null: undefined values are written as null, never as NaN.
nlohmann::ordered_json numberOrNull(const std::optional<double>& value);

} // namespace plumbline
