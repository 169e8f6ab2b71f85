#include "atomic_file.hpp"

#include <cerrno>
#include <cstdio>
#include <cstring>
#include <filesystem>
#include <unistd.h>

namespace plumbline {

std::expected<void, InputError> writeFileAtomically(const std::string& path, std::string_view bytes)
{
    InputError error;
    error.file = path;
    const std::string temporary = path + ".part-" + std::to_string(::getpid());
    std::FILE* file = std::fopen(temporary.c_str(), "wb");
    if (!file) {
        error.problem = std::string("the output cannot be created (") + std::strerror(errno) + ").";
        error.remedy = "check that the folder exists and that you may write to it.";
        return std::unexpected(error);
    }
    const bool written = std::fwrite(bytes.data(), 1, bytes.size(), file) == bytes.size();
    const bool flushed = std::fflush(file) == 0 && ::fsync(::fileno(file)) == 0;
    const bool closed = std::fclose(file) == 0;
    if (!written || !flushed || !closed) {
        std::remove(temporary.c_str());
        error.problem = "the output could not be written completely (is the disk full?).";
        error.remedy = "free some space or choose another folder; nothing was overwritten.";
        return std::unexpected(error);
    }
    std::error_code renameError;
    std::filesystem::rename(temporary, path, renameError);
    if (renameError) {
        std::remove(temporary.c_str());
        error.problem = "the finished output could not be moved into place (" + renameError.message() + ").";
        error.remedy = "check that the target is not a folder and that you may replace it.";
        return std::unexpected(error);
    }
    return {};
}

} // namespace plumbline
