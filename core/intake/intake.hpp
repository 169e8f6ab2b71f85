#pragma once

#include "intake/cohort.hpp"
#include "intake/input_error.hpp"
#include "intake/intake_audit.hpp"
#include "intake/intake_settings.hpp"
#include "intake/text_file.hpp"
#include "intake/typed_table.hpp"

#include <cstddef>
#include <expected>
#include <optional>
#include <string>
#include <vector>

namespace plumbline {

// Identity of one input file as read: its role, path, SHA-256 and number of data rows.
struct InputFingerprint {
    std::string role; // "cohort" or "outcomes"
    std::string path; // for a query, the database's URI without anything secret
    std::string sha256; // of the file's bytes, or of a query's result set as read
    std::size_t rows = 0;
    std::string kind = "delimited text"; // sourceKindName
    std::optional<std::string> sheet;
    std::optional<std::string> query;
};

struct IntakeResult {
    Cohort cohort;
    IntakeAudit audit;
    std::vector<InputFingerprint> inputs;
};

// Reads the files named in the settings into a cohort and its audit. Nothing is written.
std::expected<IntakeResult, InputError> runIntake(const IntakeSettings& settings);

// The same on a typed source already open (a statistical file, a sheet, a query result).
std::expected<IntakeResult, InputError> runIntake(const IntakeSettings& settings, TypedTable& table);

// The same on files already in memory (the outcomes file only when settings.outcomesFile is set).
std::expected<IntakeResult, InputError> runIntake(const IntakeSettings& settings, TextFile cohortFile,
                                                  std::optional<TextFile> outcomesFile);

} // namespace plumbline
