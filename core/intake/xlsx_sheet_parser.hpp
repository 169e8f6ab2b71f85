#pragma once

#include "intake/input_error.hpp"
#include "intake/xlsx_limits.hpp"
#include "intake/xlsx_xml_part.hpp"

#include <cstddef>
#include <cstdint>
#include <expected>
#include <functional>
#include <span>
#include <string>
#include <vector>

namespace plumbline {

// A cell's `t` attribute (ECMA-376 Part 1, 18.18.11): how its value is stored.
enum class XlsxCellType : std::uint8_t { Number, SharedString, InlineString, FormulaString, Boolean, Error, IsoDate };

// One cell as the worksheet writes it, before shared strings and date styles are applied.
struct XlsxRawCell {
    std::uint32_t column = 0; // 1-based: A is 1
    XlsxCellType type = XlsxCellType::Number;
    std::size_t style = 0;    // index into the cell formats
    bool hasFormula = false;
    bool hasValue = false;    // a <v> or an inline string was written, even an empty one
    std::string value;        // the <v> text, or the inline string's text
};

// The cell reference of a row and 1-based column, as a person reads it ("AB12").
std::string xlsxCellReference(std::size_t row, std::uint32_t column);

// Streams a worksheet's sheetData into whole rows. Rows are numbered as the sheet numbers them
// (the `r` attribute; a row without one follows the previous), cells by their reference's column
// (a cell without one follows the previous). A row or column that goes backwards, a reference
// that is not one, an unknown cell type or a cell text longer than the limit is an InputError
// naming the row.
class XlsxSheetParser : public XlsxXmlHandler {
public:
    // Called at each row's end with its number and cells (ascending columns, empty cells
    // absent). Returns false to stop reading, or an InputError to fail.
    using RowSink = std::function<std::expected<bool, InputError>(std::size_t row, std::span<const XlsxRawCell> cells)>;

    XlsxSheetParser(std::string file, const XlsxLimits& limits, RowSink sink);

    void start(std::string_view name, const char** attributes) override;
    void end(std::string_view name) override;
    void text(std::string_view chunk) override;

private:
    void startRow(const char** attributes);
    void startCell(const char** attributes);
    void badCell(const std::string& problem, const std::string& value);

    std::string m_file;
    XlsxLimits m_limits;
    RowSink m_sink;
    bool m_inSheetData = false;
    bool m_inRow = false;
    bool m_inCell = false;
    bool m_inValue = false;
    bool m_inInline = false;
    bool m_inPhonetic = false;
    bool m_inText = false;
    std::size_t m_row = 0;
    std::uint32_t m_column = 0;
    std::vector<XlsxRawCell> m_cells; // reused from row to row
    std::size_t m_cellCount = 0;
};

} // namespace plumbline
