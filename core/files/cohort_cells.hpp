#pragma once

#include "intake/input_error.hpp"
#include "intake/typed_cell.hpp"

#include <cstdint>
#include <string>
#include <vector>

namespace plumbline {

// One cell of a table to be written as a workbook or a statistical file. Unlike TypedCell it
// owns its text, since the whole table is built before it is written.
struct CohortCell {
    CellKind kind = CellKind::Missing;
    double number = 0.0;  // Number
    std::string text;     // Text
    std::int64_t day = 0; // Date: days since 1970-01-01

    static CohortCell missing() { return {}; }
    static CohortCell ofNumber(double value) { return {CellKind::Number, value, {}, 0}; }
    static CohortCell ofText(std::string value) { return {CellKind::Text, 0.0, std::move(value), 0}; }
    static CohortCell ofDate(std::int64_t daysSince1970) { return {CellKind::Date, 0.0, {}, daysSince1970}; }
};

// A cohort as typed cells: the column names and one row of cells per record, every row as
// long as `columns`.
struct CohortCells {
    std::vector<std::string> columns;
    std::vector<std::vector<CohortCell>> rows;
};

// Why the cells could not be written to `path` (a column's name or value, or the file itself).
inline InputError cohortWriteError(const std::string& path, std::string column, std::string problem, std::string remedy)
{
    InputError error;
    error.file = path;
    error.column = std::move(column);
    error.problem = std::move(problem);
    error.remedy = std::move(remedy);
    return error;
}

} // namespace plumbline
