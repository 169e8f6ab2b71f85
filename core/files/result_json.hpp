#pragma once

#include "intake/intake.hpp"
#include "intake/intake_settings.hpp"

#include <nlohmann/json.hpp>

#include <string>

namespace plumbline {

// The blocks of the result file (see the interface page): provenance, inputs, settings, cohort.
nlohmann::ordered_json provenanceJson(const std::string& createdUtc);
nlohmann::ordered_json inputsJson(const std::vector<InputFingerprint>& inputs);
nlohmann::ordered_json intakeSettingsJson(const IntakeSettings& settings);
nlohmann::ordered_json cohortJson(const IntakeAudit& audit);

// Current time as ISO-8601 UTC ("2026-12-02T01:54:50Z").
std::string utcTimestamp();

} // namespace plumbline
