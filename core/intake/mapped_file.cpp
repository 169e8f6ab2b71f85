#include "intake/mapped_file.hpp"

#include <algorithm>
#include <cerrno>
#include <cstring>

#include <sys/mman.h>
#include <unistd.h>

namespace plumbline {

MappedFile::MappedFile(const char* data, std::size_t size)
    : m_data(data)
    , m_size(size)
{
}

MappedFile::MappedFile(MappedFile&& other) noexcept
    : m_data(other.m_data)
    , m_size(other.m_size)
{
    other.m_data = nullptr;
    other.m_size = 0;
}

MappedFile::~MappedFile()
{
    if (m_data != nullptr)
        ::munmap(const_cast<char*>(m_data), m_size);
}

std::expected<MappedFile, std::string> MappedFile::map(int descriptor, std::size_t size)
{
    void* data = ::mmap(nullptr, size, PROT_READ, MAP_PRIVATE, descriptor, 0);
    if (data == MAP_FAILED)
        return std::unexpected(std::string(std::strerror(errno)));
    // Every pass reads front to back: ask for read-ahead, and let the kernel drop pages behind.
    ::madvise(data, size, MADV_SEQUENTIAL);
    return MappedFile(static_cast<const char*>(data), size);
}

void MappedFile::release(std::size_t begin, std::size_t end) const
{
    static const auto pageSize = static_cast<std::size_t>(::sysconf(_SC_PAGESIZE));
    const std::size_t from = std::min(begin, m_size) / pageSize * pageSize;
    const std::size_t to = std::min(end, m_size) / pageSize * pageSize;
    if (m_data != nullptr && to > from)
        ::madvise(const_cast<char*>(m_data) + from, to - from, MADV_DONTNEED);
}

} // namespace plumbline
