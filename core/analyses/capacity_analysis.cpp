#include "analyses/capacity_analysis.hpp"

#include "analyses/row_subsets.hpp"

#include "intake/written_date.hpp"
#include "metrics/binomial_interval.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <limits>

namespace plumbline {

namespace {

// Days since 1970-01-01 of a civil date (the proleptic Gregorian calendar), so that spans are
// differences of whole numbers.
long daysFromCivil(int year, int month, int day)
{
    year -= month <= 2 ? 1 : 0;
    const long era = (year >= 0 ? year : year - 399) / 400;
    const long yoe = year - era * 400;
    const long doy = (153 * (month + (month > 2 ? -3 : 9)) + 2) / 5 + day - 1;
    const long doe = yoe * 365 + yoe / 4 - yoe / 100 + doy;
    return era * 146097 + doe - 719468;
}

std::string isoText(int year, int month, int day)
{
    char buffer[40];
    std::snprintf(buffer, sizeof buffer, "%04d-%02d-%02d", year, month, day);
    return buffer;
}

struct DatedLevel {
    long day = 0;
    long periodFirst = 0, periodLast = 0; // the calendar month or quarter holding the date
    std::string period;
    std::string text;
};

// A level's date under the format, nullopt when it does not read as a real date (periodOf
// decides that, so a date counts here exactly when it counts in the period analysis).
std::optional<DatedLevel> datedLevel(const std::string& level, const WrittenDate& w, DateFormat format, PeriodUnit unit)
{
    auto period = periodOf(level, format, unit);
    if (!period)
        return std::nullopt;
    const int month = format == DateFormat::DayFirst ? w.second : w.first;
    const int day = format == DateFormat::DayFirst ? w.first : w.second;
    DatedLevel out;
    out.day = daysFromCivil(w.year, month, day);
    const int startMonth = unit == PeriodUnit::Month ? month : (month - 1) / 3 * 3 + 1;
    const int months = unit == PeriodUnit::Month ? 1 : 3;
    out.periodFirst = daysFromCivil(w.year, startMonth, 1);
    const int endMonth = startMonth + months; // may be 13: the first of next year
    out.periodLast = (endMonth > 12 ? daysFromCivil(w.year + 1, endMonth - 12, 1) : daysFromCivil(w.year, endMonth, 1)) - 1;
    out.period = std::move(*period);
    out.text = isoText(w.year, month, day);
    return out;
}

// The capacity applied to some rows of one model: `order` is their ascending order.
CapacityResult atCapacity(std::span<const double> risk, std::span<const std::uint8_t> outcome, std::span<const std::uint32_t> order,
                          double capacity, bool probabilities, double confidence, CiMethod method)
{
    CapacityResult r;
    r.patients = order.size();
    for (std::uint32_t row : order)
        r.events += outcome[row];
    r.capacity = capacity;
    // A tolerance of 1e-9 so that 10% of 1000 patients is 100 even when the product is 99.999…
    const double whole = std::floor(capacity + 1e-9);
    const std::size_t requested = whole >= double(std::numeric_limits<std::uint32_t>::max()) ? std::numeric_limits<std::uint32_t>::max()
                                                                                              : std::size_t(std::max(0.0, whole));
    r.at = capacityThreshold(risk, order, requested);
    for (std::size_t k = order.size() - r.at.flagged; k < order.size(); ++k)
        r.tp += outcome[order[k]];
    r.fp = r.at.flagged - r.tp;
    r.fn = r.events - r.tp;
    r.tn = r.patients - r.events - r.fp;
    auto proportion = [&](std::size_t x, std::size_t n) {
        return n == 0 ? ProportionWithCi{} : ProportionWithCi{double(x) / double(n), binomialInterval(x, n, confidence, method)};
    };
    r.sensitivity = proportion(r.tp, r.tp + r.fn);
    r.specificity = proportion(r.tn, r.tn + r.fp);
    r.ppv = proportion(r.tp, r.tp + r.fp);
    if (r.at.flagged > 0)
        r.eventsPer100Flagged = 100.0 * double(r.tp) / double(r.at.flagged);
    // Net benefit weighs a false positive by the threshold's odds: defined for a probability
    // threshold below 1; nobody flagged (no threshold) gains and loses nothing.
    if (probabilities && r.patients > 0) {
        if (!r.at.threshold)
            r.netBenefit = 0.0;
        else if (*r.at.threshold < 1.0) {
            const double t = *r.at.threshold, n = double(r.patients);
            r.netBenefit = double(r.tp) / n - double(r.fp) / n * t / (1.0 - t);
        }
    }
    return r;
}

std::string countText(double value)
{
    char buffer[40];
    std::snprintf(buffer, sizeof buffer, "%.6g", value);
    return buffer;
}

} // namespace

bool overflowsCapacity(std::size_t flagged, std::size_t requested)
{
    return double(flagged) > double(requested) * (1.0 + overCapacityMargin);
}

std::optional<DateSpan> cohortDateSpan(const Cohort& cohort, std::optional<DateFormat> dateFormat)
{
    if (!cohort.period || !checkPeriodDates(cohort, *cohort.period, dateFormat))
        return std::nullopt;
    const DateColumn& dates = *cohort.period;
    std::vector<std::optional<DatedLevel>> levels;
    for (std::size_t k = 0; k < dates.levels.size(); ++k)
        levels.push_back(datedLevel(dates.levels[k], dates.written[k], dateFormat.value_or(DateFormat::Iso), PeriodUnit::Month));
    DateSpan span;
    long first = std::numeric_limits<long>::max(), last = std::numeric_limits<long>::min();
    for (const std::uint32_t code : dates.codes) {
        if (!levels[code]) {
            ++span.undated;
            continue;
        }
        if (levels[code]->day < first) { first = levels[code]->day; span.first = levels[code]->text; }
        if (levels[code]->day > last) { last = levels[code]->day; span.last = levels[code]->text; }
    }
    if (first > last)
        return std::nullopt;
    span.days = double(last - first + 1);
    return span;
}

std::expected<CapacityAnalysis, InputError> analyseCapacity(const Cohort& cohort, const CapacitySpec& spec,
                                                            const std::vector<ScoreOrder>& orders, double confidence,
                                                            CiMethod binomialMethod, std::optional<DateFormat> dateFormat,
                                                            PeriodUnit unit)
{
    CapacityAnalysis out;
    out.spec = spec;
    out.text = capacityText(spec);
    out.periodUnit = unit;
    const bool rate = spec.kind == CapacitySpec::Kind::Rate;
    const bool probabilities = scaleIsProbabilistic(cohort.scale);
    InputError error;
    error.problem = "--capacity " + out.text + " counts patients per " + (spec.unit == CapacitySpec::Unit::Day ? "day" : spec.unit == CapacitySpec::Unit::Week ? "week" : "month")
                    + " and needs the cohort's dates to know how many that is.";
    error.remedy = "name a date column with --period (in the window: Period (date) column when opening the file), or give the capacity as a share, e.g. 10%.";
    // The dates: each level once, then the rows' span and the periods that hold rows.
    std::vector<std::optional<DatedLevel>> levels;
    if (cohort.period) {
        const DateColumn& dates = *cohort.period;
        if (auto checked = checkPeriodDates(cohort, dates, dateFormat); !checked) {
            if (rate)
                return std::unexpected(checked.error());
            out.warnings.push_back("Capacity: no capacity per period, as the dates cannot be read (" + checked.error().problem + ")");
        } else {
            const DateFormat format = dateFormat.value_or(DateFormat::Iso);
            for (std::size_t k = 0; k < dates.levels.size(); ++k)
                levels.push_back(datedLevel(dates.levels[k], dates.written[k], format, unit));
        }
    }
    long firstDay = std::numeric_limits<long>::max(), lastDay = std::numeric_limits<long>::min();
    std::uint32_t firstLevel = 0, lastLevel = 0;
    if (!levels.empty()) {
        for (std::size_t i = 0; i < cohort.rows(); ++i) {
            const std::uint32_t code = cohort.period->codes[i];
            if (!levels[code]) {
                ++out.undated;
                continue;
            }
            if (levels[code]->day < firstDay) { firstDay = levels[code]->day; firstLevel = code; }
            if (levels[code]->day > lastDay) { lastDay = levels[code]->day; lastLevel = code; }
        }
    }
    const bool dated = firstDay <= lastDay;
    if (rate && !dated)
        return std::unexpected(error);
    if (dated) {
        out.firstDate = levels[firstLevel]->text;
        out.lastDate = levels[lastLevel]->text;
        out.spanDays = double(lastDay - firstDay + 1);
    }
    const double n = double(cohort.rows());
    const double overallCapacity = rate ? spec.amount * *out.spanDays / spec.unitDays() : spec.amount / 100.0 * n;
    const std::string unitName = spec.unit == CapacitySpec::Unit::Day ? "day" : spec.unit == CapacitySpec::Unit::Week ? "week" : "month";
    if (rate)
        out.definition = countText(spec.amount) + " patients per " + unitName + " over the " + countText(*out.spanDays) + " days from "
                         + *out.firstDate + " to " + *out.lastDate + " (first to last date, both counted"
                         + (spec.unit == CapacitySpec::Unit::Month ? "; a month is 365.25/12 days" : "") + ") make "
                         + countText(overallCapacity) + " patients, rounded down; a period's capacity is the rate times the days of "
                         "the period inside that span. Flagged means risk at or above the threshold, highest risk first.";
    else
        out.definition = countText(spec.amount) + "% of the " + countText(n) + " patients make " + countText(overallCapacity)
                         + ", rounded down; a period's capacity is that share of its own patients. Flagged means risk at or "
                           "above the threshold, highest risk first.";
    if (rate && out.undated > 0)
        out.warnings.push_back("Capacity: some patients have no usable date; they count "
                               "among the cohort's patients but in no period.");
    // Periods in time order ("2025-03" and "2025-Q1" both sort as text), with their days inside the span.
    std::vector<std::string> periodNames;
    std::vector<std::uint32_t> periodOfLevel(levels.size(), RowSubsets::none);
    if (dated) {
        for (const auto& level : levels)
            if (level)
                periodNames.push_back(level->period);
        std::sort(periodNames.begin(), periodNames.end());
        periodNames.erase(std::unique(periodNames.begin(), periodNames.end()), periodNames.end());
    }
    std::vector<double> periodDays(periodNames.size(), 0.0);
    for (std::size_t k = 0; k < levels.size(); ++k) {
        if (!levels[k])
            continue;
        const auto p = std::uint32_t(std::lower_bound(periodNames.begin(), periodNames.end(), levels[k]->period) - periodNames.begin());
        periodOfLevel[k] = p;
        periodDays[p] = double(std::min(levels[k]->periodLast, lastDay) - std::max(levels[k]->periodFirst, firstDay) + 1);
    }
    std::optional<RowSubsets> periods;
    if (dated)
        periods.emplace(cohort.period->codes, periodOfLevel, periodNames.size());
    for (std::size_t m = 0; m < cohort.models.size(); ++m) {
        const auto& risk = cohort.models[m].values;
        CapacityResult whole = atCapacity(risk, cohort.outcome, orders[m], overallCapacity, probabilities, confidence, binomialMethod);
        whole.model = cohort.models[m].name;
        if (whole.at.requested > cohort.rows())
            out.warnings.push_back("Capacity: " + out.text + " allows " + std::to_string(whole.at.requested) + " patients, more than the "
                                   + std::to_string(cohort.rows()) + " in the cohort; everybody is flagged.");
        if (!periods) {
            out.overall.push_back(std::move(whole));
            continue;
        }
        const std::vector<ScoreOrder> periodOrders = periods->orders(orders[m]);
        std::vector<double> p;
        std::vector<std::uint8_t> y;
        for (std::size_t k = 0; k < periods->size(); ++k) {
            const auto& rows = periods->rows(k);
            if (rows.empty())
                continue;
            p.clear();
            y.clear();
            for (std::uint32_t row : rows) {
                p.push_back(risk[row]);
                y.push_back(cohort.outcome[row]);
            }
            const double capacity = rate ? spec.amount * periodDays[k] / spec.unitDays() : spec.amount / 100.0 * double(rows.size());
            CapacityResult r = atCapacity(p, y, periodOrders[k], capacity, probabilities, confidence, binomialMethod);
            r.model = whole.model;
            r.period = periodNames[k];
            r.flaggedByOverallThreshold = whole.at.threshold ? flaggedAtOrAbove(p, periodOrders[k], *whole.at.threshold) : 0;
            r.overallThresholdOverflows = overflowsCapacity(*r.flaggedByOverallThreshold, r.at.requested);
            out.periods.push_back(std::move(r));
        }
        out.overall.push_back(std::move(whole));
    }
    // Warnings reach the report's summary, which shows no small counts: they name no count of
    // tied patients (the capacity section gives them under the small-cell rule).
    for (const auto& r : out.overall)
        if (r.at.tiesCrossCapacity())
            out.warnings.push_back("Capacity: model '" + r.model + "' has patients tied at the risk where the capacity " + out.text
                                   + " ends, so no threshold flags exactly the capacity; the threshold is the next risk up, which flags "
                                   "fewer (the capacity section says how many, and how many the next risk down would flag).");
    return out;
}

} // namespace plumbline
