#pragma once

#include <cstddef>
#include <deque>
#include <string>
#include <string_view>
#include <vector>

namespace plumbline {

// Splits delimited text into records (RFC 4180 quoting: quoted fields may hold the delimiter,
// doubled quotes and line breaks). CRLF and LF both end a record. Blank lines are skipped and
// counted. Fields are views into the text, or into an internal buffer when quotes were undone;
// they stay valid until the next call of next().
// Written by hand because the audit needs the physical line of every record and a million rows
// must be read in well under a second.
// The text may be a block of a longer file (`textIsWhole` false): a record the block's end may
// cut (no line end yet, a quote not yet closed, a CR whose LF may follow) is then not read;
// next() returns false with needsMore(), and resume() continues in the next block, which starts
// with the bytes from offset() on.
class CsvScanner {
public:
    CsvScanner(std::string_view text, char delimiter, bool textIsWhole = true);

    // Advances to the next non-blank record; false at the end of the text, or when the text is
    // a block and the next record may not end in it (needsMore()).
    bool next();
    bool needsMore() const { return m_needsMore; }
    // Continues in `text`, whose first byte is the one at offset() of the previous text.
    void resume(std::string_view text, bool textIsWhole);

    const std::vector<std::string_view>& fields() const { return m_fields; }
    // 1-based physical line on which the current record starts.
    std::size_t line() const { return m_recordLine; }
    // True when the current record had text after a closing quote (e.g. "ab"c).
    bool strayQuote() const { return m_strayQuote; }
    // True when a quoted field was still open at the end of the text.
    bool unclosedQuote() const { return m_unclosedQuote; }
    // Index of the field of the current record that holds the unclosed quote.
    std::size_t unclosedQuoteField() const { return m_unclosedField; }
    std::size_t blankLinesSkipped() const { return m_blankLines; }
    // Offset into the text of the first byte not yet read: everything before it is done with.
    std::size_t offset() const { return m_pos; }
    // 1-based physical line of the first byte not yet read.
    std::size_t nextLine() const { return m_line; }

private:
    void readUnquoted();
    void readQuoted();
    bool atRecordEnd() const;
    void consumeRecordEnd();
    // True when the text is a block that may continue past `pos`, so a record ending there or
    // at a CR just before it is not known to end.
    bool cutAt(std::size_t pos) const;

    struct Position {
        std::size_t pos, line, blankLines;
    };
    bool needMoreFrom(const Position& start);

    std::string_view m_text;
    std::size_t m_pos = 0;
    std::size_t m_line = 1;
    std::size_t m_recordLine = 0;
    char m_delimiter;
    std::vector<std::string_view> m_fields;
    std::deque<std::string> m_unescaped;
    std::size_t m_unescapedUsed = 0;
    bool m_strayQuote = false;
    bool m_unclosedQuote = false;
    std::size_t m_unclosedField = 0;
    std::size_t m_blankLines = 0;
    bool m_textIsWhole = true;
    bool m_needsMore = false;
};

} // namespace plumbline
