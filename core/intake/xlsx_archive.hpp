#pragma once

#include "intake/input_error.hpp"
#include "intake/read_only_file.hpp"

#include <cstdint>
#include <expected>
#include <functional>
#include <memory>
#include <string>
#include <string_view>

namespace plumbline {

// The zip container of an .xlsx workbook, read with minizip through the project's read-only
// file (pread on a descriptor opened O_RDONLY), so the workbook is never opened for writing and
// a pipe or device put in its place does not block. An entry is inflated a chunk at a time into
// the caller's sink: a part of any size passes through without being held whole.
class XlsxArchive {
public:
    // InputError: not a regular file, unreadable, or not a zip archive.
    static std::expected<XlsxArchive, InputError> open(const std::string& path);
    XlsxArchive(XlsxArchive&& other) noexcept;
    XlsxArchive& operator=(XlsxArchive&&) = delete;
    XlsxArchive(const XlsxArchive&) = delete;
    XlsxArchive& operator=(const XlsxArchive&) = delete;
    ~XlsxArchive();

    const std::string& path() const { return m_path; }
    // Entry names compare without regard to case (Open Packaging Conventions, part names).
    bool contains(const std::string& entry) const;

    using Sink = std::function<bool(std::string_view chunk)>;
    // Feeds the inflated bytes of `entry` to `sink` until the end or until the sink returns
    // false. More than `limit` inflated bytes, a damaged or truncated entry, or a checksum that
    // does not match is an InputError naming the entry.
    std::expected<void, InputError> read(const std::string& entry, std::uint64_t limit, const Sink& sink) const;

private:
    struct Source;
    XlsxArchive(std::string path, std::unique_ptr<Source> source, void* zip);
    InputError damaged(const std::string& entry, const std::string& problem) const;

    std::string m_path;
    std::unique_ptr<Source> m_source;
    void* m_zip = nullptr; // unzFile
};

} // namespace plumbline
