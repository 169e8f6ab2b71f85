#pragma once

#include "intake/intake_settings.hpp"

#include <string>
#include <string_view>

namespace plumbline {

// Where a cohort's rows come from, decided by the settings: a database when one is named,
// otherwise by the file's extension (any case); every other file is read as delimited text.
enum class SourceKind { DelimitedText, Spreadsheet, StatisticalFile, Database };

SourceKind sourceKindOfPath(std::string_view path);
SourceKind sourceKindOf(const IntakeSettings& settings);
// "delimited text", "spreadsheet", "statistical file", "database query": for the audit and reports.
std::string sourceKindName(SourceKind kind);

inline bool isSpreadsheetPath(std::string_view path) { return sourceKindOfPath(path) == SourceKind::Spreadsheet; }
inline bool isTypedSourcePath(std::string_view path) { return sourceKindOfPath(path) != SourceKind::DelimitedText; }

} // namespace plumbline
