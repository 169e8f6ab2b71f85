#pragma once

#include <cstdint>
#include <optional>
#include <string_view>

namespace plumbline {

// Days since 1970-01-01 of a proleptic Gregorian date (H. Hinnant, "chrono-Compatible Low-Level
// Date Algorithms", days_from_civil). Year 0 is 1 BC, as in ISO 8601.
std::int64_t civilDay(std::int64_t year, unsigned month, unsigned day);

// The day of a date or timestamp as a database writes it in ISO form: "YYYY-MM-DD" (four or more
// year digits), then optionally a time after 'T' or a space, and PostgreSQL's " BC" suffix. The
// time of day is dropped. Empty when the text is not such a date or the day does not exist.
std::optional<std::int64_t> sqlDateDay(std::string_view text);

} // namespace plumbline
