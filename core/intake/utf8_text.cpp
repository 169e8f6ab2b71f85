#include "intake/utf8_text.hpp"

namespace plumbline {

std::size_t utf8SequenceLength(std::string_view s, std::size_t i)
{
    const auto b0 = static_cast<unsigned char>(s[i]);
    auto cont = [&](std::size_t k) {
        return i + k < s.size() && (static_cast<unsigned char>(s[i + k]) & 0xC0) == 0x80;
    };
    auto byte = [&](std::size_t k) { return static_cast<unsigned char>(s[i + k]); };
    if (b0 < 0x80)
        return 1;
    if (b0 >= 0xC2 && b0 <= 0xDF)
        return cont(1) ? 2 : 0;
    if (b0 >= 0xE0 && b0 <= 0xEF) {
        if (!cont(1) || !cont(2))
            return 0;
        if (b0 == 0xE0 && byte(1) < 0xA0)
            return 0; // overlong
        if (b0 == 0xED && byte(1) > 0x9F)
            return 0; // surrogate
        return 3;
    }
    if (b0 >= 0xF0 && b0 <= 0xF4) {
        if (!cont(1) || !cont(2) || !cont(3))
            return 0;
        if (b0 == 0xF0 && byte(1) < 0x90)
            return 0;
        if (b0 == 0xF4 && byte(1) > 0x8F)
            return 0;
        return 4;
    }
    return 0;
}

std::optional<std::size_t> firstInvalidUtf8Byte(std::string_view text)
{
    for (std::size_t i = 0; i < text.size();) {
        const std::size_t length = utf8SequenceLength(text, i);
        if (length == 0)
            return i;
        i += length;
    }
    return std::nullopt;
}

} // namespace plumbline
