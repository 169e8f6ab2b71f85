#pragma once

#include "intake/read_only_file.hpp"

#include <cstddef>
#include <expected>
#include <string>
#include <string_view>
#include <vector>

namespace plumbline {

// Reads a range of a file front to back into one reused buffer, a block at a time, so a pass
// over a large cohort holds a block instead of the file. What a pass has not finished with (a
// record or a character cut by the block's end) stays in view while the next block is appended
// after it; the buffer grows only when that tail fills it. Bytes already in memory are one
// block, viewed without a copy.
class TextBlocks {
public:
    explicit TextBlocks(std::string_view whole);
    // [begin, end) of the file; `end` is the size the file had when it was opened.
    TextBlocks(const ReadOnlyFile& file, std::size_t begin, std::size_t end, std::size_t blockBytes);

    // The bytes read and not yet consumed; empty before the first readMore() of a file.
    std::string_view view() const;
    // Offset of view().front() from the start of the range.
    std::size_t offset() const { return m_offset; }
    // True when view() reaches the end of the range.
    bool atEnd() const;
    // The pass is done with the first `bytes` of view().
    void consume(std::size_t bytes);
    // Appends the next block to view(); false once the range has been read. A file that ends
    // before the range does (truncated by another program while it was read) or cannot be read
    // is an error: the text of a problem for an InputError.
    std::expected<bool, std::string> readMore();

private:
    std::string_view m_whole;      // bytes in memory, or
    const ReadOnlyFile* m_file = nullptr;
    std::size_t m_readTo = 0;      // file offset up to which bytes have been read
    std::size_t m_end = 0;         // file offset of the range's end
    std::size_t m_blockBytes = 0;
    std::vector<char> m_buffer;    // holds [m_viewBegin, m_viewEnd) of view()
    std::size_t m_viewBegin = 0;
    std::size_t m_viewEnd = 0;
    std::size_t m_offset = 0;
};

} // namespace plumbline
