#pragma once

#include <cstdint>
#include <optional>
#include <string_view>

namespace plumbline {

// The statistics packages whose files the intake reads; each keeps dates in its own epoch.
enum class StatisticalPackage { Sas, Stata, Spss };

// How a numeric column's stored values count time, read off its display format.
enum class DateScale {
    None,                  // not a date: the number as stored
    DaysSince1960,         // SAS dates, Stata %td
    MillisecondsSince1960, // Stata %tc and %tC
    SecondsSince1960,      // SAS datetimes
    SecondsSince1582,      // SPSS dates and datetimes (from 1582-10-14, the Gregorian start)
};

// Which scale a column's format gives, in the package that wrote the file. Formats that show a
// date but store something else (Stata's %tw, %tm, %tq, %th, %ty count weeks, months... and SPSS
// TIME/DTIME are durations) stay numbers, so no value is turned into a wrong day.
DateScale dateScaleOfFormat(StatisticalPackage package, std::string_view format);

// The day (since 1970-01-01) a stored value falls on, the time of day dropped (floor, so a
// datetime before midnight of 1970-01-01 is the day before); nullopt when the value is not
// finite or lies beyond the years 1 to 9999.
std::optional<std::int64_t> daysSince1970(DateScale scale, double stored);

} // namespace plumbline
