#include "intake/csv_scanner.hpp"

namespace plumbline {

CsvScanner::CsvScanner(std::string_view text, char delimiter, bool textIsWhole)
    : m_text(text)
    , m_delimiter(delimiter)
    , m_textIsWhole(textIsWhole)
{
}

void CsvScanner::resume(std::string_view text, bool textIsWhole)
{
    m_text = text;
    m_pos = 0;
    m_textIsWhole = textIsWhole;
    m_needsMore = false;
}

bool CsvScanner::cutAt(std::size_t pos) const
{
    return !m_textIsWhole && (pos >= m_text.size() || (m_text[pos] == '\r' && pos + 1 >= m_text.size()));
}

bool CsvScanner::needMoreFrom(const Position& start)
{
    m_pos = start.pos;
    m_line = start.line;
    m_blankLines = start.blankLines;
    m_fields.clear();
    m_needsMore = true;
    return false;
}

bool CsvScanner::atRecordEnd() const
{
    return m_pos >= m_text.size() || m_text[m_pos] == '\n' || m_text[m_pos] == '\r';
}

void CsvScanner::consumeRecordEnd()
{
    if (m_pos < m_text.size() && m_text[m_pos] == '\r')
        ++m_pos;
    if (m_pos < m_text.size() && m_text[m_pos] == '\n')
        ++m_pos;
    ++m_line;
}

bool CsvScanner::next()
{
    m_fields.clear();
    m_unescapedUsed = 0;
    m_strayQuote = false;
    m_needsMore = false;
    const Position start{m_pos, m_line, m_blankLines};
    // Skip blank lines (including a lone CR or trailing blank lines at the end of the file).
    while (m_pos < m_text.size() && (m_text[m_pos] == '\n' || m_text[m_pos] == '\r')) {
        if (cutAt(m_pos))
            return needMoreFrom(start);
        consumeRecordEnd();
        ++m_blankLines;
    }
    if (m_pos >= m_text.size())
        return m_textIsWhole ? false : needMoreFrom(start);
    m_recordLine = m_line;
    for (;;) {
        if (m_pos < m_text.size() && m_text[m_pos] == '"')
            readQuoted();
        else
            readUnquoted();
        if (m_needsMore)
            return needMoreFrom(start);
        if (m_unclosedQuote)
            return true;
        if (m_pos < m_text.size() && m_text[m_pos] == m_delimiter) {
            ++m_pos;
            continue;
        }
        if (cutAt(m_pos))
            return needMoreFrom(start);
        consumeRecordEnd();
        return true;
    }
}

void CsvScanner::readUnquoted()
{
    const std::size_t start = m_pos;
    const char* data = m_text.data();
    const std::size_t size = m_text.size();
    std::size_t i = m_pos;
    while (i < size) {
        const char c = data[i];
        if (c == m_delimiter || c == '\n' || c == '\r')
            break;
        ++i;
    }
    m_pos = i;
    m_fields.emplace_back(data + start, i - start);
}

void CsvScanner::readQuoted()
{
    const std::size_t fieldStart = ++m_pos; // after the opening quote
    bool hasDoubledQuote = false;
    std::size_t i = m_pos;
    const std::size_t lineAtStart = m_line;
    for (;;) {
        const std::size_t quote = m_text.find('"', i);
        // In a block, a quote not closed yet (or closed by its last byte, which may be the
        // first of a doubled pair) may close in the next one.
        if (!m_textIsWhole && (quote == std::string_view::npos || quote + 1 == m_text.size())) {
            m_needsMore = true;
            return;
        }
        if (quote == std::string_view::npos) {
            m_unclosedQuote = true;
            m_unclosedField = m_fields.size();
            m_line = lineAtStart;
            m_pos = m_text.size();
            m_fields.emplace_back(m_text.substr(fieldStart));
            return;
        }
        if (quote + 1 < m_text.size() && m_text[quote + 1] == '"') {
            hasDoubledQuote = true;
            i = quote + 2;
            continue;
        }
        i = quote;
        break;
    }
    const std::string_view raw = m_text.substr(fieldStart, i - fieldStart);
    for (char c : raw)
        if (c == '\n')
            ++m_line;
    m_pos = i + 1; // after the closing quote
    std::string_view field = raw;
    if (hasDoubledQuote) {
        if (m_unescapedUsed == m_unescaped.size())
            m_unescaped.emplace_back();
        std::string& buffer = m_unescaped[m_unescapedUsed++];
        buffer.clear();
        for (std::size_t k = 0; k < raw.size(); ++k) {
            buffer += raw[k];
            if (raw[k] == '"')
                ++k; // skip the second quote of a doubled pair
        }
        field = buffer;
    }
    // Text between the closing quote and the delimiter is malformed; keep it so nothing is lost.
    if (!atRecordEnd() && m_text[m_pos] != m_delimiter) {
        m_strayQuote = true;
        const std::size_t tailStart = m_pos;
        while (!atRecordEnd() && m_text[m_pos] != m_delimiter)
            ++m_pos;
        if (m_unescapedUsed == m_unescaped.size())
            m_unescaped.emplace_back();
        std::string& buffer = m_unescaped[m_unescapedUsed++];
        buffer.assign(field);
        buffer.append(m_text.substr(tailStart, m_pos - tailStart));
        field = buffer;
    }
    m_fields.push_back(field);
}

} // namespace plumbline
