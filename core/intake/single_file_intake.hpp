#pragma once

#include "intake/delimited_table.hpp"
#include "intake/intake_audit.hpp"
#include "intake/intake_settings.hpp"
#include "intake/staged_rows.hpp"

#include <cstddef>
#include <expected>
#include <optional>

namespace plumbline {

// Outcome and scores in one file: stages every structurally sound row.
struct StagedFile {
    StagedRows rows;
    OutcomeLevelCollector outcomeLevels;
};

// Files at least this large are read on two threads, each from its own half.
inline constexpr std::size_t twoThreadIntakeBytes = std::size_t{32} << 20;

// Stages the rows of a file read from disk on two threads when it is large enough, on one
// otherwise.
std::expected<StagedFile, InputError> stageSingleFile(const DelimitedTable& table, const IntakeSettings& settings,
                                                      ExclusionCounter& exclusions, IntakeAudit& audit);

// The same, with the second thread starting at the first line after text offset `splitNear`
// (nullopt: one thread). The second thread's start is a guess (a quoted field may hold a line
// break); it is kept only when the first thread's records end exactly there, and the two parts
// are then joined with their lines, levels and exclusions renumbered, so that the result is the
// same as one thread's in every case. Tests choose the split.
std::expected<StagedFile, InputError> stageSingleFile(const DelimitedTable& table, const IntakeSettings& settings,
                                                      ExclusionCounter& exclusions, IntakeAudit& audit,
                                                      std::optional<std::size_t> splitNear);

} // namespace plumbline
