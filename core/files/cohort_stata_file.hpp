#pragma once

#include "files/cohort_cells.hpp"
#include "intake/input_error.hpp"

#include <expected>
#include <string>

namespace plumbline {

// The bytes of a Stata file (format 118) holding the cohort, written with ReadStat. A column
// whose cells are all numbers (or missing) is a double, missing as Stata's `.`; all dates, a
// double with the %td format (days since 1960-01-01); anything else a str column, where a
// number is written in its shortest exact form, a date as YYYY-MM-DD and a missing value as ""
// -- what a package's import of a text file makes of a column holding text. The time stamp
// and the file label are fixed, so the same cells give the same bytes. `path` only names the
// file in messages.
std::expected<std::string, InputError> cohortStataFileBytes(const CohortCells& cells, const std::string& path);

} // namespace plumbline
