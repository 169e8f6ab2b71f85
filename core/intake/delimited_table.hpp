#pragma once

#include "intake/csv_scanner.hpp"
#include "intake/input_error.hpp"
#include "intake/record_reader.hpp"
#include "intake/text_file.hpp"

#include <cstddef>
#include <expected>
#include <optional>
#include <string>
#include <vector>

namespace plumbline {

// A delimited text file whose header has been read and checked: delimiter known (given or
// sniffed), valid UTF-8, a header row that is not data. Records are visited with forEachRecord.
class DelimitedTable {
public:
    static std::expected<DelimitedTable, InputError> open(TextFile file, std::optional<char> delimiter);

    const TextFile& file() const { return m_file; }
    const std::string& fileName() const { return m_file.name(); }
    char delimiter() const { return m_delimiter; }
    bool delimiterSniffed() const { return m_sniffed; }
    const std::vector<std::string>& header() const { return m_header; }

    // Index of a header column, or an InputError naming the closest columns. `role` says what
    // the column was wanted for ("outcome", "score", ...), for the message.
    std::expected<std::size_t, InputError> column(const std::string& name, const std::string& role) const;

    // Calls visit(scanner) for every data record (blank lines skipped). An unclosed quote is an
    // InputError because everything after it would be swallowed into one field; so is a file
    // that cannot be read to its end. The file is read a block at a time.
    template <typename Visit>
    std::expected<std::size_t, InputError> forEachRecord(Visit&& visit) const
    {
        RecordReader records(m_file, m_delimiter);
        records.next(); // header
        while (records.next()) {
            const CsvScanner& scanner = records.scanner();
            if (scanner.unclosedQuote())
                return std::unexpected(unclosedQuoteError(scanner));
            if (isWhitespaceOnly(scanner))
                continue;
            visit(scanner);
        }
        if (records.readError())
            return std::unexpected(m_file.readFailure(*records.readError()));
        return records.scanner().blankLinesSkipped();
    }

private:
    DelimitedTable(TextFile file, char delimiter, bool sniffed, std::vector<std::string> header);
    InputError unclosedQuoteError(const CsvScanner& scanner) const;
    static InputError invalidUtf8Error(const TextFile& file, char delimiter, std::size_t bad,
                                       const std::vector<std::string>& header);
    static bool isWhitespaceOnly(const CsvScanner& scanner);

    TextFile m_file;
    char m_delimiter;
    bool m_sniffed;
    std::vector<std::string> m_header;
};

} // namespace plumbline
