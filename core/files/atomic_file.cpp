#include "files/atomic_file.hpp"

#include <atomic>
#include <cerrno>
#include <cstdio>
#include <cstring>
#include <filesystem>
#include <sys/stat.h>
#include <unistd.h>

namespace plumbline {

namespace {

// A name beside the target that no other write of this or another process uses.
std::string temporaryName(const std::string& path)
{
    static std::atomic<unsigned> counter{0};
    return path + ".part-" + std::to_string(::getpid()) + "-" + std::to_string(counter++);
}

// Writes the bytes to a new temporary file beside `path`; its name, or the reason it failed.
std::expected<std::string, InputError> writeTemporary(const std::string& path, std::string_view bytes)
{
    InputError error;
    error.file = path;
    const std::string temporary = temporaryName(path);
    std::FILE* file = std::fopen(temporary.c_str(), "wbx");
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
    return temporary;
}

} // namespace

std::expected<void, InputError> writeFileAtomically(const std::string& path, std::string_view bytes)
{
    const auto temporary = writeTemporary(path, bytes);
    if (!temporary)
        return std::unexpected(temporary.error());
    std::error_code renameError;
    std::filesystem::rename(*temporary, path, renameError);
    if (renameError) {
        std::remove(temporary->c_str());
        InputError error;
        error.file = path;
        error.problem = "the finished output could not be moved into place (" + renameError.message() + ").";
        error.remedy = "check that the target is not a folder and that you may replace it.";
        return std::unexpected(error);
    }
    return {};
}

std::expected<void, InputError> writeFilesTogether(const std::vector<OutputFile>& files)
{
    std::vector<std::string> temporaries;
    auto discard = [&temporaries] {
        for (const auto& t : temporaries)
            std::remove(t.c_str());
    };
    for (const auto& file : files) {
        const auto temporary = writeTemporary(file.path, file.bytes);
        if (!temporary) {
            discard();
            InputError error = temporary.error();
            error.remedy = "free some space or choose another folder; none of the " + std::to_string(files.size())
                + " files was written and every file that was there before is unchanged.";
            return std::unexpected(error);
        }
        temporaries.push_back(*temporary);
    }
    // Renames need no space; one can still be refused (a folder in the way): say which files are new.
    for (std::size_t k = 0; k < files.size(); ++k) {
        std::error_code renameError;
        std::filesystem::rename(temporaries[k], files[k].path, renameError);
        if (renameError) {
            for (std::size_t j = k; j < files.size(); ++j)
                std::remove(temporaries[j].c_str());
            InputError error;
            error.file = files[k].path;
            error.problem = "this file could not be put in place (" + renameError.message() + "); " + std::to_string(k) + " of the "
                + std::to_string(files.size()) + " files are new, the others are as they were.";
            error.remedy = "remove what stands in the way (a folder of that name?) and write the tables again.";
            return std::unexpected(error);
        }
    }
    return {};
}

std::expected<void, InputError> refuseInputAsOutput(const std::string& output, const std::vector<std::string>& inputs,
                                                    const std::string& option)
{
    struct stat target {};
    if (output.empty() || ::stat(output.c_str(), &target) != 0)
        return {};
    for (const auto& input : inputs) {
        struct stat source {};
        if (!input.empty() && ::stat(input.c_str(), &source) == 0 && source.st_dev == target.st_dev && source.st_ino == target.st_ino) {
            InputError error;
            error.file = output;
            error.problem = (option.empty() ? std::string("this output") : option) + " names an input of this analysis (" + input
                + "): writing it would replace the data.";
            error.remedy = "choose another name for the output; inputs are only read, never changed.";
            return std::unexpected(error);
        }
    }
    return {};
}

} // namespace plumbline
