#include "intake/xlsx_table.hpp"

#include "intake/field_values.hpp"
#include "intake/file_fingerprint.hpp"
#include "intake/read_only_file.hpp"
#include "intake/xlsx_archive.hpp"
#include "intake/xlsx_cell_values.hpp"
#include "intake/xlsx_sheet_parser.hpp"
#include "intake/xlsx_shared_strings.hpp"
#include "intake/xlsx_styles.hpp"
#include "intake/xlsx_workbook.hpp"
#include "intake/xlsx_xml_part.hpp"

#include <algorithm>
#include <cctype>
#include <charconv>

namespace plumbline {

namespace {

// How often something was seen while reading, and where first.
struct Tally {
    std::size_t count = 0;
    std::string first;
    void add(const std::string& where)
    {
        if (count++ == 0)
            first = where;
    }
};

std::string counted(std::size_t count, const char* one, const char* many)
{
    return std::to_string(count) + " " + (count == 1 ? one : many);
}

// "Cohort!C14", or "'Visit 2'!C14" for a name a formula would have to quote.
std::string sheetCell(const std::string& sheet, std::size_t row, std::uint32_t column)
{
    const bool plain = !sheet.empty() && std::all_of(sheet.begin(), sheet.end(), [](unsigned char c) {
        return std::isalnum(c) || c == '_' || c == '.';
    });
    std::string quoted;
    for (const char c : sheet)
        quoted += c == '\'' ? std::string("''") : std::string(1, c);
    return (plain ? sheet : "'" + quoted + "'") + "!" + xlsxCellReference(row, column);
}

bool hasContent(const XlsxRawCell& cell)
{
    return cell.hasFormula || !cell.value.empty();
}

class XlsxTable final : public TypedTable {
public:
    XlsxTable(std::string path, XlsxArchive archive, const XlsxWorkbook& workbook, XlsxSharedStrings strings, XlsxStyles styles,
              const XlsxSheetEntry& sheet, const XlsxLimits& limits)
        : m_path(std::move(path))
        , m_archive(std::move(archive))
        , m_strings(std::move(strings))
        , m_styles(std::move(styles))
        , m_values(m_strings, m_styles, workbook.date1904)
        , m_sheet(sheet)
        , m_source(m_path + ", sheet '" + sheet.name + "'")
        , m_limits(limits)
    {
    }

    const std::string& sourceName() const override { return m_source; }
    std::optional<std::string> sheetName() const override { return m_sheet.name; }
    const std::vector<TypedColumn>& columns() const override { return m_columns; }

    std::expected<void, InputError> readHeader();
    std::expected<void, InputError> forEachRecord(const Visit& visit) override;
    std::vector<std::string> warnings() const override;
    std::expected<std::string, InputError> fingerprint() const override;

private:
    InputError cellError(std::size_t row, std::uint32_t column, const std::string& value, std::string problem) const;
    std::expected<bool, InputError> visitRow(std::size_t row, std::span<const XlsxRawCell> raw, const Visit& visit);

