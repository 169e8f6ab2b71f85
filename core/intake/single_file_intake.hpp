#pragma once

#include "intake/delimited_table.hpp"
#include "intake/intake_audit.hpp"
#include "intake/intake_settings.hpp"
#include "intake/staged_rows.hpp"

#include <expected>

namespace plumbline {

// Outcome and scores in one file: stages every structurally sound row.
struct StagedFile {
    StagedRows rows;
    OutcomeLevelCollector outcomeLevels;
};

std::expected<StagedFile, InputError> stageSingleFile(const DelimitedTable& table, const IntakeSettings& settings,
                                                      ExclusionCounter& exclusions, IntakeAudit& audit);

} // namespace plumbline
