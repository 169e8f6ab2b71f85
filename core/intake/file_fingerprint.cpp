#include "intake/file_fingerprint.hpp"

#include "intake/read_only_file.hpp"
#include "intake/sha256_stream.hpp"

#include <vector>

#include <sys/stat.h>

namespace plumbline {

std::expected<std::string, InputError> fileFingerprint(const std::string& path)
{
    InputError error;
    error.file = path;
    auto file = ReadOnlyFile::open(path);
    if (!file) {
        error.problem = "the file cannot be opened (" + file.error() + ").";
        error.remedy = "check the path and that you may read the file.";
        return std::unexpected(error);
    }
    // A device or pipe could be read for ever (/dev/zero): only a regular file has a fingerprint.
    struct stat status {};
    if (::fstat(file->descriptor(), &status) != 0 || !S_ISREG(status.st_mode)) {
        error.problem = "this is not a regular file (a folder, device, pipe or socket), so it has no fingerprint.";
        error.remedy = "name the data file itself.";
        return std::unexpected(error);
    }
    Sha256Stream hash;
    std::vector<char> block(std::size_t{1} << 20);
    for (std::size_t offset = 0;;) {
        const auto read = file->readAt(offset, block.data(), block.size());
        if (!read) {
            error.problem = "the file cannot be read (" + read.error() + ").";
            error.remedy = "check that the file is complete and readable, then try again.";
            return std::unexpected(error);
        }
        if (*read == 0)
            break;
        hash.update({block.data(), *read});
        offset += *read;
    }
    return hash.hexDigest();
}

} // namespace plumbline
