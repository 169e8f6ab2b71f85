#pragma once

#include "intake/input_error.hpp"
#include "intake/intake_settings.hpp"
#include "intake/typed_table.hpp"

#include <expected>
#include <memory>
#include <string>

namespace plumbline {

// Opens the typed source the settings name (sourceKindOf): a statistical file, a workbook's sheet
// (settings.sheet) or a database query (settings.database, settings.query). Delimited text is
// not a typed source and is refused here.
std::expected<std::unique_ptr<TypedTable>, InputError> openTypedSource(const IntakeSettings& settings);

} // namespace plumbline
