#pragma once

#include "intake/cohort.hpp"
#include "metrics/estimate.hpp"
#include "metrics/score_order.hpp"
#include "intake/input_error.hpp"

#include <expected>
#include <optional>
#include <string>
#include <vector>

namespace plumbline {

enum class DateFormat { Iso, DayFirst, MonthFirst };  // YYYY-MM-DD; DD/MM/YYYY; MM/DD/YYYY
enum class PeriodUnit { Month, Quarter };

// The period ("2025-03" or "2025-Q1") of a date written in the given format; nullopt when the
// text is not such a date (or not a real one: 2025-02-30). The analysis itself works on the
// dates the intake read (DateColumn::written); this reads a text, for a single date.
std::optional<std::string> periodOf(std::string_view date, DateFormat format, PeriodUnit unit);

// Performance over time: per period and model, C, O/E and calibration-in-the-large with their
// analytic intervals; a period after the first year is flagged when the interval of its O/E or
// calibration-in-the-large lies wholly outside (does not overlap) the first year's interval.
struct PeriodResult {
    std::string period;
    std::string model;
    std::size_t n = 0;
    std::size_t events = 0;
    Estimate c, oe, calibrationIntercept;
    bool outsideFirstYear = false;
};

// The first year's values that every later period is compared with, per model.
struct PeriodReference {
    std::string model;
    Estimate c, oe, calibrationIntercept;
};

struct PeriodAnalysis {
    PeriodUnit unit = PeriodUnit::Month;
    std::vector<PeriodResult> results;       // by model, then period in time order
    std::vector<std::string> firstYearPeriods;
    std::vector<PeriodReference> firstYear;   // one per model
    // The latest 12 months after the first year (all of them when fewer), pooled per model, so a
    // reader sees where the model stands now against where it started; empty within one year.
    std::vector<std::string> latestYearPeriods;
    std::vector<PeriodReference> latestYear;
    std::size_t undated = 0;                 // rows without a usable date, left out here
    std::vector<std::string> warnings;
    std::string note;                        // the usual causes of drift, for the reader
};

// An InputError when dates are ambiguous (DD/MM or MM/DD, and no format given) or none parses.
// `datesOnly` stops once the dates are known to be readable (nothing is computed). `orders`, when
// given, are the models' ascendingOrder over the cohort (sorted here otherwise).
std::expected<PeriodAnalysis, InputError> analysePeriods(const Cohort& cohort, const DateColumn& dates,
                                                         std::optional<DateFormat> format, PeriodUnit unit,
                                                         double confidence, bool datesOnly = false,
                                                         const std::vector<ScoreOrder>* orders = nullptr);

// The same refusals as analysePeriods (ambiguous or unreadable dates) without the analysis: for
// the command line's check before a long run.
std::expected<void, InputError> checkPeriodDates(const Cohort& cohort, const DateColumn& dates, std::optional<DateFormat> format);

} // namespace plumbline
