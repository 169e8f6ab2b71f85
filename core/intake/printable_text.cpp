#include "intake/printable_text.hpp"

#include <cstdio>

namespace plumbline {

namespace {

// The code point of the valid UTF-8 sequence at s[i] and its length, or length 0 when the bytes
// there are not UTF-8 (RFC 3629 §4: no overlong forms, no surrogates).
std::pair<char32_t, std::size_t> decode(std::string_view s, std::size_t i)
{
    const auto b = [&](std::size_t k) { return static_cast<unsigned char>(s[i + k]); };
    const auto continuation = [&](std::size_t k) { return i + k < s.size() && (b(k) & 0xC0) == 0x80; };
    const unsigned char b0 = b(0);
    if (b0 < 0x80)
        return {b0, 1};
    if (b0 >= 0xC2 && b0 <= 0xDF && continuation(1))
        return {char32_t((b0 & 0x1F) << 6 | (b(1) & 0x3F)), 2};
    if (b0 >= 0xE0 && b0 <= 0xEF && continuation(1) && continuation(2)) {
        const char32_t c = char32_t((b0 & 0x0F) << 12 | (b(1) & 0x3F) << 6 | (b(2) & 0x3F));
        if (c >= 0x800 && (c < 0xD800 || c > 0xDFFF))
            return {c, 3};
    }
    if (b0 >= 0xF0 && b0 <= 0xF4 && continuation(1) && continuation(2) && continuation(3)) {
        const char32_t c = char32_t((b0 & 0x07) << 18 | (b(1) & 0x3F) << 12 | (b(2) & 0x3F) << 6 | (b(3) & 0x3F));
        if (c >= 0x10000 && c <= 0x10FFFF)
            return {c, 4};
    }
    return {0, 0};
}

bool isBidiControl(char32_t c)
{
    return (c >= 0x202A && c <= 0x202E) || (c >= 0x2066 && c <= 0x2069) || c == 0x200E || c == 0x200F || c == 0x061C;
}

std::string codePointName(char32_t c)
{
    char buffer[16];
    std::snprintf(buffer, sizeof buffer, "<U+%04X>", static_cast<unsigned>(c));
    return buffer;
}

std::string byteEscape(unsigned char byte)
{
    char buffer[8];
    std::snprintf(buffer, sizeof buffer, "\\x%02X", byte);
    return buffer;
}

} // namespace

std::string withVisibleBidiControls(std::string_view text)
{
    std::string out;
    out.reserve(text.size());
    for (std::size_t i = 0; i < text.size();) {
        const auto [c, length] = decode(text, i);
        if (length == 0) {
            out += text[i++];
            continue;
        }
        if (isBidiControl(c))
            out += codePointName(c);
        else
            out.append(text.substr(i, length));
        i += length;
    }
    return out;
}

std::string printableExcerpt(std::string_view text, std::size_t maxCharacters)
{
    std::string out;
    std::size_t shown = 0;
    for (std::size_t i = 0; i < text.size();) {
        if (shown == maxCharacters)
            return out + "...";
        const auto [c, length] = decode(text, i);
        if (length == 0) {
            out += byteEscape(static_cast<unsigned char>(text[i]));
            ++i;
        } else if (c < 0x20 || c == 0x7F || (c >= 0x80 && c < 0xA0)) {
            out += byteEscape(static_cast<unsigned char>(c));
            i += length;
        } else if (isBidiControl(c)) {
            out += codePointName(c);
            i += length;
        } else {
            out.append(text.substr(i, length));
            i += length;
        }
        ++shown;
    }
    return out;
}

} // namespace plumbline
