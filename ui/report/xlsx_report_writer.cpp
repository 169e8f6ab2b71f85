#include "report/report_writers.hpp"

#include <xlsxwriter.h>

#include <algorithm>
#include <cstdio>
#include <filesystem>
#include <unistd.h>
#include <vector>

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
    lxw_format* wrapped = workbook_add_format(workbook);
    format_set_text_wrap(wrapped);
    // The report's words first (scope, findings, limits, warnings, cautions, sign-off), so the
    // workbook carries what the PDF does; then one sheet per table.
    lxw_worksheet* words = workbook_add_worksheet(workbook, "report");
    worksheet_set_column(words, 0, 0, 120, wrapped);
    lxw_row_t line = 0;
    worksheet_write_string(words, line++, 0, neutralisedForSpreadsheet(document.title).c_str(), bold);
    worksheet_write_string(words, line++, 0, neutralisedForSpreadsheet(document.subtitle).c_str(), nullptr);
    for (const auto& section : document.sections) {
        ++line;
        worksheet_write_string(words, line++, 0, neutralisedForSpreadsheet(section.title).c_str(), bold);
        for (const auto* paragraphs : {&section.paragraphs, &section.closing})
            for (const auto& paragraph : *paragraphs) {
                // A finding's "- " bullet would read as a formula's minus: a bullet sign instead.
                const std::string text = paragraph.starts_with("- ") ? "\u2022 " + paragraph.substr(2) : paragraph;
                worksheet_write_string(words, line++, 0, neutralisedForSpreadsheet(text).c_str(), wrapped);
            }
    }
    const auto tables = document.tables();
    const auto names = uniqueTableNames(document);
    for (std::size_t t = 0; t < tables.size(); ++t) {
        lxw_worksheet* sheet = workbook_add_worksheet(workbook, sheetName(names[t]).c_str());
        const ReportTable table = dataColumns(*tables[t]);
        worksheet_write_string(sheet, 0, 0, neutralisedForSpreadsheet(table.title).c_str(), bold);
        std::vector<std::size_t> widths(table.headers.size(), 8);
        for (std::size_t c = 0; c < table.headers.size(); ++c) {
            worksheet_write_string(sheet, 2, lxw_col_t(c), neutralisedForSpreadsheet(table.headers[c]).c_str(), bold);
            widths[c] = std::max(widths[c], table.headers[c].size());
        }
        for (std::size_t r = 0; r < table.rows.size(); ++r)
            for (std::size_t c = 0; c < table.rows[r].size(); ++c) {
                const ReportCell& cell = table.rows[r][c];
                const auto row = lxw_row_t(r + 3);
                // Numbers (intervals' ends included) as numbers; only text is neutralised.
                if (cell.number && !cell.suppressed)
                    worksheet_write_number(sheet, row, lxw_col_t(c), *cell.number, nullptr);
                else if (!cell.text.empty())
                    worksheet_write_string(sheet, row, lxw_col_t(c), neutralisedForSpreadsheet(cell.text).c_str(),
                                           cell.suppressed ? italic : nullptr);
                if (c < widths.size())
                    widths[c] = std::max(widths[c], std::min<std::size_t>(cell.text.size(), 40));
            }
        if (!table.note.empty())
            worksheet_write_string(sheet, lxw_row_t(table.rows.size() + 4), 0, neutralisedForSpreadsheet(table.note).c_str(), italic);
        for (std::size_t c = 0; c < widths.size(); ++c)
            worksheet_set_column(sheet, lxw_col_t(c), lxw_col_t(c), double(std::min<std::size_t>(widths[c], 40) + 2), nullptr);
        worksheet_freeze_panes(sheet, 3, 0); // the header row stays in view
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
