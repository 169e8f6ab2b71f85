#pragma once

#include "intake/typed_cell.hpp"
#include "intake/xlsx_shared_strings.hpp"
#include "intake/xlsx_sheet_parser.hpp"
#include "intake/xlsx_styles.hpp"

#include <expected>
#include <string>

namespace plumbline {

// What a worksheet cell is worth once shared strings, date styles and the date system apply.
class XlsxCellValues {
public:
    // Why a cell that holds something reads as missing; each is counted in a warning.
    enum class Note { None, ErrorValue, FormulaWithoutValue, DateOutOfRange };
    struct Reading {
        TypedCell cell;
        Note note = Note::None;
    };

    XlsxCellValues(const XlsxSharedStrings& strings, const XlsxStyles& styles, bool date1904);

    // The cell's value; its text views point into the shared strings or the raw cell, so they
    // last as long as both. A value its type cannot hold (a number that is not one, a shared
    // string index past the table) is the problem, one sentence.
    std::expected<Reading, std::string> read(const XlsxRawCell& raw) const;
    // The cell as a column name: text as it is, numbers in their shortest exact form, dates as
    // YYYY-MM-DD, booleans TRUE/FALSE, errors by their code; a problem as in read().
    std::expected<std::string, std::string> name(const XlsxRawCell& raw) const;

private:
    const XlsxSharedStrings& m_strings;
    const XlsxStyles& m_styles;
    bool m_date1904;
};

} // namespace plumbline