    std::string m_path;
    XlsxArchive m_archive;
    XlsxSharedStrings m_strings;
    XlsxStyles m_styles;
    XlsxCellValues m_values;
    XlsxSheetEntry m_sheet;
    std::string m_source;
    XlsxLimits m_limits;
    std::vector<TypedColumn> m_columns;
    std::size_t m_headerRow = 0;
    std::uint32_t m_firstColumn = 1; // the sheet column of the first table column
    std::vector<TypedCell> m_cells;
    Tally m_errors, m_formulas, m_outOfRangeDates, m_rowsBeyond;
    std::string m_firstErrorValue;
};

InputError XlsxTable::cellError(std::size_t row, std::uint32_t column, const std::string& value, std::string problem) const
{
    InputError error;
    error.file = m_source;
    error.line = row;
    error.lineNoun = "row"; // the sheet's own row number, as the spreadsheet program shows it
    const bool inTable = column >= m_firstColumn && column - m_firstColumn < m_columns.size();
    error.column = inTable ? m_columns[column - m_firstColumn].name : xlsxCellReference(row, column);
    error.value = value;
    error.problem = "cell " + xlsxCellReference(row, column) + ": " + std::move(problem);
    error.remedy = "the workbook is damaged or was not written by a spreadsheet program: open it in one, check the cell and save it again.";
    return error;
}

std::expected<void, InputError> XlsxTable::readHeader()
{
    std::optional<InputError> failure;
    XlsxSheetParser parser(m_source, m_limits, [&](std::size_t row, std::span<const XlsxRawCell> raw) -> std::expected<bool, InputError> {
        std::vector<std::pair<std::uint32_t, std::string>> names;
        for (const XlsxRawCell& cell : raw) {
            auto name = m_values.name(cell);
            if (!name)
                return std::unexpected(cellError(row, cell.column, cell.value, name.error()));
            if (!name->empty())
                names.emplace_back(cell.column, std::move(*name));
        }
        if (names.empty())
            return true; // the header is the first row that names something
        // The columns run from the first named cell to the last: a sheet that starts in column
        // B has no nameless column A, while a gap inside the header is a column without a name.
        m_headerRow = row;
        m_firstColumn = names.front().first;
        m_columns.resize(names.back().first - m_firstColumn + 1);
        for (auto& [column, name] : names)
            m_columns[column - m_firstColumn].name = std::move(name);
        return false;
    });
    if (auto parsed = parseXlsxPart(m_archive, m_sheet.part, m_limits.partBytes, parser); !parsed)
        return std::unexpected(parsed.error());
    if (m_columns.empty()) {
        InputError error;
        error.file = m_source;
        error.problem = "the sheet holds no values, so it has no header row naming the columns.";
        error.remedy = "choose the sheet that holds the cohort (--sheet NAME).";
        return std::unexpected(error);
    }
    return {};
}

std::expected<bool, InputError> XlsxTable::visitRow(std::size_t row, std::span<const XlsxRawCell> raw, const Visit& visit)
{
    if (row <= m_headerRow)
        return true;
    std::fill(m_cells.begin(), m_cells.end(), TypedCell::missing());
    bool any = false;
    bool beyond = false;
    for (const XlsxRawCell& cell : raw) {
        if (cell.column < m_firstColumn || cell.column - m_firstColumn >= m_columns.size()) {
            if (hasContent(cell) && !beyond)
                m_rowsBeyond.add(sheetCell(m_sheet.name, row, cell.column));
            beyond = beyond || hasContent(cell);
            continue;
        }
        const auto reading = m_values.read(cell);
        if (!reading)
            return std::unexpected(cellError(row, cell.column, cell.value, reading.error()));
        const std::string where = reading->note == XlsxCellValues::Note::None ? "" : sheetCell(m_sheet.name, row, cell.column);
        if (reading->note == XlsxCellValues::Note::ErrorValue && m_errors.count == 0)
            m_firstErrorValue = cell.value;
        switch (reading->note) {
        case XlsxCellValues::Note::None: break;
        case XlsxCellValues::Note::ErrorValue: m_errors.add(where); break;
        case XlsxCellValues::Note::FormulaWithoutValue: m_formulas.add(where); break;
        case XlsxCellValues::Note::DateOutOfRange: m_outOfRangeDates.add(where); break;
        }
        m_cells[cell.column - m_firstColumn] = reading->cell;
        any = any || reading->cell.kind != CellKind::Missing || reading->note != XlsxCellValues::Note::None;
    }
    if (!any)
        return true; // an empty row, as a blank line in a text file
    return visit(std::span<const TypedCell>(m_cells), row);
}

std::expected<void, InputError> XlsxTable::forEachRecord(const Visit& visit)
{
    m_errors = m_formulas = m_outOfRangeDates = m_rowsBeyond = Tally{};
    m_cells.assign(m_columns.size(), TypedCell::missing());
    XlsxSheetParser parser(m_source, m_limits, [&](std::size_t row, std::span<const XlsxRawCell> raw) {
        return visitRow(row, raw, visit);
    });
    return parseXlsxPart(m_archive, m_sheet.part, m_limits.partBytes, parser);
}

std::vector<std::string> XlsxTable::warnings() const
{
    std::vector<std::string> out;
    if (m_errors.count > 0)
        out.push_back(counted(m_errors.count, "cell holds", "cells hold") + " an error value such as #N/A or #DIV/0!, read as that text (a score there is not a number) (first: " + m_errors.first + ", "
                      + m_firstErrorValue + ").");
    if (m_formulas.count > 0)
        out.push_back(counted(m_formulas.count, "cell holds", "cells hold") + " a formula without a saved value (first: "
                      + m_formulas.first + "); open and save the workbook in a spreadsheet program to store the values.");
    if (m_outOfRangeDates.count > 0)
        out.push_back(counted(m_outOfRangeDates.count, "cell", "cells") + " formatted as a date "
                      + (m_outOfRangeDates.count == 1 ? "holds" : "hold") + " a number outside the dates a spreadsheet shows and "
                      + (m_outOfRangeDates.count == 1 ? "is" : "are") + " read as empty (first: " + m_outOfRangeDates.first + ").");
    if (m_rowsBeyond.count > 0)
        out.push_back(counted(m_rowsBeyond.count, "row has", "rows have") + " cells outside the columns the header names (first: "
                      + m_rowsBeyond.first + "); those cells are left out. Name their columns in the header row to read them.");
    return out;
}

std::expected<std::string, InputError> XlsxTable::fingerprint() const
{
    return fileFingerprint(m_path);
}

// The sheet the user asked for, by name first (exactly, then in any case: a spreadsheet program
// allows no two sheets that differ in case only) and then by number.
std::expected<std::size_t, InputError> chosenSheet(const std::string& path, const XlsxWorkbook& workbook,
                                                   const std::optional<std::string>& sheet)
{
    const auto& sheets = workbook.sheets;
    if (!sheet)
        return std::size_t{0};
    for (std::size_t i = 0; i < sheets.size(); ++i) {
        if (sheets[i].name == *sheet)
            return i;
    }
    for (std::size_t i = 0; i < sheets.size(); ++i) {
        if (lowerAscii(sheets[i].name) == lowerAscii(*sheet))
            return i;
    }
    std::size_t number = 0;
    const auto [end, problem] = std::from_chars(sheet->data(), sheet->data() + sheet->size(), number);
    if (problem == std::errc() && end == sheet->data() + sheet->size() && number >= 1 && number <= sheets.size())
        return number - 1;
    std::string listed;
    for (const auto& entry : sheets)
        listed += (listed.empty() ? "'" : ", '") + entry.name + "'";
    InputError error;
    error.file = path;
    error.value = *sheet;
    error.problem = "the workbook has no sheet of that name or number; its sheets are " + listed + ".";
    error.remedy = "give one of those names, or a number from 1 to " + std::to_string(sheets.size()) + ".";
    return std::unexpected(error);
}

struct OpenedWorkbook {
    XlsxArchive archive;
    XlsxWorkbook workbook;
};

std::expected<OpenedWorkbook, InputError> openWorkbook(const std::string& path, const XlsxLimits& limits)
{
    auto archive = XlsxArchive::open(path);
    if (!archive)
        return std::unexpected(archive.error());
    auto workbook = XlsxWorkbook::read(*archive, limits);
    if (!workbook)
        return std::unexpected(workbook.error());
    if (workbook->sheets.empty()) {
        InputError error;
        error.file = path;
        error.problem = "the workbook has no sheets.";
        error.remedy = "open it in a spreadsheet program, put the cohort on a sheet and save it again.";
        return std::unexpected(error);
    }
    return OpenedWorkbook{std::move(*archive), std::move(*workbook)};
}

} // namespace

bool isSpreadsheetFile(const std::string& path)
{
    if (path.size() < 5)
        return false;
    std::string tail = path.substr(path.size() - 5);
    std::transform(tail.begin(), tail.end(), tail.begin(), [](unsigned char c) { return static_cast<char>(std::tolower(c)); });
    return tail == ".xlsx";
}

std::expected<std::vector<std::string>, InputError> xlsxSheetNames(const std::string& path)
{
    auto opened = openWorkbook(path, XlsxLimits{});
    if (!opened)
        return std::unexpected(opened.error());
    std::vector<std::string> names;
    for (const auto& sheet : opened->workbook.sheets)
        names.push_back(sheet.name);
    return names;
}

std::expected<std::unique_ptr<TypedTable>, InputError> openXlsxTable(const std::string& path, const std::optional<std::string>& sheet)
{
    return openXlsxTable(path, sheet, XlsxLimits{});
}

std::expected<std::unique_ptr<TypedTable>, InputError> openXlsxTable(const std::string& path, const std::optional<std::string>& sheet,
                                                                   const XlsxLimits& limits)
{
    auto opened = openWorkbook(path, limits);
    if (!opened)
        return std::unexpected(opened.error());
    const auto chosen = chosenSheet(path, opened->workbook, sheet);
    if (!chosen)
        return std::unexpected(chosen.error());
    const XlsxSheetEntry& entry = opened->workbook.sheets[*chosen];
    if (!entry.worksheet || !opened->archive.contains(entry.part)) {
        InputError error;
        error.file = path;
        error.value = entry.name;
        error.problem = entry.worksheet ? "the workbook lists this sheet but its part is missing (a damaged file)."
                                        : "this sheet is a chart or dialog sheet, not a table of cells.";
        error.remedy = "choose a sheet that holds the cohort's rows (--sheet NAME).";
        return std::unexpected(error);
    }
    auto strings = XlsxSharedStrings::read(opened->archive, opened->workbook.sharedStringsPart, limits);
    if (!strings)
        return std::unexpected(strings.error());
    auto styles = XlsxStyles::read(opened->archive, opened->workbook.stylesPart, limits);
    if (!styles)
        return std::unexpected(styles.error());
    auto table = std::make_unique<XlsxTable>(path, std::move(opened->archive), opened->workbook, std::move(*strings),
                                             std::move(*styles), entry, limits);
    if (auto header = table->readHeader(); !header)
        return std::unexpected(header.error());
    return table;
}

} // namespace plumbline
