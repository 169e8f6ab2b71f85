#pragma once

#include "intake/csv_scanner.hpp"
#include "intake/text_blocks.hpp"

#include <cstddef>
#include <optional>
#include <string>
#include <string_view>

namespace plumbline {

class TextFile;

// The records of a text file, read block by block: a CsvScanner over the block in view, and
// when a record runs past the block's end, the next block appended after it and the record
// read again whole. Records, lines and blank lines come out exactly as from one scanner over
// the whole text.
class RecordReader {
public:
    // From text offset `from` on, which must start a record; lines count from 1 there.
    RecordReader(const TextFile& file, char delimiter, std::size_t from = 0);

    // Advances to the next non-blank record; false at the end of the text or on a read error.
    bool next();
    const CsvScanner& scanner() const { return m_scanner; }
    const std::vector<std::string_view>& fields() const { return m_scanner.fields(); }
    // Offset of the first byte not yet read, from `from`.
    std::size_t offset() const { return m_blocks.offset() + m_scanner.offset(); }
    // Why the file could not be read to its end, if it could not.
    const std::optional<std::string>& readError() const { return m_readError; }

private:
    TextBlocks m_blocks;
    CsvScanner m_scanner;
    std::optional<std::string> m_readError;
};

} // namespace plumbline
