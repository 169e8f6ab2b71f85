#pragma once

#include <string>
#include <string_view>

namespace plumbline {

// SHA-256 of a byte string as 64 lower-case hex digits (FIPS 180-4, computed by OpenSSL's libcrypto).
std::string sha256Hex(std::string_view bytes);

} // namespace plumbline
