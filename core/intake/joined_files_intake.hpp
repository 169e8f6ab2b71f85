#pragma once

#include "intake/delimited_table.hpp"
#include "intake/intake_audit.hpp"
#include "intake/intake_settings.hpp"
#include "intake/single_file_intake.hpp"

#include <expected>

namespace plumbline {

// Scores in one file, outcomes in another, joined on an id compared as a trimmed exact string.
// A duplicated id excludes every copy on its side; ids without a partner are counted on both
// sides (audit.join). Stages the score rows that found exactly one outcome row.
std::expected<StagedFile, InputError> stageJoinedFiles(const DelimitedTable& scores, const DelimitedTable& outcomes,
                                                       const IntakeSettings& settings, ExclusionCounter& exclusions,
                                                       IntakeAudit& audit);

} // namespace plumbline
