#include "intake/readstat_file_io.hpp"

#include <readstat.h>

#include <cerrno>
#include <cstring>

#include <sys/stat.h>

namespace plumbline {

struct ReadStatCallbacks {
    static ReadStatFileIo& of(void* io) { return *static_cast<ReadStatFileIo*>(io); }

    static int open(const char* path, void* io)
    {
        ReadStatFileIo& self = of(io);
        self.m_file.reset();
        self.m_offset = 0;
        self.m_openFailure.clear();
        auto file = ReadOnlyFile::open(path);
        if (!file) {
            self.m_openFailure = file.error();
            return -1;
        }
        struct stat status {};
        if (::fstat(file->descriptor(), &status) != 0) {
            self.m_openFailure = std::strerror(errno);
            return -1;
        }
        if (!S_ISREG(status.st_mode)) {
            self.m_openFailure = "it is not a regular file (a folder, device or pipe)";
            return -1;
        }
        self.m_size = status.st_size;
        self.m_file.emplace(std::move(*file));
        return 0;
    }

    static int close(void* io)
    {
        of(io).m_file.reset();
        return 0;
    }

    static readstat_off_t seek(readstat_off_t offset, readstat_io_flags_t whence, void* io)
    {
        ReadStatFileIo& self = of(io);
        long long base = 0;
        if (whence == READSTAT_SEEK_CUR)
            base = self.m_offset;
        else if (whence == READSTAT_SEEK_END)
            base = self.m_size;
        // A corrupt header can ask for any offset: refuse what overflows or lies before the start.
        long long target = 0;
        if (__builtin_add_overflow(base, static_cast<long long>(offset), &target) || target < 0)
            return -1;
        self.m_offset = target;
        return static_cast<readstat_off_t>(target);
    }

    static ssize_t read(void* into, size_t bytes, void* io)
    {
        ReadStatFileIo& self = of(io);
        if (!self.m_file)
            return -1;
        if (self.m_offset >= self.m_size)
            return 0;
        const auto got = self.m_file->readAt(static_cast<std::size_t>(self.m_offset), static_cast<char*>(into), bytes);
        if (!got)
            return -1;
        self.m_offset += static_cast<long long>(*got);
        return static_cast<ssize_t>(*got);
    }

    // Progress reports are not asked for; ReadStat's own version would read our context as its.
    static readstat_error_t update(long, readstat_progress_handler, void*, void*) { return READSTAT_OK; }
};

void ReadStatFileIo::attachTo(readstat_parser_s* parser)
{
    readstat_set_open_handler(parser, &ReadStatCallbacks::open);
    readstat_set_close_handler(parser, &ReadStatCallbacks::close);
    readstat_set_seek_handler(parser, &ReadStatCallbacks::seek);
    readstat_set_read_handler(parser, &ReadStatCallbacks::read);
    readstat_set_update_handler(parser, &ReadStatCallbacks::update);
    readstat_set_io_ctx(parser, this);
}

} // namespace plumbline
