#pragma once

#include "intake/input_error.hpp"

#include <expected>
#include <string>

namespace plumbline {

// SHA-256 of any file's bytes (a workbook, a statistical file), read a block at a time: the
// fingerprint recorded for inputs that are not delimited text.
std::expected<std::string, InputError> fileFingerprint(const std::string& path);

} // namespace plumbline
