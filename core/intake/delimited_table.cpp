#include "intake/delimited_table.hpp"

#include "intake/column_suggest.hpp"
#include "intake/delimiter_sniffer.hpp"
#include "intake/field_values.hpp"
#include "intake/printable_text.hpp"

#include <algorithm>

namespace plumbline {

namespace {

std::string firstLineOf(std::string_view text)
{
    const std::size_t end = text.find_first_of("\r\n");
    return std::string(text.substr(0, std::min<std::size_t>(end, 80)));
}

// The header field (by index) in which a line's text, cut at a bad byte, ends; used only to name
// the column in an encoding error.
std::string columnAtLineEnd(std::string_view line, char delimiter, const std::vector<std::string>& header)
{
    std::size_t field = 0;
    bool quoted = false;
    for (const char c : line) {
        if (c == '"')
            quoted = !quoted;
        else if (c == delimiter && !quoted)
            ++field;
    }
    return field < header.size() ? header[field] : std::string();
}

} // namespace

DelimitedTable::DelimitedTable(TextFile file, char delimiter, bool sniffed, std::vector<std::string> header)
    : m_file(std::move(file))
    , m_delimiter(delimiter)
    , m_sniffed(sniffed)
    , m_header(std::move(header))
{
}

std::expected<DelimitedTable, InputError> DelimitedTable::open(TextFile file, std::optional<char> delimiter)
{
    InputError error;
    error.file = file.name();
    // The first line, for messages: never more than 80 characters of it are shown.
    const auto start = file.readText(0, 80);
    if (!start)
        return std::unexpected(start.error());
    const bool sniffed = !delimiter.has_value();
    if (!delimiter) {
        delimiter = sniffDelimiter(file);
        if (!delimiter) {
            error.line = 1;
            // A file that is not a table may be anything: show only its first few characters.
            error.value = printableExcerpt(firstLineOf(*start), 12);
            error.problem = "the header line does not split into columns on a comma, semicolon, tab or pipe.";
            error.remedy = "check that this is the cohort file; if it uses another delimiter, choose it (Delimiter in the window, --delimiter on the command line).";
            return std::unexpected(error);
        }
    }
    RecordReader records(file, *delimiter);
    records.next();
    if (records.readError())
        return std::unexpected(file.readFailure(*records.readError()));
    const CsvScanner& scanner = records.scanner();
    if (scanner.unclosedQuote()) {
        error.line = 1;
        error.problem = "a quoted header name is never closed.";
        error.remedy = "fix the quotes in the header row.";
        return std::unexpected(error);
    }
    std::vector<std::string> header;
    for (std::string_view name : scanner.fields())
        header.emplace_back(trimmed(name));
    const bool looksLikeData = std::all_of(header.begin(), header.end(), [](const std::string& name) {
        return isMissingToken(name) || parseNumber(name, false).has_value();
    }) && std::any_of(header.begin(), header.end(), [](const std::string& name) {
        return parseNumber(name, false).has_value();
    });
    if (looksLikeData) {
        error.line = scanner.line();
        error.value = firstLineOf(*start);
        error.problem = "the first line holds numbers, not column names: the file seems to have no header row.";
        error.remedy = "add a header row that names each column (for example outcome,score).";
        return std::unexpected(error);
    }
    const auto bad = file.firstInvalidUtf8();
    if (!bad)
        return std::unexpected(bad.error());
    if (*bad)
        return std::unexpected(invalidUtf8Error(file, *delimiter, **bad, header));
    return DelimitedTable(std::move(file), *delimiter, sniffed, std::move(header));
}

InputError DelimitedTable::invalidUtf8Error(const TextFile& file, char delimiter, std::size_t bad,
                                            const std::vector<std::string>& header)
{
    const auto position = file.positionOf(bad);
    if (!position)
        return position.error();
    // The line up to the bad byte names its column; 16 bytes around it show it.
    const auto line = file.readText(position->lineStart, bad);
    const std::size_t from = bad >= 8 ? bad - 8 : 0;
    const auto around = file.readText(from, from + 16);
    if (!line || !around)
        return line ? around.error() : line.error();
    InputError error;
    error.file = file.name();
    error.line = position->line;
    error.column = columnAtLineEnd(*line, delimiter, header);
    error.value = *around;
    error.problem = "the file is not valid UTF-8 (it may be Latin-1 or Windows-1252).";
    error.remedy = "save the file as 'CSV UTF-8' or convert it (iconv -f WINDOWS-1252 -t UTF-8).";
    return error;
}

std::expected<std::size_t, InputError> DelimitedTable::column(const std::string& name, const std::string& role) const
{
    InputError error;
    error.file = fileName();
    error.line = 1;
    error.column = name;
    const std::string wanted(trimmed(name));
    const auto count = std::count(m_header.begin(), m_header.end(), wanted);
    if (count == 1)
        return static_cast<std::size_t>(std::find(m_header.begin(), m_header.end(), wanted) - m_header.begin());
    if (count > 1) {
        error.problem = "the header names " + std::to_string(count) + " columns '" + wanted + "', so the " + role
            + " column is ambiguous.";
        error.remedy = "rename the duplicated columns so each name is unique.";
        return std::unexpected(error);
    }
    error.problem = "there is no " + role + " column of that name.";
    const auto suggestions = closestColumnNames(wanted, m_header);
    if (m_header.size() == 1) {
        const auto other = sniffDelimiter(m_file);
        error.problem += " The header has a single column, so the delimiter ("
            + std::string(delimiterName(m_delimiter)) + ") looks wrong.";
        error.remedy = other ? "the file looks " + std::string(delimiterName(*other))
                + "-delimited: drop --delimiter or give that one."
                             : "give the file's delimiter with --delimiter.";
    } else if (!suggestions.empty()) {
        error.remedy = "did you mean " + quotedList(suggestions) + "? Column names must match exactly.";
    } else {
        error.remedy = "choose one of the columns: " + quotedList(m_header) + ".";
    }
    return std::unexpected(error);
}

InputError DelimitedTable::unclosedQuoteError(const CsvScanner& scanner) const
{
    InputError error;
    error.file = fileName();
    error.line = scanner.line();
    if (scanner.unclosedQuoteField() < m_header.size())
        error.column = m_header[scanner.unclosedQuoteField()];
    error.problem = "a quoted field opens on this line and is never closed, so the rest of the file would be one value.";
    error.remedy = "close the quote (a quote inside a quoted field is written twice: \"\").";
    return error;
}

bool DelimitedTable::isWhitespaceOnly(const CsvScanner& scanner)
{
    return scanner.fields().size() == 1 && trimmed(scanner.fields()[0]).empty();
}

} // namespace plumbline
