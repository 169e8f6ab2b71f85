#include "intake/sql_date_text.hpp"

#include <charconv>

namespace plumbline {

std::int64_t civilDay(std::int64_t year, unsigned month, unsigned day)
{
    year -= month <= 2 ? 1 : 0;
    const std::int64_t era = (year >= 0 ? year : year - 399) / 400;
    const auto yearOfEra = static_cast<unsigned>(year - era * 400);
    const unsigned dayOfYear = (153 * (month > 2 ? month - 3 : month + 9) + 2) / 5 + day - 1;
    const unsigned dayOfEra = yearOfEra * 365 + yearOfEra / 4 - yearOfEra / 100 + dayOfYear;
    return era * 146097 + static_cast<std::int64_t>(dayOfEra) - 719468;
}

namespace {

bool leapYear(std::int64_t year) { return year % 4 == 0 && (year % 100 != 0 || year % 400 == 0); }

unsigned daysInMonth(std::int64_t year, unsigned month)
{
    static constexpr unsigned days[] = {31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31};
    return month == 2 && leapYear(year) ? 29 : days[month - 1];
}

// Exactly two digits at `at`, or nothing.
std::optional<unsigned> twoDigits(std::string_view text, std::size_t at)
{
    if (at + 2 > text.size())
        return std::nullopt;
    unsigned value = 0;
    auto [end, error] = std::from_chars(text.data() + at, text.data() + at + 2, value);
    if (error != std::errc{} || end != text.data() + at + 2)
        return std::nullopt;
    return value;
}

} // namespace

std::optional<std::int64_t> sqlDateDay(std::string_view text)
{
    const std::size_t dash = text.find('-');
    // Year digits only (no sign: PostgreSQL writes years before 1 with " BC"); at most nine.
    if (dash == std::string_view::npos || dash < 4 || dash > 9)
        return std::nullopt;
    std::int64_t year = 0;
    auto [yearEnd, yearError] = std::from_chars(text.data(), text.data() + dash, year);
    if (yearError != std::errc{} || yearEnd != text.data() + dash || text[0] == '-' || text[0] == '+')
        return std::nullopt;
    const auto month = twoDigits(text, dash + 1);
    const auto day = twoDigits(text, dash + 4);
    if (!month || !day || text.size() < dash + 6 || text[dash + 3] != '-')
        return std::nullopt;
    std::string_view rest = text.substr(dash + 6);
    if (!rest.empty() && rest.front() != ' ' && rest.front() != 'T')
        return std::nullopt;
    if (rest.ends_with(" BC")) {
        if (year == 0)
            return std::nullopt;
        year = 1 - year;
    }
    if (*month < 1 || *month > 12 || *day < 1 || *day > daysInMonth(year, *month))
        return std::nullopt;
    return civilDay(year, *month, *day);
}

} // namespace plumbline
