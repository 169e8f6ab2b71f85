#pragma once

#include "intake/input_error.hpp"
#include "intake/mapped_file.hpp"

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

// How many bytes of a file a pass reads before it releases them: large enough that releasing
// costs nothing measurable, small enough that a ten-million-row file is never resident whole.
inline constexpr std::size_t defaultReleaseBlockBytes = std::size_t{16} << 20;

// The bytes of one input file, never modified on disk. A file from disk is mapped read-only and
// every pass over it (the checks here, the fingerprint, the records) releases what it has read
// block by block, so memory holds a window of the file, not the file; bytes given in memory are
// held as given. The UTF-8 byte-order mark, if any, is skipped by text(); the fingerprint covers
// the whole file.
class TextFile {
public:
    // Reads a regular file from disk; a folder, device, pipe or socket, a missing, unreadable,
    // empty, binary or UTF-16 file, or a line longer than `maxLineBytes` is an InputError. The
    // check of line lengths stops at the first line too long, so memory stays bounded.
    // `releaseBlockBytes` is how much a pass reads between releases (small in tests).
    static std::expected<TextFile, InputError> load(const std::string& path, std::size_t maxLineBytes = defaultMaxLineBytes,
                                                    std::size_t releaseBlockBytes = defaultReleaseBlockBytes);
    // The same checks on bytes already in memory (tests, clipboard, the import dialog's preview).
    static std::expected<TextFile, InputError> fromBytes(std::string name, std::string bytes);

    const std::string& name() const { return m_name; }
    std::string_view text() const;
    std::size_t sizeInBytes() const { return bytes().size(); }
    std::string_view bytes() const;

    // Offset into text() of the first byte that is not valid UTF-8, if any.
    std::optional<std::size_t> firstInvalidUtf8() const;
    // 1-based line number of an offset into text().
    std::size_t lineOfOffset(std::size_t offset) const;
    // SHA-256 of bytes() as 64 lower-case hex digits, read block by block.
    std::string fingerprint() const;

    // A pass over text() says it has finished with [begin, end) (offsets into text()); a mapped
    // file gives those pages back. Safe from several threads; a later read of them still works.
    void releaseText(std::size_t begin, std::size_t end) const;
    std::size_t releaseBlockBytes() const { return m_releaseBlockBytes; }

private:
    TextFile(std::string name, std::string bytes);
    TextFile(std::string name, std::shared_ptr<const MappedFile> mapping, std::size_t releaseBlockBytes);
    static std::expected<TextFile, InputError> checked(TextFile file);
    // 1-based number of the first line longer than the limit, if any.
    std::optional<std::size_t> firstLineLongerThan(std::size_t maxLineBytes) const;
    // Offset into text() of the first NUL byte, or npos.
    std::size_t firstNul() const;

    std::string m_name;
    std::string m_bytes;                         // bytes given in memory
    std::shared_ptr<const MappedFile> m_mapping; // or a file mapped from disk
    std::size_t m_textStart = 0;
    std::size_t m_releaseBlockBytes = defaultReleaseBlockBytes;
};

} // namespace plumbline
