#pragma once

#include <string>
#include <string_view>

namespace plumbline {

// Text from a file shown to a person (messages, reports, the window) must not be able to hide
// or reorder what is around it, nor reach a terminal as raw bytes.

// Bidirectional controls (U+202A–U+202E, U+2066–U+2069, U+200E, U+200F, U+061C) written as a
// visible "<U+202E>": "exe.png" can no longer pose as "gnp.exe". Everything else is unchanged.
std::string withVisibleBidiControls(std::string_view text);

// At most `maxCharacters` characters, never cut inside a character, with "..." when shortened;
// control characters and bytes that are not UTF-8 as \xNN, bidirectional controls as <U+XXXX>.
std::string printableExcerpt(std::string_view text, std::size_t maxCharacters);

} // namespace plumbline
