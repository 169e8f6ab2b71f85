#pragma once

#include <string>
#include <string_view>

namespace plumbline {

// UTF-8 <-> UTF-16 for ODBC's wide-character calls, which carry text in the driver's own
// encoding-free form (the narrow calls would pass it through the driver manager's locale).
// Anything that is not valid in the source encoding becomes U+FFFD.
std::u16string utf16FromUtf8(std::string_view text);
std::string utf8FromUtf16(std::u16string_view text);

} // namespace plumbline
