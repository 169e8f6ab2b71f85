#include "intake/field_values.hpp"

#include <array>
#include <charconv>
#include <cmath>

namespace plumbline {

std::string_view trimmed(std::string_view text)
{
    std::size_t begin = 0;
    std::size_t end = text.size();
    while (begin < end && (text[begin] == ' ' || text[begin] == '\t'))
        ++begin;
    while (end > begin && (text[end - 1] == ' ' || text[end - 1] == '\t'))
        --end;
    return text.substr(begin, end - begin);
}

std::string lowerAscii(std::string_view text)
{
    std::string out(text);
    for (char& c : out)
        if (c >= 'A' && c <= 'Z')
            c = static_cast<char>(c - 'A' + 'a');
    return out;
}

bool isMissingToken(std::string_view field)
{
    const std::string_view t = trimmed(field);
    if (t.empty())
        return true;
    if (t.size() > 4)
        return false;
    const std::string lower = lowerAscii(t);
    return lower == "na" || lower == "n/a" || lower == "null" || lower == "." || lower == "nan";
}

std::optional<double> parseNumber(std::string_view field, bool decimalComma)
{
    std::string_view t = trimmed(field);
    if (!t.empty() && t.front() == '+')
        t.remove_prefix(1);
    if (t.empty() || t.front() == '+' || t.front() == ' ')
        return std::nullopt;
    std::array<char, 64> buffer{};
    if (decimalComma) {
        if (t.size() >= buffer.size() || t.find('.') != std::string_view::npos)
            return std::nullopt;
        for (std::size_t i = 0; i < t.size(); ++i)
            buffer[i] = t[i] == ',' ? '.' : t[i];
        t = std::string_view(buffer.data(), t.size());
    }
    double value = 0.0;
    const auto [end, error] = std::from_chars(t.data(), t.data() + t.size(), value);
    if (error == std::errc::result_out_of_range) {
        // Overflow or underflow: the text is a number, just not a representable one. A negative
        // exponent means underflow (round to zero), otherwise overflow (infinite). strtod is
        // avoided on purpose: it follows the process locale, which a GUI may have changed.
        const bool negative = t.front() == '-';
        const std::size_t e = t.find_first_of("eE");
        const bool underflow = e != std::string_view::npos && e + 1 < t.size() && t[e + 1] == '-';
        const double magnitude = underflow ? 0.0 : HUGE_VAL;
        return negative ? -magnitude : magnitude;
    }
    if (error != std::errc() || end != t.data() + t.size())
        return std::nullopt;
    return value;
}

} // namespace plumbline
