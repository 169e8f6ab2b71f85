#pragma once

#include "intake/delimited_table.hpp"
#include "intake/typed_table.hpp"

#include <cstddef>
#include <expected>
#include <optional>
#include <string>
#include <vector>

namespace plumbline {

// What `inspect` reports about one column.
struct ColumnProfile {
    std::string name;
    std::string type;             // empty, binary, integer, number, date, text
    std::size_t nonMissing = 0;
    std::size_t missing = 0;
    std::size_t distinct = 0;     // exact up to distinctCap
    bool distinctCapped = false;
    std::string minimum;          // numeric or date columns; empty otherwise
    std::string maximum;
    std::vector<std::string> notes; // problems found and likely roles
    std::vector<std::string> levels; // the two values of a binary column (lower-cased)
};

struct TableProfile {
    std::size_t rows = 0;
    std::size_t raggedRows = 0;           // rows whose field count differs from the header
    std::size_t firstRaggedLine = 0;
    std::vector<ColumnProfile> columns;
};

inline constexpr std::size_t distinctCap = 100000;

// Profiles every column of the table in one pass: sniffed type, counts, range and problems.
// With maxRows, only the first rows are read (enough for guessing roles in a dialog).
std::expected<TableProfile, InputError> profileColumns(const DelimitedTable& table, std::size_t maxRows = 0);
// The same for a typed source, each cell read as the text a delimited export would hold; a
// column's value labels are listed in its notes ("labels: 0 = No, 1 = Readmitted").
std::expected<TableProfile, InputError> profileColumns(TypedTable& table, std::size_t maxRows = 0);

} // namespace plumbline
