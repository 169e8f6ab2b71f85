#pragma once

#include "input_error.hpp"

#include <expected>
#include <string>
#include <string_view>

namespace plumbline {

// Writes bytes under a temporary name beside the target and renames it into place, so a failed
// or interrupted write never leaves a half-written or half-overwritten file.
std::expected<void, InputError> writeFileAtomically(const std::string& path, std::string_view bytes);

} // namespace plumbline
