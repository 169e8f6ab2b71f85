#pragma once

#include "intake/text_file.hpp"

#include <optional>
#include <string_view>

namespace plumbline {

// Guesses the field delimiter among comma, semicolon, tab and pipe from the first records:
// the candidate that splits the header into the most fields and keeps the field count steady
// across the sampled records wins. nullopt when no candidate splits the header at all.
std::optional<char> sniffDelimiter(std::string_view text);
// The same on a file's text, read a block at a time (a sampled record may run past a block).
std::optional<char> sniffDelimiter(const TextFile& file);

// Printable name of a delimiter for messages ("comma", "tab", ...).
std::string_view delimiterName(char delimiter);

} // namespace plumbline
