#pragma once

#include <cstddef>
#include <expected>
#include <string>
#include <string_view>

namespace plumbline {

// A regular file mapped read-only into memory. A large cohort is read front to back by a few
// passes (checks, fingerprint, records); mapping it instead of copying it into a string lets each
// pass hand back the pages it has finished with (release), so the process holds a window of
// the file rather than all of it. Released pages are read again from the page cache if a pass
// returns to them, so releasing too early costs time, never correctness.
class MappedFile {
public:
    // errno's text on failure.
    static std::expected<MappedFile, std::string> map(int descriptor, std::size_t size);
    MappedFile(MappedFile&& other) noexcept;
    MappedFile& operator=(MappedFile&&) = delete;
    MappedFile(const MappedFile&) = delete;
    MappedFile& operator=(const MappedFile&) = delete;
    ~MappedFile();

    std::string_view view() const { return {m_data, m_size}; }
    // Drops the pages of [begin, end) from this process (not from the file or the page cache),
    // rounded down to whole pages at both ends, so consecutive ranges release every page once.
    void release(std::size_t begin, std::size_t end) const;

private:
    MappedFile(const char* data, std::size_t size);

    const char* m_data = nullptr;
    std::size_t m_size = 0;
};

} // namespace plumbline
