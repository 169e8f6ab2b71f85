#pragma once

#include <cstddef>
#include <expected>
#include <string>

namespace plumbline {

// A regular file opened for reading, read at offsets into the caller's buffer (pread), so that
// passes over a large cohort hold a block at a time and several threads can read it at once.
// Reading copies the bytes: a file that another program truncates while it is read yields fewer
// bytes, which the reader reports, where a memory mapping of it would kill the process (SIGBUS).
class ReadOnlyFile {
public:
    // errno's text on failure.
    static std::expected<ReadOnlyFile, std::string> open(const std::string& path);
    ReadOnlyFile(ReadOnlyFile&& other) noexcept;
    ReadOnlyFile& operator=(ReadOnlyFile&&) = delete;
    ReadOnlyFile(const ReadOnlyFile&) = delete;
    ReadOnlyFile& operator=(const ReadOnlyFile&) = delete;
    ~ReadOnlyFile();

    int descriptor() const { return m_descriptor; }
    // Reads up to `length` bytes at `offset`, retrying short reads; fewer only at the end of the
    // file. errno's text on failure.
    std::expected<std::size_t, std::string> readAt(std::size_t offset, char* into, std::size_t length) const;

private:
    explicit ReadOnlyFile(int descriptor);

    int m_descriptor = -1;
};

} // namespace plumbline
