#include "intake/xlsx_archive.hpp"

#include <minizip/unzip.h>

#include <array>
#include <cstring>
#include <utility>

#include <sys/stat.h>

namespace plumbline {

// What minizip reads through: the descriptor, its size and minizip's current offset.
struct XlsxArchive::Source {
    ReadOnlyFile file;
    std::uint64_t size = 0;
    std::uint64_t offset = 0;
    bool failed = false;
};

namespace {

voidpf ZCALLBACK openSource(voidpf opaque, const void*, int mode)
{
    // Only reading is ever asked for; refuse anything else rather than pretend.
    return (mode & ZLIB_FILEFUNC_MODE_WRITE) ? nullptr : opaque;
}

// minizip's file callbacks over a Source (a template only because Source is private to the
// archive; it is instantiated once, inside XlsxArchive::open).
template <typename S>
S& sourceOf(voidpf stream)
{
    return *static_cast<S*>(stream);
}

struct SourceCallbacks {
    template <typename S>
    static uLong ZCALLBACK read(voidpf, voidpf stream, void* buffer, uLong size)
    {
        S& source = sourceOf<S>(stream);
        const auto got = source.file.readAt(source.offset, static_cast<char*>(buffer), size);
        if (!got) {
            source.failed = true;
            return 0;
        }
        source.offset += *got;
        return static_cast<uLong>(*got);
    }
    static uLong ZCALLBACK write(voidpf, voidpf, const void*, uLong) { return 0; }
    template <typename S>
    static ZPOS64_T ZCALLBACK tell(voidpf, voidpf stream) { return sourceOf<S>(stream).offset; }
    template <typename S>
    static long ZCALLBACK seek(voidpf, voidpf stream, ZPOS64_T offset, int origin)
    {
        S& source = sourceOf<S>(stream);
        std::uint64_t base = 0;
        if (origin == ZLIB_FILEFUNC_SEEK_CUR)
            base = source.offset;
        else if (origin == ZLIB_FILEFUNC_SEEK_END)
            base = source.size;
        if (offset > source.size || base > source.size - offset)
            return -1; // past the end: a damaged directory points outside the file
        source.offset = base + offset;
        return 0;
    }
    static int ZCALLBACK close(voidpf, voidpf) { return 0; }
    template <typename S>
    static int ZCALLBACK error(voidpf, voidpf stream) { return sourceOf<S>(stream).failed ? 1 : 0; }
};

InputError archiveError(const std::string& path, std::string problem, std::string remedy)
{
    InputError error;
    error.file = path;
    error.problem = std::move(problem);
    error.remedy = std::move(remedy);
    return error;
}

} // namespace

XlsxArchive::XlsxArchive(std::string path, std::unique_ptr<Source> source, void* zip)
    : m_path(std::move(path))
    , m_source(std::move(source))
    , m_zip(zip)
{
}

XlsxArchive::XlsxArchive(XlsxArchive&& other) noexcept
    : m_path(std::move(other.m_path))
    , m_source(std::move(other.m_source))
    , m_zip(std::exchange(other.m_zip, nullptr))
{
}

XlsxArchive::~XlsxArchive()
{
    if (m_zip)
        unzClose(static_cast<unzFile>(m_zip));
}

std::expected<XlsxArchive, InputError> XlsxArchive::open(const std::string& path)
{
    auto file = ReadOnlyFile::open(path);
    if (!file)
        return std::unexpected(archiveError(path, "the workbook cannot be opened: " + file.error() + ".",
                                            "check the path and that you may read the file."));
    struct stat status {};
    if (::fstat(file->descriptor(), &status) != 0 || !S_ISREG(status.st_mode))
        return std::unexpected(archiveError(path, "this is not a regular file, so it cannot be read as a workbook.",
                                            "give the path of an .xlsx file saved on disk."));
    auto source = std::make_unique<Source>(Source{std::move(*file), static_cast<std::uint64_t>(status.st_size), 0, false});
    zlib_filefunc64_def callbacks{};
    callbacks.zopen64_file = openSource;
    callbacks.zread_file = SourceCallbacks::read<Source>;
    callbacks.zwrite_file = SourceCallbacks::write;
    callbacks.ztell64_file = SourceCallbacks::tell<Source>;
    callbacks.zseek64_file = SourceCallbacks::seek<Source>;
    callbacks.zclose_file = SourceCallbacks::close;
    callbacks.zerror_file = SourceCallbacks::error<Source>;
    callbacks.opaque = source.get();
    unzFile zip = unzOpen2_64(path.c_str(), &callbacks);
    if (!zip)
        return std::unexpected(archiveError(
            path, "the file is not an .xlsx workbook: it is not a zip archive, or its end is missing (a truncated copy).",
            "save the sheet from the spreadsheet program as an Excel workbook (.xlsx) and try again, or copy the file again."));
    return XlsxArchive(path, std::move(source), zip);
}

bool XlsxArchive::contains(const std::string& entry) const
{
    return unzLocateFile(static_cast<unzFile>(m_zip), entry.c_str(), 2) == UNZ_OK;
}

InputError XlsxArchive::damaged(const std::string& entry, const std::string& problem) const
{
    return archiveError(m_path, "the workbook's part '" + entry + "' " + problem,
                        "the file is damaged or incomplete: copy it again, or open it in a spreadsheet program and save it again as .xlsx.");
}

std::expected<void, InputError> XlsxArchive::read(const std::string& entry, std::uint64_t limit, const Sink& sink) const
{
    const auto zip = static_cast<unzFile>(m_zip);
    if (unzLocateFile(zip, entry.c_str(), 2) != UNZ_OK)
        return std::unexpected(damaged(entry, "is missing."));
    if (unzOpenCurrentFile(zip) != UNZ_OK)
        return std::unexpected(damaged(entry, "cannot be opened (an unknown compression or encryption, or a damaged header)."));
    std::array<char, 64 * 1024> buffer{};
    std::uint64_t total = 0;
    bool stopped = false;
    for (;;) {
        const int got = unzReadCurrentFile(zip, buffer.data(), static_cast<unsigned>(buffer.size()));
        if (got < 0) {
            unzCloseCurrentFile(zip);
            return std::unexpected(damaged(entry, "cannot be inflated: its compressed data are damaged or cut short."));
        }
        if (got == 0)
            break;
        total += static_cast<std::uint64_t>(got);
        if (total > limit) {
            unzCloseCurrentFile(zip);
            InputError error = archiveError(
                m_path,
                "the workbook's part '" + entry + "' inflates to more than " + std::to_string(limit >> 20)
                    + " MB, more than any sheet of a cohort needs (a zip bomb, or a damaged file).",
                "save the cohort as a smaller workbook, or export it as CSV.");
            return std::unexpected(error);
        }
        if (!sink(std::string_view(buffer.data(), static_cast<std::size_t>(got)))) {
            stopped = true;
            break;
        }
    }
    // The checksum is known only at the end of the entry: an early stop cannot check it.
    const int closed = unzCloseCurrentFile(zip);
    if (!stopped && closed == UNZ_CRCERROR)
        return std::unexpected(damaged(entry, "does not match its checksum."));
    if (!stopped && closed != UNZ_OK)
        return std::unexpected(damaged(entry, "cannot be read to its end."));
    if (m_source->failed)
        return std::unexpected(damaged(entry, "cannot be read from the disk."));
    return {};
}

} // namespace plumbline
