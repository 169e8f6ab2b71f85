#pragma once

#include "intake/intake_audit.hpp"
#include "intake/intake_settings.hpp"
#include "intake/single_file_intake.hpp"
#include "intake/typed_table.hpp"

#include <expected>
#include <string>

namespace plumbline {

// A typed cell as the text a delimited file would hold for it: a number in its shortest exact
// form ("1", "0.25"), a labelled number as its label where `labels` is given, a date as
// YYYY-MM-DD, a missing cell as "". Used for outcome levels, groups, period dates and ids, so a
// cohort reads the same from a sheet, a statistical file, a database or a CSV.
std::string typedCellText(const TypedCell& cell, const std::vector<ValueLabel>* labels = nullptr);

// Stages every record of a typed source, as stageSingleFile does for a delimited file: the same
// checks, exclusions and audit, with positions in place of lines. Outcome levels and ids are the
// cells' texts (typedCellText, without labels), so an event value written as a code or, for a
// statistical file, as the code's label ("Readmitted") both name the same level; group levels
// show labels. Score cells stay numbers; a text cell in a score column is read as a delimited
// field would be.
std::expected<StagedFile, InputError> stageTypedTable(TypedTable& table, const IntakeSettings& settings,
                                                      ExclusionCounter& exclusions, IntakeAudit& audit);

// The event value the user gave, turned into the outcome column's code when it names one of the
// column's value labels (case-insensitively); otherwise as given. Without one, an outcome whose
// two codes are labelled as a recognised pair (No/Yes, False/True) takes the event from its labels.
std::optional<std::string> eventValueAsCode(const TypedTable& table, const IntakeSettings& settings);

// Index of a column by exact name, or an InputError naming the closest columns.
std::expected<std::size_t, InputError> typedColumnIndex(const TypedTable& table, const std::string& name,
                                                        const std::string& role);

} // namespace plumbline
