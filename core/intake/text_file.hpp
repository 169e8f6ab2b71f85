#pragma once

#include "intake/input_error.hpp"

#include <cstddef>
#include <expected>
#include <optional>
#include <string>
#include <string_view>

namespace plumbline {

// How much one line may hold before a file is judged not to be a table: a line of a cohort is a
// few hundred bytes, so a megabyte-long "line" is a document, a binary or a file without line
// breaks, and reading on would only fill memory. --max-line-length raises it.
inline constexpr std::size_t defaultMaxLineBytes = std::size_t{1} << 20;

// The bytes of one input file, held once in memory and never modified on disk.
// The UTF-8 byte-order mark, if any, is skipped by text(); the fingerprint covers the whole file.
class TextFile {
public:
    // Reads a regular file from disk; a folder, device, pipe or socket, a missing, unreadable,
    // empty, binary or UTF-16 file, or a line longer than `maxLineBytes` is an InputError. Reading
    // stops at the first line too long, so memory stays bounded.
    static std::expected<TextFile, InputError> load(const std::string& path, std::size_t maxLineBytes = defaultMaxLineBytes);
    // The same checks on bytes already in memory (tests, clipboard, the import dialog's preview).
    static std::expected<TextFile, InputError> fromBytes(std::string name, std::string bytes);

    const std::string& name() const { return m_name; }
    std::string_view text() const;
    std::size_t sizeInBytes() const { return m_bytes.size(); }
    const std::string& bytes() const { return m_bytes; }

    // Offset into text() of the first byte that is not valid UTF-8, if any.
    std::optional<std::size_t> firstInvalidUtf8() const;
    // 1-based line number of an offset into text().
    std::size_t lineOfOffset(std::size_t offset) const;

private:
    TextFile(std::string name, std::string bytes);
    static std::expected<TextFile, InputError> checked(std::string name, std::string bytes);

    std::string m_name;
    std::string m_bytes;
    std::size_t m_textStart = 0;
};

} // namespace plumbline
