#pragma once

#include <cstddef>
#include <optional>
#include <string_view>

namespace plumbline {

// Length of the valid UTF-8 sequence starting at s[i], or 0 if it is not valid (RFC 3629 §4: no
// overlong forms, no surrogates, nothing above U+10FFFF).
std::size_t utf8SequenceLength(std::string_view s, std::size_t i);

// Offset of the first byte of `text` that does not start a valid UTF-8 sequence, if any: text a
// reader hands on (a cell, a name, a label) must be UTF-8 all through.
std::optional<std::size_t> firstInvalidUtf8Byte(std::string_view text);

} // namespace plumbline
