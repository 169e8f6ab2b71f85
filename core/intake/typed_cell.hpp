#pragma once

#include <cstdint>
#include <string_view>

namespace plumbline {

// What one cell of a typed source (a statistical file, a spreadsheet, a query result) holds.
// Numbers stay numbers: no text round trip between the source and the intake.
enum class CellKind : std::uint8_t { Missing, Number, Text, Date };

// One cell as the source gave it. Missing covers every missing code of the source (SAS
// `.`/`.A`–`.Z`, Stata's extended missings, SPSS user-missing values, an empty cell, SQL NULL).
struct TypedCell {
    CellKind kind = CellKind::Missing;
    double number = 0.0;   // Number: the value as stored
    std::string_view text; // Text: valid only during the visit that shows it
    std::int64_t day = 0;  // Date: days since 1970-01-01, the time of day dropped

    static TypedCell missing() { return {}; }
    static TypedCell ofNumber(double value) { return {CellKind::Number, value, {}, 0}; }
    static TypedCell ofText(std::string_view value) { return {CellKind::Text, 0.0, value, 0}; }
    static TypedCell ofDate(std::int64_t daysSince1970) { return {CellKind::Date, 0.0, {}, daysSince1970}; }
};

} // namespace plumbline
