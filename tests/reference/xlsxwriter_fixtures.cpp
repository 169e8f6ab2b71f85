/* Writes the libxlsxwriter spreadsheet fixtures (invented values) into the folder given:
 * xlsxwriter_inline.xlsx in constant-memory mode, where every string is an inline string (rich
 * text too), and xlsxwriter_shared.xlsx in the usual mode, with shared strings and two sheets.
 * tests/reference/make_spreadsheet_fixtures.py runs it; the spreadsheet reference check runs it
 * again to prove the committed files are still what it writes. */
#include <xlsxwriter.h>

#include <cstdio>
#include <cstring>

namespace {

lxw_datetime at(int year, int month, int dayOfMonth, int hour = 0, int minute = 0)
{
    return lxw_datetime{year, month, dayOfMonth, hour, minute, 0.0};
}

void writeDate(lxw_worksheet* sheet, lxw_row_t row, lxw_col_t column, lxw_datetime when, lxw_format* format)
{
    worksheet_write_datetime(sheet, row, column, &when, format);
}

void fixCreationTime(lxw_workbook* workbook)
{
    /* A fixed creation time, so two runs write the same document properties. */
    lxw_doc_properties properties{};
    properties.created = 1700000000;
    workbook_set_properties(workbook, &properties);
}

int writeInline(const char* path)
{
    lxw_workbook_options options{};
    options.constant_memory = LXW_TRUE;
    lxw_workbook* workbook = workbook_new_opt(path, &options);
    fixCreationTime(workbook);
    lxw_worksheet* sheet = workbook_add_worksheet(workbook, "Visits");
    lxw_format* builtinDate = workbook_add_format(workbook);
    format_set_num_format_index(builtinDate, 14);
    lxw_format* customDate = workbook_add_format(workbook);
    format_set_num_format(customDate, "dd/mm/yyyy;@");
    lxw_format* bold = workbook_add_format(workbook);
    format_set_bold(bold);
    lxw_format* percent = workbook_add_format(workbook);
    format_set_num_format(percent, "0.0%");

    /* Row 1: the header, one name a number. */
    const char* names[] = {"visit", "seen_on", "booked_on", "risk", "flag", "label", "doubled", "joined"};
    for (int c = 0; c < 8; ++c)
        worksheet_write_string(sheet, 0, static_cast<lxw_col_t>(c), names[c], bold);
    worksheet_write_number(sheet, 0, 8, 2024, nullptr);

    char wardText[] = "Ward ";
    char northText[] = "North";
    lxw_rich_string_tuple first{bold, wardText};
    lxw_rich_string_tuple second{nullptr, northText};
    lxw_rich_string_tuple* runs[] = {&first, &second, nullptr};

    /* Rows 2, 3, then 6 and 7: rows 4 and 5 are never written. */
    worksheet_write_number(sheet, 1, 0, 1, nullptr);
    writeDate(sheet, 1, 1, at(2021, 3, 14, 9, 30), builtinDate);
    writeDate(sheet, 1, 2, at(2021, 2, 28, 0, 0), customDate);
    worksheet_write_number(sheet, 1, 3, 0.125, percent);
    worksheet_write_boolean(sheet, 1, 4, 1, nullptr);
    worksheet_write_rich_string(sheet, 1, 5, runs, nullptr);
    worksheet_write_formula_num(sheet, 1, 6, "=A2*2", nullptr, 2);
    worksheet_write_formula_str(sheet, 1, 7, "=F2&\"!\"", nullptr, "Ward North!");
    worksheet_write_number(sheet, 1, 8, -3.5, nullptr);

    worksheet_write_number(sheet, 2, 0, 2, nullptr);
    worksheet_write_blank(sheet, 2, 1, builtinDate);
    writeDate(sheet, 2, 2, at(1900, 3, 1, 0, 0), customDate);
    worksheet_write_number(sheet, 2, 3, 1e-9, nullptr);
    worksheet_write_boolean(sheet, 2, 4, 0, nullptr);
    worksheet_write_string(sheet, 2, 5, "Ward \xC3\x9Cst & <East>", nullptr);
    worksheet_write_formula_num(sheet, 2, 6, "=A3*2", nullptr, 4);

    worksheet_write_number(sheet, 5, 0, 3, nullptr);
    writeDate(sheet, 5, 1, at(1900, 1, 15, 0, 0), builtinDate);
    worksheet_write_string(sheet, 5, 5, "  spaced  ", nullptr);
    worksheet_write_number(sheet, 5, 11, 99, nullptr); /* beyond the header's last column */

    worksheet_write_number(sheet, 6, 0, 4, nullptr);
    writeDate(sheet, 6, 1, at(9999, 12, 31, 0, 0), builtinDate);
    worksheet_write_number(sheet, 6, 3, 123456789.25, nullptr);
    return workbook_close(workbook) == LXW_NO_ERROR ? 0 : 1;
}

int writeShared(const char* path)
{
    lxw_workbook* workbook = workbook_new(path);
    fixCreationTime(workbook);
    lxw_worksheet* first = workbook_add_worksheet(workbook, "First");
    lxw_worksheet* second = workbook_add_worksheet(workbook, "Second sheet");
    lxw_format* date = workbook_add_format(workbook);
    format_set_num_format(date, "yyyy\\-mm\\-dd");
    lxw_format* notDate = workbook_add_format(workbook);
    format_set_num_format(notDate, "0.00\" d\"");

    worksheet_write_string(first, 2, 1, "site", nullptr);
    worksheet_write_string(first, 2, 2, "enrolled", nullptr);
    worksheet_write_string(first, 2, 3, "days", nullptr);
    worksheet_write_string(first, 2, 4, "total", nullptr);
    const char* sites[] = {"Hillside", "Riverside", "Hillside", "Harbour"};
    for (int r = 0; r < 4; ++r) {
        const lxw_row_t row = static_cast<lxw_row_t>(3 + r * 2); /* rows 4, 6, 8, 10 */
        worksheet_write_string(first, row, 1, sites[r], nullptr);
        writeDate(first, row, 2, at(2019 + r, 1 + 3 * r, 10 + r), date);
        worksheet_write_number(first, row, 3, 1.5 * r, notDate);
        char formula[32];
        snprintf(formula, sizeof formula, "=D%u*10", static_cast<unsigned>(row) + 1);
        worksheet_write_formula_num(first, row, 4, formula, nullptr, 15.0 * r);
    }
    worksheet_write_string(first, 9, 2, "", nullptr); /* an empty string, not a value */

    worksheet_write_string(second, 0, 0, "code", nullptr);
    worksheet_write_string(second, 0, 1, "site", nullptr);
    worksheet_write_number(second, 1, 0, 7, nullptr);
    worksheet_write_string(second, 1, 1, "Riverside", nullptr);
    return workbook_close(workbook) == LXW_NO_ERROR ? 0 : 1;
}

} // namespace

int main(int argc, char** argv)
{
    if (argc != 2) {
        fprintf(stderr, "usage: %s FOLDER\n", argv[0]);
        return 2;
    }
    char path[4096];
    snprintf(path, sizeof path, "%s/xlsxwriter_inline.xlsx", argv[1]);
    if (writeInline(path) != 0)
        return 1;
    snprintf(path, sizeof path, "%s/xlsxwriter_shared.xlsx", argv[1]);
    return writeShared(path);
}
