#pragma once

#include "intake/input_error.hpp"
#include "intake/read_only_file.hpp"
#include "intake/text_blocks.hpp"

#include <cstddef>
#include <expected>
#include <memory>
#include <optional>
#include <string>
#include <string_view>

namespace plumbline {

// How much one line may hold before a file is judged not to be a table: a line of a cohort is a
// few hundred bytes, so a megabyte-long "line" is a document, a binary or a file without line
// breaks, and reading on would only fill memory. --max-line-length raises it.
inline constexpr std::size_t defaultMaxLineBytes = std::size_t{1} << 20;

// How many bytes of a file a pass reads at a time: large enough that the reads cost nothing
// measurable, small enough that a ten-million-row file is never resident whole.
inline constexpr std::size_t defaultBlockBytes = std::size_t{16} << 20;

// A position in the text: its 1-based line and the offset at which that line starts.
struct TextPosition {
    std::size_t line = 1;
    std::size_t lineStart = 0;
};

// The bytes of one input file, never modified on disk. A file from disk is read block by block
// by every pass over it (the checks here, the fingerprint, the records), so memory holds a block
// of the file, not the file; bytes given in memory are held as given. The UTF-8 byte-order mark,
// if any, is not part of the text; the fingerprint covers the whole file. A file that another
// program shortens while it is read is an InputError of the pass that finds it, never a crash.
class TextFile {
public:
    // Reads a regular file from disk; a folder, device, pipe or socket, a missing, unreadable,
    // empty, binary or UTF-16 file, or a line longer than `maxLineBytes` is an InputError. The
    // check of line lengths stops at the first line too long, so memory stays bounded.
    // `blockBytes` is how much a pass reads at a time (small in tests).
    static std::expected<TextFile, InputError> load(const std::string& path, std::size_t maxLineBytes = defaultMaxLineBytes,
                                                    std::size_t blockBytes = defaultBlockBytes);
    // The same checks on bytes already in memory (tests, clipboard, the import dialog's preview).
    static std::expected<TextFile, InputError> fromBytes(std::string name, std::string bytes);

    const std::string& name() const { return m_name; }
    // The whole file, byte-order mark included.
    std::size_t sizeInBytes() const { return m_size; }
    std::size_t textSize() const { return m_size - m_textStart; }

    // The text from `from` on, a block at a time (bytes in memory are one block).
    TextBlocks textBlocks(std::size_t from = 0) const;
    // [begin, end) of the text (cut at its end), for excerpts and for small files read whole.
    std::expected<std::string, InputError> readText(std::size_t begin, std::size_t end) const;

    // Offset into the text of the first byte that is not valid UTF-8, if any.
    std::expected<std::optional<std::size_t>, InputError> firstInvalidUtf8() const;
    // Line and line start of an offset into the text.
    std::expected<TextPosition, InputError> positionOf(std::size_t offset) const;
    // SHA-256 of the whole file as 64 lower-case hex digits, read block by block.
    std::expected<std::string, InputError> fingerprint() const;

    // A read that failed, or found the file shorter than when it was opened, as an InputError.
    InputError readFailure(const std::string& problem) const;

private:
    TextFile(std::string name, std::string bytes);
    TextFile(std::string name, std::shared_ptr<const ReadOnlyFile> file, std::size_t size, std::string head,
             std::size_t blockBytes);
    static std::expected<TextFile, InputError> checked(TextFile file);
    // Blocks of the whole file from its first byte (the mark included).
    TextBlocks byteBlocks() const;
    // A pass is done with the first `consumed` bytes in view: reads the next block; false at the end.
    std::expected<bool, InputError> advance(TextBlocks& blocks, std::size_t consumed) const;
    // 1-based number of the first line longer than the limit, if any.
    std::expected<std::optional<std::size_t>, InputError> firstLineLongerThan(std::size_t maxLineBytes) const;
    // Offset into the text of the first NUL byte, if any.
    std::expected<std::optional<std::size_t>, InputError> firstNul() const;
    // True when the text holds no more than line breaks, spaces and tabs.
    std::expected<bool, InputError> onlyBlank() const;

    std::string m_name;
    std::string m_bytes;                     // bytes given in memory, or
    std::shared_ptr<const ReadOnlyFile> m_file; // a file on disk, of m_size bytes when opened
    std::size_t m_size = 0;
    std::string m_head;                      // the first bytes of the file, for the checks of its kind
    std::size_t m_textStart = 0;
    std::size_t m_blockBytes = defaultBlockBytes;
};

} // namespace plumbline
