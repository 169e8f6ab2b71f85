#include "analyses/dated_sequence.hpp"

#include <algorithm>
#include <cstdio>
#include <numeric>

namespace plumbline {

namespace {

// Days from 1970-01-01 of a proleptic Gregorian date (the civil-days algorithm of
// H. Hinnant, "chrono-compatible low-level date algorithms").
std::int64_t daysFromCivil(int y, int m, int d)
{
    y -= m <= 2 ? 1 : 0;
    const std::int64_t era = (y >= 0 ? y : y - 399) / 400;
    const std::int64_t yoe = y - era * 400;
    const std::int64_t doy = (153 * (m + (m > 2 ? -3 : 9)) + 2) / 5 + d - 1;
    const std::int64_t doe = yoe * 365 + yoe / 4 - yoe / 100 + doy;
    return era * 146097 + doe - 719468;
}

bool realDate(int year, int month, int day)
{
    static const int lengths[] = {31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31};
    if (month < 1 || month > 12 || day < 1 || year < 1800 || year > 2200)
        return false;
    const bool leap = (year % 4 == 0 && year % 100 != 0) || year % 400 == 0;
    return day <= lengths[month - 1] + (month == 2 && leap ? 1 : 0);
}

} // namespace

std::optional<CivilDate> civilDate(const WrittenDate& date, DateFormat format)
{
    int month = 0, day = 0;
    if (format == DateFormat::Iso) {
        if (date.shape != WrittenDate::Shape::Iso)
            return std::nullopt;
        month = date.first;
        day = date.second;
    } else {
        if (date.shape != WrittenDate::Shape::Slashed)
            return std::nullopt;
        day = format == DateFormat::DayFirst ? date.first : date.second;
        month = format == DateFormat::DayFirst ? date.second : date.first;
    }
    if (!realDate(date.year, month, day))
        return std::nullopt;
    return CivilDate{date.year, month, day};
}

std::optional<std::int64_t> dayNumber(const WrittenDate& date, DateFormat format)
{
    const auto civil = civilDate(date, format);
    if (!civil)
        return std::nullopt;
    return daysFromCivil(civil->year, civil->month, civil->day);
}

std::string isoDate(std::int64_t z)
{
    // The inverse of daysFromCivil (same source).
    z += 719468;
    const std::int64_t era = (z >= 0 ? z : z - 146096) / 146097;
    const std::int64_t doe = z - era * 146097;
    const std::int64_t yoe = (doe - doe / 1460 + doe / 36524 - doe / 146096) / 365;
    const std::int64_t doy = doe - (365 * yoe + yoe / 4 - yoe / 100);
    const std::int64_t mp = (5 * doy + 2) / 153;
    const int d = int(doy - (153 * mp + 2) / 5 + 1);
    const int m = int(mp < 10 ? mp + 3 : mp - 9);
    const int y = int(yoe + era * 400 + (m <= 2 ? 1 : 0));
    char buffer[48];
    std::snprintf(buffer, sizeof buffer, "%04d-%02d-%02d", y, m, d);
    return buffer;
}

DatedSequence datedSequence(const Cohort& cohort, const DateColumn& dates, DateFormat format,
                            const std::vector<std::uint32_t>* subset)
{
    std::vector<std::optional<std::int64_t>> levelDay(dates.written.size());
    for (std::size_t k = 0; k < dates.written.size(); ++k)
        levelDay[k] = dayNumber(dates.written[k], format);
    std::vector<std::uint32_t> candidates;
    if (subset) {
        candidates = *subset;
    } else {
        candidates.resize(cohort.rows());
        std::iota(candidates.begin(), candidates.end(), 0u);
    }
    DatedSequence out;
    for (const std::uint32_t row : candidates) {
        if (levelDay[dates.codes[row]])
            out.rows.push_back(row);
        else
            ++out.undated;
    }
    // Within a day, the source line decides; rows without lines (a cohort built in memory) keep
    // their row order, which is the order they were staged in.
    auto line = [&](std::uint32_t row) -> std::uint64_t { return row < cohort.sourceLines.size() ? cohort.sourceLines[row] : 0; };
    std::sort(out.rows.begin(), out.rows.end(), [&](std::uint32_t a, std::uint32_t b) {
        const std::int64_t da = *levelDay[dates.codes[a]], db = *levelDay[dates.codes[b]];
        if (da != db)
            return da < db;
        if (line(a) != line(b))
            return line(a) < line(b);
        return a < b;
    });
    out.days.reserve(out.rows.size());
    for (const std::uint32_t row : out.rows)
        out.days.push_back(*levelDay[dates.codes[row]]);
    return out;
}

} // namespace plumbline
