#pragma once

#include "intake/cohort.hpp"
#include "analyses/period_analysis.hpp"

#include <cstddef>
#include <cstdint>
#include <optional>
#include <string>
#include <vector>

namespace plumbline {

// A date read at intake in the given convention (day first, month first or ISO): nullopt when it
// is not written that way or is not a real date (2025-02-30), or lies outside 1800-2200.
struct CivilDate {
    int year = 0, month = 0, day = 0;
};
std::optional<CivilDate> civilDate(const WrittenDate& date, DateFormat format);

// A date read at intake as a day number (days since 1970-01-01) in the given convention;
// nullopt when it is not written that way or is not a real date.
std::optional<std::int64_t> dayNumber(const WrittenDate& date, DateFormat format);
// The civil date of a day number as YYYY-MM-DD.
std::string isoDate(std::int64_t day);

// The cohort's rows in the order monitoring reads them: by date, and within one day in the
// cohort's row order (the order of the lines in the cohort file), which is the order the rows
// were written in and the only order a day's patients have. Rows without a usable date are left
// out and counted.
struct DatedSequence {
    std::vector<std::uint32_t> rows;  // cohort rows in monitoring order
    std::vector<std::int64_t> days;   // the day of each, as dayNumber gives it
    std::size_t undated = 0;
};

// `subset`, when given, keeps only those rows (e.g. one site's), listed in any order.
DatedSequence datedSequence(const Cohort& cohort, const DateColumn& dates, DateFormat format,
                            const std::vector<std::uint32_t>* subset = nullptr);

} // namespace plumbline
