#pragma once

#include "intake/input_error.hpp"

#include <expected>
#include <string>
#include <string_view>
#include <vector>

namespace plumbline {

// Writes bytes under a temporary name beside the target and renames it into place, so a failed
// or interrupted write never leaves a half-written or half-overwritten file.
std::expected<void, InputError> writeFileAtomically(const std::string& path, std::string_view bytes);

// One file of a set that belongs together (the CSV tables of one report).
struct OutputFile {
    std::string path;
    std::string bytes;
};

// Writes every file of the set under a temporary name first and renames them into place only
// when all are complete: a full disk or a refused write leaves every old file as it was. The
// message says exactly what happened.
std::expected<void, InputError> writeFilesTogether(const std::vector<OutputFile>& files);

// An output must never replace an input: refused when `output` is one of `inputs` (the same
// file after symbolic and hard links: same device and inode). `option` names the output
// ("--json") in the message. An output that does not exist yet is no input.
std::expected<void, InputError> refuseInputAsOutput(const std::string& output, const std::vector<std::string>& inputs,
                                                    const std::string& option);

} // namespace plumbline
