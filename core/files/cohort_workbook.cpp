#include "files/cohort_workbook.hpp"

#include <xlsxwriter.h>

#include <algorithm>
#include <cstdio>
#include <filesystem>
#include <unistd.h>
#include <vector>

namespace plumbline {

namespace {

// 2024-01-01 00:00:00 UTC: any fixed instant does; the current time would change the bytes.
constexpr time_t fixedCreationTime = 1704067200;
// Days from Excel's day 0 (1899-12-30 in the 1900 date system) to 1970-01-01.
constexpr double excelSerialOf1970 = 25569.0;

std::size_t shownWidth(const CohortCell& cell)
{
    switch (cell.kind) {
    case CellKind::Text:
        return cell.text.size();
    case CellKind::Date:
        return 10;
    case CellKind::Number:
        return 8;
    case CellKind::Missing:
        break;
    }
    return 0;
}

} // namespace

std::expected<void, InputError> writeCohortWorkbook(const CohortCells& cells, const std::string& path)
{
    if (cells.rows.size() > workbookMaxRecords)
        return std::unexpected(cohortWriteError(path, {}, "a worksheet holds at most " + std::to_string(workbookMaxRecords) + " rows below its header, and the cohort has " + std::to_string(cells.rows.size()) + ".",
                                             "write fewer rows, or write the cohort as CSV or as a Stata file."));
    // libxlsxwriter writes the whole file on close; it goes to a temporary name first so a
    // failure never leaves half a workbook under the name asked for.
    const std::string temporary = path + ".part-" + std::to_string(::getpid());
    lxw_workbook* workbook = workbook_new(temporary.c_str());
    if (!workbook)
        return std::unexpected(cohortWriteError(path, {}, "the workbook cannot be created.", "check that the folder exists and that you may write to it."));
    lxw_doc_properties properties{};
    properties.created = fixedCreationTime;
    workbook_set_properties(workbook, &properties);
    lxw_format* bold = workbook_add_format(workbook);
    format_set_bold(bold);
    lxw_format* date = workbook_add_format(workbook);
    format_set_num_format(date, "yyyy-mm-dd");
    lxw_worksheet* sheet = workbook_add_worksheet(workbook, "Cohort");

    std::vector<std::size_t> widths(cells.columns.size(), 8);
    for (std::size_t c = 0; c < cells.columns.size(); ++c) {
        worksheet_write_string(sheet, 0, lxw_col_t(c), cells.columns[c].c_str(), bold);
        widths[c] = std::max(widths[c], cells.columns[c].size());
    }
    for (std::size_t r = 0; r < cells.rows.size(); ++r) {
        const auto row = lxw_row_t(r + 1);
        for (std::size_t c = 0; c < cells.rows[r].size(); ++c) {
            const CohortCell& cell = cells.rows[r][c];
            const auto column = lxw_col_t(c);
            switch (cell.kind) {
            case CellKind::Number:
                worksheet_write_number(sheet, row, column, cell.number, nullptr);
                break;
            case CellKind::Text:
                // A string cell: text that looks like a formula or a number stays text.
                worksheet_write_string(sheet, row, column, cell.text.c_str(), nullptr);
                break;
            case CellKind::Date:
                worksheet_write_number(sheet, row, column, double(cell.day) + excelSerialOf1970, date);
                break;
            case CellKind::Missing:
                break; // an empty cell
            }
            if (c < widths.size())
                widths[c] = std::max(widths[c], std::min<std::size_t>(shownWidth(cell), 40));
        }
    }
    for (std::size_t c = 0; c < widths.size(); ++c)
        worksheet_set_column(sheet, lxw_col_t(c), lxw_col_t(c), double(widths[c] + 2), nullptr);
    worksheet_freeze_panes(sheet, 1, 0); // the header stays in view

    if (const lxw_error closed = workbook_close(workbook); closed != LXW_NO_ERROR) {
        std::remove(temporary.c_str());
        return std::unexpected(cohortWriteError(path, {}, std::string("the workbook could not be written (") + lxw_strerror(closed) + ").",
                                             "check the folder and the free space; nothing was overwritten."));
    }
    std::error_code renameError;
    std::filesystem::rename(temporary, path, renameError);
    if (renameError) {
        std::remove(temporary.c_str());
        return std::unexpected(cohortWriteError(path, {}, "the finished workbook could not be moved into place (" + renameError.message() + ").",
                                             "check that the target is not a folder and that you may replace it."));
    }
    return {};
}

} // namespace plumbline
