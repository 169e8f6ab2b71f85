#include "intake/written_date.hpp"

#include "intake/field_values.hpp"

#include <algorithm>
#include <charconv>

namespace plumbline {

namespace {

bool digits(std::string_view s)
{
    return !s.empty() && std::all_of(s.begin(), s.end(), [](char c) { return c >= '0' && c <= '9'; });
}

int number(std::string_view s)
{
    int value = 0;
    std::from_chars(s.data(), s.data() + s.size(), value);
    return value;
}

// "d/m/yyyy" or "m/d/yyyy" (either separator / or . or -) split into its three numbers.
bool slashed(std::string_view s, int& first, int& second, int& year)
{
    const auto a = s.find_first_of("/.-");
    const auto b = a == std::string_view::npos ? a : s.find_first_of("/.-", a + 1);
    if (b == std::string_view::npos)
        return false;
    const auto p1 = s.substr(0, a), p2 = s.substr(a + 1, b - a - 1), p3 = s.substr(b + 1);
    if (!digits(p1) || !digits(p2) || !digits(p3) || p1.size() > 2 || p2.size() > 2 || p3.size() != 4)
        return false;
    first = number(p1);
    second = number(p2);
    year = number(p3);
    return true;
}

bool iso(std::string_view s)
{
    if (s.size() < 10 || s[4] != '-' || s[7] != '-' || !digits(s.substr(0, 4)) || !digits(s.substr(5, 2)) || !digits(s.substr(8, 2)))
        return false;
    return s.size() == 10 || s[10] == 'T' || s[10] == ' '; // a time may follow, nothing else
}

} // namespace

WrittenDate readWrittenDate(std::string_view text)
{
    const std::string_view s = trimmed(text);
    WrittenDate date;
    if (iso(s)) {
        date = {WrittenDate::Shape::Iso, number(s.substr(0, 4)), number(s.substr(5, 2)), number(s.substr(8, 2))};
    } else if (slashed(s, date.first, date.second, date.year)) {
        date.shape = WrittenDate::Shape::Slashed;
    }
    return date;
}

} // namespace plumbline
