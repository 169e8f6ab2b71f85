#pragma once

#include <string>
#include <string_view>

namespace plumbline {

// A field as RFC 4180 writes it: unchanged unless it holds a comma, quote or line break, then
// quoted with inner quotes doubled. The reports' CSV tables and the updated-risk file share it.
std::string csvQuoted(std::string_view text);

} // namespace plumbline
