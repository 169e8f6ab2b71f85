#include "report_writers.hpp"

#include <xlsxwriter.h>

#include <cstdio>
#include <filesystem>
#include <unistd.h>

namespace plumbline {

namespace {

// Sheet names: at most 31 characters, none of []:*?/\ (Excel's rules), unique.
std::string sheetName(std::string name)
{
    for (char& c : name)
        if (std::string_view("[]:*?/\\").find(c) != std::string_view::npos)
            c = '_';
    return name.substr(0, 31);
}

} // namespace

std::expected<void, InputError> writeXlsxReport(const ReportDocument& document, const std::string& path)
{
    InputError error;
    error.file = path;
    // libxlsxwriter writes the whole file on close; it goes to a temporary name first.
    const std::string temporary = path + ".part-" + std::to_string(::getpid());
    lxw_workbook* workbook = workbook_new(temporary.c_str());
    if (!workbook) {
        error.problem = "the workbook cannot be created.";
        error.remedy = "check that the folder exists and that you may write to it.";
        return std::unexpected(error);
    }
    lxw_format* bold = workbook_add_format(workbook);
    format_set_bold(bold);
    lxw_format* italic = workbook_add_format(workbook);
    format_set_italic(italic);
    const auto tables = document.tables();
    const auto names = uniqueTableNames(document);
    for (std::size_t t = 0; t < tables.size(); ++t) {
        lxw_worksheet* sheet = workbook_add_worksheet(workbook, sheetName(names[t]).c_str());
        const ReportTable& table = *tables[t];
        worksheet_write_string(sheet, 0, 0, neutralisedForSpreadsheet(table.title).c_str(), bold);
        for (std::size_t c = 0; c < table.headers.size(); ++c)
            worksheet_write_string(sheet, 2, lxw_col_t(c), neutralisedForSpreadsheet(table.headers[c]).c_str(), bold);
        for (std::size_t r = 0; r < table.rows.size(); ++r)
            for (std::size_t c = 0; c < table.rows[r].size(); ++c) {
                const ReportCell& cell = table.rows[r][c];
                const auto row = lxw_row_t(r + 3);
                if (cell.number)
                    worksheet_write_number(sheet, row, lxw_col_t(c), *cell.number, nullptr);
                else
                    worksheet_write_string(sheet, row, lxw_col_t(c), neutralisedForSpreadsheet(cell.text).c_str(),
                                           cell.suppressed ? italic : nullptr);
            }
        if (!table.note.empty())
            worksheet_write_string(sheet, lxw_row_t(table.rows.size() + 4), 0, neutralisedForSpreadsheet(table.note).c_str(), italic);
        worksheet_set_column(sheet, 0, lxw_col_t(std::max<std::size_t>(table.headers.size(), 1) - 1), 16, nullptr);
    }
    const lxw_error closed = workbook_close(workbook);
    if (closed != LXW_NO_ERROR) {
        std::remove(temporary.c_str());
        error.problem = std::string("the workbook could not be written (") + lxw_strerror(closed) + ").";
        error.remedy = "check the folder and the free space; nothing was overwritten.";
        return std::unexpected(error);
    }
    std::error_code renameError;
    std::filesystem::rename(temporary, path, renameError);
    if (renameError) {
        std::remove(temporary.c_str());
        error.problem = "the finished workbook could not be moved into place (" + renameError.message() + ").";
        error.remedy = "check that the target is not a folder and that you may replace it.";
        return std::unexpected(error);
    }
    return {};
}

} // namespace plumbline
