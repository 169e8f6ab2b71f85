#include "intake/read_only_file.hpp"

#include <cerrno>
#include <cstring>

#include <fcntl.h>
#include <unistd.h>

namespace plumbline {

ReadOnlyFile::ReadOnlyFile(int descriptor)
    : m_descriptor(descriptor)
{
}

ReadOnlyFile::ReadOnlyFile(ReadOnlyFile&& other) noexcept
    : m_descriptor(other.m_descriptor)
{
    other.m_descriptor = -1;
}

ReadOnlyFile::~ReadOnlyFile()
{
    if (m_descriptor >= 0)
        ::close(m_descriptor);
}

std::expected<ReadOnlyFile, std::string> ReadOnlyFile::open(const std::string& path)
{
    // O_NONBLOCK: a FIFO put in the file's place after the caller's check must not block open.
    const int descriptor = ::open(path.c_str(), O_RDONLY | O_CLOEXEC | O_NONBLOCK);
    if (descriptor < 0)
        return std::unexpected(std::string(std::strerror(errno)));
    // Every pass reads front to back: ask for a larger read-ahead.
    ::posix_fadvise(descriptor, 0, 0, POSIX_FADV_SEQUENTIAL);
    return ReadOnlyFile(descriptor);
}

std::expected<std::size_t, std::string> ReadOnlyFile::readAt(std::size_t offset, char* into, std::size_t length) const
{
    std::size_t got = 0;
    while (got < length) {
        const ssize_t n = ::pread(m_descriptor, into + got, length - got, static_cast<off_t>(offset + got));
        if (n < 0) {
            if (errno == EINTR)
                continue;
            return std::unexpected(std::string(std::strerror(errno)));
        }
        if (n == 0)
            break; // the end of the file
        got += static_cast<std::size_t>(n);
    }
    return got;
}

} // namespace plumbline
