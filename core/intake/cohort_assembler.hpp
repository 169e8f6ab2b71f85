#pragma once

#include "intake/cohort.hpp"
#include "intake/input_error.hpp"
#include "intake/intake_audit.hpp"
#include "intake/intake_settings.hpp"
#include "intake/staged_rows.hpp"

#include <expected>
#include <string>

namespace plumbline {

// Where the staged rows came from, for messages and for the exclusion tallies.
struct StagedSources {
    std::string cohortFile;
    std::string outcomeFile; // the same as cohortFile for a single file
};

// Turns staged rows into the cohort: codes the outcome, applies the score scale (stopping when
// the default probability scale clearly does not fit), and excludes each incomplete row under
// the first reason that applies. Fills the audit's events, rows used, exclusions and column costs.
std::expected<Cohort, InputError> assembleCohort(StagedRows&& staged, const std::vector<OutcomeLevel>& levels,
                                                 const IntakeSettings& settings, const StagedSources& sources,
                                                 ExclusionCounter& exclusions, IntakeAudit& audit);

} // namespace plumbline
