#pragma once

#include "intake/read_only_file.hpp"

#include <optional>
#include <string>

struct readstat_parser_s;

namespace plumbline {

// ReadStat's file access, replaced so that a statistical file is read as every input is: opened
// read-only and non-blocking, only if it is a regular file (a FIFO or a device put in its place
// is refused, never waited on), and read with pread through ReadOnlyFile.
class ReadStatFileIo {
public:
    ReadStatFileIo() = default;
    ReadStatFileIo(const ReadStatFileIo&) = delete;
    ReadStatFileIo& operator=(const ReadStatFileIo&) = delete;

    // Makes `parser` open, seek and read through this object, which must outlive the parse.
    void attachTo(readstat_parser_s* parser);
    // Why the last open failed (errno's text, or "not a regular file"); empty if it did not.
    const std::string& openFailure() const { return m_openFailure; }
    // The size the file had when it was last opened.
    long long fileSize() const { return m_size; }

private:
    friend struct ReadStatCallbacks; // ReadStat's handler signatures, defined beside readstat.h

    std::optional<ReadOnlyFile> m_file;
    long long m_offset = 0;
    long long m_size = 0;
    std::string m_openFailure;
};

} // namespace plumbline
