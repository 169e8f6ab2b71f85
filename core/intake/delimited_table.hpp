#pragma once

#include "intake/csv_scanner.hpp"
#include "intake/input_error.hpp"
#include "intake/record_reader.hpp"
#include "intake/text_file.hpp"

#include <atomic>
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
    // that cannot be read to its end. The file is read a block at a time. Returns the number of
    // blank lines skipped.
    template <typename Visit>
    std::expected<std::size_t, InputError> forEachRecord(Visit&& visit) const
    {
        const auto run = forEachRecordFrom(0, std::string::npos, nullptr, std::forward<Visit>(visit));
        if (!run)
            return std::unexpected(run.error());
        return run->blankLinesSkipped;
    }

    // How a visit of part of the records ended.
    struct RecordRun {
        std::size_t blankLinesSkipped = 0;
        bool stoppedAt = false;  // a record ended exactly at `stopAt`, and the visit stopped there
        std::size_t lineAfter = 0; // with stoppedAt: the 1-based line that starts at `stopAt`
        bool abandoned = false;
    };
    // As forEachRecord, for the records from text offset `from` on: from 0 the header is read
    // first; any other `from` must start a record (a guess, when the text is read on two
    // threads), and lines count from 1 there. Stops after the record that ends exactly at text
    // offset `stopAt`, if one does, and between records once `*abandon` is set.
    template <typename Visit>
    std::expected<RecordRun, InputError> forEachRecordFrom(std::size_t from, std::size_t stopAt, const std::atomic<bool>* abandon,
                                                           Visit&& visit) const
    {
        RecordRun run;
        RecordReader records(m_file, m_delimiter, from);
        if (from == 0)
            records.next(); // header
        while (records.next()) {
            if (abandon && abandon->load(std::memory_order_relaxed)) {
                run.abandoned = true;
                return run;
            }
            const CsvScanner& scanner = records.scanner();
            if (scanner.unclosedQuote())
                return std::unexpected(unclosedQuoteError(scanner));
            if (!isWhitespaceOnly(scanner))
                visit(scanner);
            if (from + records.offset() == stopAt) {
                run.stoppedAt = true;
                run.lineAfter = scanner.nextLine();
                run.blankLinesSkipped = scanner.blankLinesSkipped();
                return run;
            }
        }
        if (records.readError())
            return std::unexpected(m_file.readFailure(*records.readError()));
        run.blankLinesSkipped = records.scanner().blankLinesSkipped();
        return run;
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
