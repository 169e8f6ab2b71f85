#pragma once

#include "files/cohort_cells.hpp"
#include "intake/input_error.hpp"

#include <cstddef>
#include <expected>
#include <string>

namespace plumbline {

// A worksheet holds 1,048,576 rows (Excel's limit), the header included.
constexpr std::size_t workbookMaxRecords = 1048575;

// Writes the cohort as a workbook with one sheet, "Cohort": a header row, then one row per
// record with numbers as numbers, dates as date cells (shown YYYY-MM-DD), text as text and a
// missing value as an empty cell. The workbook's creation time is fixed, so the same cells give
// the same bytes. Written under a temporary name and renamed into place.
std::expected<void, InputError> writeCohortWorkbook(const CohortCells& cells, const std::string& path);

} // namespace plumbline
