#include "files/cohort_stata_file.hpp"

#include "intake/typed_table_intake.hpp"

#include <readstat.h>

#include <algorithm>
#include <ctime>
#include <string_view>
#include <memory>
#include <vector>

namespace plumbline {

namespace {

// Days from Stata's day 0 (1960-01-01) to 1970-01-01.
constexpr std::int64_t stataDayOf1970 = 3653;
// The longest str column a Stata 118 file holds; longer text would need strL.
constexpr std::size_t stataMaxStrWidth = 2045;

enum class ColumnType { Number, Date, Text };

// The column's type: the one kind its cells share (missing cells aside), text when they mix.
ColumnType columnType(const CohortCells& cells, std::size_t c)
{
    bool numbers = false, dates = false, texts = false;
    for (const auto& row : cells.rows) {
        numbers |= row[c].kind == CellKind::Number;
        dates |= row[c].kind == CellKind::Date;
        texts |= row[c].kind == CellKind::Text;
    }
    if (texts || (numbers && dates))
        return ColumnType::Text;
    return dates ? ColumnType::Date : ColumnType::Number;
}

// A cell of a str column: what a text file would hold for it (the intake's own reading of a
// typed cell as text, so the str column reads back as the cell did).
std::string cellText(const CohortCell& cell)
{
    return typedCellText(TypedCell{cell.kind, cell.number, cell.text, cell.day});
}

// Stata's rule for a variable name: 1-32 characters, letters, digits and _, not starting with a
// digit, and not one of its reserved words (the list from memory of Stata's manual, [U] 11.3).
// Checked here because ReadStat's writer, refusing such a name, cannot then be freed safely.
bool isStataName(const std::string& name)
{
    static constexpr std::string_view reserved[] = {"_all", "_b", "byte", "_coef", "_cons", "double", "float", "if", "in", "int",
                                                    "long", "_n", "_N", "_pi", "_pred", "_rc", "_skip", "strL", "using", "with"};
    if (name.empty() || name.size() > 32 || (name[0] >= '0' && name[0] <= '9'))
        return false;
    for (const char c : name)
        if (!((c >= 'a' && c <= 'z') || (c >= 'A' && c <= 'Z') || (c >= '0' && c <= '9') || c == '_'))
            return false;
    if (name.starts_with("str") && name.size() > 3 && name.find_first_not_of("0123456789", 3) == std::string::npos)
        return false; // str1, str244...
    return std::find(std::begin(reserved), std::end(reserved), name) == std::end(reserved);
}

ssize_t appendBytes(const void* data, size_t length, void* context)
{
    static_cast<std::string*>(context)->append(static_cast<const char*>(data), length);
    return static_cast<ssize_t>(length);
}

// ReadStat writes the time stamp in local time; the instant that is 2024-01-01 00:00 here gives
// the same bytes in every time zone.
time_t fixedLocalTimestamp()
{
    std::tm midnight{};
    midnight.tm_year = 2024 - 1900;
    midnight.tm_mday = 1;
    midnight.tm_isdst = -1;
    return std::mktime(&midnight);
}

struct WriterFree {
    void operator()(readstat_writer_t* writer) const { readstat_writer_free(writer); }
};

} // namespace

std::expected<std::string, InputError> cohortStataFileBytes(const CohortCells& cells, const std::string& path)
{
    std::string bytes;
    const std::unique_ptr<readstat_writer_t, WriterFree> writer(readstat_writer_init());
    if (!writer)
        return std::unexpected(cohortWriteError(path, {}, "there is not enough memory to start the Stata file.", "close other programs and try again."));
    readstat_set_data_writer(writer.get(), appendBytes);
    readstat_writer_set_file_format_version(writer.get(), 118);
    readstat_writer_set_file_label(writer.get(), "Invented sample cohort");
    readstat_writer_set_file_timestamp(writer.get(), fixedLocalTimestamp());

    for (const auto& name : cells.columns)
        if (!isStataName(name))
            return std::unexpected(cohortWriteError(path, name, "Stata does not accept this column name.",
                                              "rename the column: at most 32 letters, digits or _, not starting with a digit, and not a word Stata reserves."));
    std::vector<ColumnType> types;
    std::vector<readstat_variable_t*> variables;
    for (std::size_t c = 0; c < cells.columns.size(); ++c) {
        const ColumnType type = columnType(cells, c);
        std::size_t width = 0;
        if (type == ColumnType::Text)
            for (const auto& row : cells.rows)
                width = std::max(width, cellText(row[c]).size());
        if (width > stataMaxStrWidth)
            return std::unexpected(cohortWriteError(path, cells.columns[c], "a text of " + std::to_string(width) + " bytes is longer than a Stata str column holds (2045).",
                                              "shorten the column's texts, or write the cohort as CSV."));
        readstat_variable_t* variable = readstat_add_variable(writer.get(), cells.columns[c].c_str(),
                                                              type == ColumnType::Text ? READSTAT_TYPE_STRING : READSTAT_TYPE_DOUBLE,
                                                              std::max<std::size_t>(width, 1));
        if (type == ColumnType::Date)
            readstat_variable_set_format(variable, "%td");
        types.push_back(type);
        variables.push_back(variable);
    }
    if (const readstat_error_t begun = readstat_begin_writing_dta(writer.get(), &bytes, long(cells.rows.size())); begun != READSTAT_OK)
        return std::unexpected(cohortWriteError(path, {}, std::string("the Stata file cannot be started (ReadStat: ") + readstat_error_message(begun) + ").",
                                          "give the columns names Stata accepts (letters, digits and _, at most 32 characters)."));
    for (const auto& row : cells.rows) {
        readstat_begin_row(writer.get());
        for (std::size_t c = 0; c < variables.size(); ++c) {
            const CohortCell& cell = row[c];
            if (types[c] == ColumnType::Text)
                readstat_insert_string_value(writer.get(), variables[c], cellText(cell).c_str());
            else if (cell.kind == CellKind::Missing)
                readstat_insert_missing_value(writer.get(), variables[c]); // Stata's `.`
            else if (types[c] == ColumnType::Date)
                readstat_insert_double_value(writer.get(), variables[c], double(cell.day + stataDayOf1970));
            else
                readstat_insert_double_value(writer.get(), variables[c], cell.number);
        }
        if (const readstat_error_t ended = readstat_end_row(writer.get()); ended != READSTAT_OK)
            return std::unexpected(cohortWriteError(path, {}, std::string("a row could not be written (ReadStat: ") + readstat_error_message(ended) + ").",
                                              "write the cohort as CSV instead, and report this."));
    }
    if (const readstat_error_t ended = readstat_end_writing(writer.get()); ended != READSTAT_OK)
        return std::unexpected(cohortWriteError(path, {}, std::string("the Stata file could not be finished (ReadStat: ") + readstat_error_message(ended) + ").",
                                          "write the cohort as CSV instead, and report this."));
    return bytes;
}

} // namespace plumbline
