#include "intake/xlsx_sheet_parser.hpp"

#include <charconv>
#include <cstring>
#include <optional>
#include <utility>

namespace plumbline {

namespace {

// A spreadsheet has at most 16,384 columns (XFD) and 1,048,576 rows; larger numbers are still
// read (other writers may go further) up to what a position can hold.
constexpr std::uint32_t maxColumn = 16384;

// The column of a reference such as "AB12" (28); nullopt when it is not a reference.
std::optional<std::uint32_t> referenceColumn(std::string_view reference)
{
    std::uint32_t column = 0;
    std::size_t i = 0;
    for (; i < reference.size() && reference[i] >= 'A' && reference[i] <= 'Z'; ++i) {
        column = column * 26 + static_cast<std::uint32_t>(reference[i] - 'A' + 1);
        if (column > maxColumn)
            return std::nullopt;
    }
    if (i == 0 || i == reference.size())
        return std::nullopt;
    for (; i < reference.size(); ++i) {
        if (reference[i] < '0' || reference[i] > '9')
            return std::nullopt;
    }
    return column;
}

std::optional<XlsxCellType> cellType(const char* t)
{
    if (!t)
        return XlsxCellType::Number;
    const std::string_view type(t);
    if (type == "n")
        return XlsxCellType::Number;
    if (type == "s")
        return XlsxCellType::SharedString;
    if (type == "inlineStr")
        return XlsxCellType::InlineString;
    if (type == "str")
        return XlsxCellType::FormulaString;
    if (type == "b")
        return XlsxCellType::Boolean;
    if (type == "e")
        return XlsxCellType::Error;
    if (type == "d")
        return XlsxCellType::IsoDate;
    return std::nullopt;
}

} // namespace

std::string xlsxCellReference(std::size_t row, std::uint32_t column)
{
    std::string letters;
    for (std::uint32_t c = column; c > 0; c = (c - 1) / 26)
        letters.insert(letters.begin(), static_cast<char>('A' + (c - 1) % 26));
    return letters + std::to_string(row);
}

XlsxSheetParser::XlsxSheetParser(std::string file, const XlsxLimits& limits, RowSink sink)
    : m_file(std::move(file))
    , m_limits(limits)
    , m_sink(std::move(sink))
{
}

void XlsxSheetParser::badCell(const std::string& problem, const std::string& value)
{
    InputError error;
    error.file = m_file;
    error.line = m_row;
    error.lineNoun = "row"; // the sheet's own row number, as the spreadsheet program shows it
    error.value = value;
    error.problem = problem;
    error.remedy = "the sheet is damaged or was not written by a spreadsheet program: open it in one and save it again as .xlsx.";
    fail(std::move(error));
}

void XlsxSheetParser::start(std::string_view name, const char** attributes)
{
    if (name == "sheetData") {
        m_inSheetData = true;
    } else if (!m_inSheetData) {
        return;
    } else if (name == "row") {
        startRow(attributes);
    } else if (name == "c" && m_inRow) {
        startCell(attributes);
    } else if (!m_inCell) {
        return;
    } else if (name == "v") {
        m_inValue = true;
        m_cells[m_cellCount - 1].hasValue = true;
    } else if (name == "f") {
        m_cells[m_cellCount - 1].hasFormula = true;
    } else if (name == "is") {
        m_inInline = true;
        m_cells[m_cellCount - 1].hasValue = true;
    } else if (name == "rPh") {
        m_inPhonetic = true;
    } else if (name == "t") {
        m_inText = m_inInline && !m_inPhonetic;
    }
}

void XlsxSheetParser::startRow(const char** attributes)
{
    std::size_t row = m_row + 1;
    if (const char* r = xlsxAttribute(attributes, "r")) {
        const std::string_view text(r);
        std::size_t parsed = 0;
        const auto [end, error] = std::from_chars(text.data(), text.data() + text.size(), parsed);
        if (error != std::errc() || end != text.data() + text.size() || parsed == 0)
            return badCell("a row's number is not a positive whole number.", std::string(text));
        if (parsed <= m_row) {
            const std::size_t previous = std::exchange(m_row, parsed); // the error names the row out of place
            return badCell("row " + std::to_string(parsed) + " comes after row " + std::to_string(previous)
                               + ": the rows are out of order.", std::string(text));
        }
        row = parsed;
    }
    m_row = row;
    m_inRow = true;
    // A row inside a cell is malformed; closing the cell keeps every index below in range.
    m_inCell = m_inValue = m_inInline = m_inPhonetic = m_inText = false;
    m_column = 0;
    m_cellCount = 0;
}

void XlsxSheetParser::startCell(const char** attributes)
{
    std::uint32_t column = m_column + 1;
    if (const char* r = xlsxAttribute(attributes, "r")) {
        const auto parsed = referenceColumn(r);
        if (!parsed)
            return badCell("a cell's reference is not a cell reference such as B7.", r);
        if (*parsed <= m_column)
            return badCell("the cells of the row are out of order (" + std::string(r) + " after column "
                               + std::to_string(m_column) + ").", r);
        column = *parsed;
    }
    if (column > maxColumn)
        return badCell("a cell lies beyond the last column a spreadsheet has (XFD).", xlsxCellReference(m_row, column));
    const auto type = cellType(xlsxAttribute(attributes, "t"));
    if (!type)
        return badCell("cell " + xlsxCellReference(m_row, column) + " has a type that is not a spreadsheet cell type.",
                       xlsxAttribute(attributes, "t"));
    std::size_t style = 0;
    if (const char* s = xlsxAttribute(attributes, "s"))
        std::from_chars(s, s + std::strlen(s), style); // an unreadable style is no style: the number stays a number
    m_column = column;
    if (m_cellCount == m_cells.size())
        m_cells.emplace_back();
    XlsxRawCell& cell = m_cells[m_cellCount++];
    cell.column = column;
    cell.type = *type;
    cell.style = style;
    cell.hasFormula = false;
    cell.hasValue = false;
    cell.value.clear();
    m_inCell = true;
}

void XlsxSheetParser::end(std::string_view name)
{
    if (name == "sheetData") {
        m_inSheetData = false;
    } else if (!m_inSheetData) {
        return;
    } else if (name == "row" && m_inRow) {
        m_inRow = false;
        auto kept = m_sink(m_row, std::span<const XlsxRawCell>(m_cells.data(), m_cellCount));
        if (!kept)
            fail(std::move(kept.error()));
        else if (!*kept)
            finish();
    } else if (name == "c") {
        m_inCell = m_inValue = m_inInline = m_inPhonetic = m_inText = false;
    } else if (name == "v") {
        m_inValue = false;
    } else if (name == "is") {
        m_inInline = false;
    } else if (name == "rPh") {
        m_inPhonetic = false;
    } else if (name == "t") {
        m_inText = false;
    }
}

void XlsxSheetParser::text(std::string_view chunk)
{
    if (!m_inValue && !m_inText)
        return;
    XlsxRawCell& cell = m_cells[m_cellCount - 1];
    if (cell.value.size() + chunk.size() > m_limits.cellBytes)
        return badCell("cell " + xlsxCellReference(m_row, cell.column) + " holds more than "
                           + std::to_string(m_limits.cellBytes) + " bytes of text, more than a spreadsheet cell keeps.",
                       xlsxCellReference(m_row, cell.column));
    cell.value.append(chunk);
}

} // namespace plumbline
