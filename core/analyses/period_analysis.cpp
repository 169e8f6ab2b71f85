#include "analyses/period_analysis.hpp"

#include "analyses/dated_sequence.hpp"
#include "analyses/row_subsets.hpp"
#include "analyses/two_threads.hpp"

#include "intake/written_date.hpp"
#include "metrics/calibration_summary.hpp"
#include "metrics/discrimination.hpp"
#include "metrics/logistic_recalibration.hpp"
#include "metrics/distributions.hpp"

#include <algorithm>
#include <cstdio>
#include <optional>
#include <stdexcept>

namespace plumbline {

namespace {

// One model's part of the analysis over time, gathered apart and merged in model order.
struct ModelPeriods {
    std::optional<PeriodReference> firstYear, latestYear;
    std::vector<PeriodResult> results;
    std::optional<std::string> warning;
};

struct YearMonth {
    int year = 0;
    int month = 0;
};

// The year and month of a date read at intake, in the given format; nullopt when it is not
// written that way or is not a real date (2025-02-30).
std::optional<YearMonth> yearMonth(const WrittenDate& date, DateFormat format)
{
    const auto civil = civilDate(date, format);
    if (!civil)
        return std::nullopt;
    return YearMonth{civil->year, civil->month};
}

std::string periodText(int year, int month, PeriodUnit unit)
{
    char buffer[32]; // room for any int: the compiler cannot see that years stay in 1800-2200
    if (unit == PeriodUnit::Month)
        std::snprintf(buffer, sizeof buffer, "%04d-%02d", year, month);
    else
        std::snprintf(buffer, sizeof buffer, "%04d-Q%d", year, (month - 1) / 3 + 1);
    return buffer;
}

int monthIndex(int year, int month)
{
    return year * 12 + month - 1;
}

} // namespace

std::optional<std::string> periodOf(std::string_view date, DateFormat format, PeriodUnit unit)
{
    const auto read = yearMonth(readWrittenDate(date), format);
    if (!read)
        return std::nullopt;
    return periodText(read->year, read->month, unit);
}

std::expected<void, InputError> checkPeriodDates(const Cohort& cohort, const DateColumn& dates, std::optional<DateFormat> format)
{
    auto checked = analysePeriods(cohort, dates, format, PeriodUnit::Month, 0.95, true);
    if (!checked)
        return std::unexpected(checked.error());
    return {};
}

std::expected<PeriodAnalysis, InputError> analysePeriods(const Cohort& cohort, const DateColumn& dates,
                                                         std::optional<DateFormat> format, PeriodUnit unit, double confidence,
                                                         bool datesOnly, const std::vector<ScoreOrder>* orders)
{
    if (dates.written.size() != dates.levels.size())
        throw std::logic_error("the dates of column '" + dates.name + "' were not read at intake");
    InputError error;
    error.column = dates.name;
    // Without a stated format, ISO dates are read; day/month/year-style dates are refused because
    // 03/04/2025 is 3 April in one convention and March 4 in the other.
    if (!format) {
        for (std::uint32_t code = 0; code < dates.levels.size(); ++code) {
            if (dates.written[code].shape == WrittenDate::Shape::Slashed) {
                error.value = dates.levels[code];
                // The first row carrying this date, so that the user can find it in the file.
                const auto row = std::find(dates.codes.begin(), dates.codes.end(), code);
                if (row != dates.codes.end() && std::size_t(row - dates.codes.begin()) < cohort.sourceLines.size())
                    error.line = cohort.sourceLines[std::size_t(row - dates.codes.begin())];
                error.problem = "dates written like this are ambiguous: day/month/year and month/day/year read it differently.";
                error.remedy = "say which: Settings → Dates written as in the window, or --date-format dmy (DD/MM/YYYY) or mdy (MM/DD/YYYY) on the command line.";
                return std::unexpected(error);
            }
        }
        format = DateFormat::Iso;
    }
    // Each level (a distinct date text) once: its period, and its month for the first year.
    std::vector<std::optional<std::string>> levelPeriod(dates.levels.size());
    std::vector<int> levelMonth(dates.levels.size(), -1);
    std::string firstUnparsed;
    for (std::size_t k = 0; k < dates.levels.size(); ++k) {
        if (const auto read = yearMonth(dates.written[k], *format)) {
            levelMonth[k] = monthIndex(read->year, read->month);
            levelPeriod[k] = periodText(read->year, read->month, unit);
        } else if (firstUnparsed.empty() && dates.levels[k] != "(missing)") {
            firstUnparsed = dates.levels[k];
        }
    }
    PeriodAnalysis out;
    out.unit = unit;
    int firstMonth = INT32_MAX;
    for (std::size_t i = 0; i < cohort.rows(); ++i) {
        const int m = levelMonth[dates.codes[i]];
        if (m < 0)
            ++out.undated;
        else
            firstMonth = std::min(firstMonth, m);
    }
    if (out.undated == cohort.rows()) {
        error.value = firstUnparsed;
        error.problem = "no value of the period column reads as a date.";
        error.remedy = "give dates as YYYY-MM-DD, or name the format (Settings → Dates written as, or --date-format dmy or mdy).";
        return std::unexpected(error);
    }
    if (datesOnly)
        return out;
    if (out.undated > 0)
        out.warnings.push_back(std::to_string(out.undated) + " rows have no usable date in '" + dates.name + "'"
                               + (firstUnparsed.empty() ? "" : " (first such value: '" + firstUnparsed + "')") + "; they are left out of the periods.");
    int lastMonth = firstMonth;
    for (std::size_t i = 0; i < cohort.rows(); ++i)
        lastMonth = std::max(lastMonth, levelMonth[dates.codes[i]]);
    const int latestFrom = std::max(firstMonth + 12, lastMonth - 11);
    // Rows by period, in time order ("2025-03" and "2025-Q1" both sort as text), and by year:
    // the first (subset 0) and the latest (subset 1).
    std::vector<std::string> periodNames;
    for (const auto& period : levelPeriod)
        if (period)
            periodNames.push_back(*period);
    std::sort(periodNames.begin(), periodNames.end());
    periodNames.erase(std::unique(periodNames.begin(), periodNames.end()), periodNames.end());
    std::vector<std::uint32_t> periodOfLevel(dates.levels.size(), RowSubsets::none), yearOfLevel(dates.levels.size(), RowSubsets::none);
    for (std::size_t k = 0; k < dates.levels.size(); ++k) {
        if (levelMonth[k] < 0)
            continue;
        periodOfLevel[k] = std::uint32_t(std::lower_bound(periodNames.begin(), periodNames.end(), *levelPeriod[k]) - periodNames.begin());
        if (levelMonth[k] < firstMonth + 12)
            yearOfLevel[k] = 0;
        else if (levelMonth[k] >= latestFrom)
            yearOfLevel[k] = 1;
    }
    const RowSubsets periods(dates.codes, periodOfLevel, periodNames.size());
    const RowSubsets years(dates.codes, yearOfLevel, 2);
    std::vector<std::size_t> periodsWithRows;
    for (std::size_t k = 0; k < periods.size(); ++k)
        if (!periods.rows(k).empty())
            periodsWithRows.push_back(k);
    const double z = zForConfidence(confidence);
    auto analyseModel = [&](std::size_t m, ModelPeriods& mine) {
        auto subset = [&](const std::vector<std::uint32_t>& index, std::vector<std::uint8_t>& y, std::vector<double>& p) {
            y.clear();
            p.clear();
            for (std::size_t i : index) {
                y.push_back(cohort.outcome[i]);
                p.push_back(cohort.models[m].values[i]);
            }
        };
        auto citl = [&](const std::vector<std::uint8_t>& y, const std::vector<double>& p) {
            std::vector<std::uint8_t> weights(p.size());
            for (std::size_t i = 0; i < p.size(); ++i)
                weights[i] = contradictsOutcome(p[i], y[i] != 0) ? 0 : 1;
            const auto fit = fitCalibrationIntercept(y, clampedLogits(p), weights, false);
            return fit ? Estimate{fit->alpha, fit->se, fit->alpha - z * fit->se, fit->alpha + z * fit->se, CiMethod::Wald}
                       : Estimate::undefined();
        };
        // Each subset's order is read off the model's order over the cohort (sorted here once
        // when the caller has none), and freed once its C statistic is computed.
        const ScoreOrder ownOrder = orders ? ScoreOrder{} : ascendingOrder(cohort.models[m].values);
        const ScoreOrder& order = orders ? (*orders)[m] : ownOrder;
        auto c = [&](const std::vector<std::uint8_t>& y, const std::vector<double>& p, ScoreOrder& subsetOrder) {
            const Estimate estimate = cStatistic(y, p, subsetOrder, CStatisticScale::Logit, confidence);
            ScoreOrder().swap(subsetOrder);
            return estimate;
        };
        std::vector<ScoreOrder> yearOrders = years.orders(order);
        std::vector<std::uint8_t> y;
        std::vector<double> p;
        subset(years.rows(0), y, p);
        const Estimate referenceOe = observedExpectedRatio(y, p, confidence);
        const Estimate referenceCitl = citl(y, p);
        mine.firstYear = PeriodReference({cohort.models[m].name, c(y, p, yearOrders[0]), referenceOe, referenceCitl});
        if (!years.rows(1).empty()) {
            subset(years.rows(1), y, p);
            const Estimate latestC = c(y, p, yearOrders[1]);
            mine.latestYear = PeriodReference({cohort.models[m].name, latestC, observedExpectedRatio(y, p, confidence), citl(y, p)});
        }
        std::vector<ScoreOrder> periodOrders = periods.orders(order);
        for (const std::size_t k : periodsWithRows) {
            const auto& index = periods.rows(k);
            subset(index, y, p);
            PeriodResult r;
            r.period = periodNames[k];
            r.model = cohort.models[m].name;
            r.n = index.size();
            r.events = std::size_t(std::count(y.begin(), y.end(), std::uint8_t{1}));
            r.c = c(y, p, periodOrders[k]);
            r.oe = observedExpectedRatio(y, p, confidence);
            r.calibrationIntercept = citl(y, p);
            const bool inFirstYear = levelMonth[dates.codes[index.front()]] < firstMonth + 12;
            // A period counts as outside only when its own interval and the first year's do not
            // overlap: a month of ~1000 patients is noisy, and comparing its point estimate with
            // the pooled year's narrow interval would flag a well-calibrated model by chance.
            auto outside = [](const Estimate& e, const Estimate& reference) {
                return e.lower && e.upper && reference.lower && reference.upper
                       && (*e.upper < *reference.lower || *e.lower > *reference.upper);
            };
            r.outsideFirstYear = !inFirstYear && (outside(r.oe, referenceOe) || outside(r.calibrationIntercept, referenceCitl));
            mine.results.push_back(std::move(r));
        }
        // A warning when the most recent periods have left the first year's range.
        const std::size_t count = periodsWithRows.size();
        std::size_t recentOutside = 0;
        for (std::size_t k = mine.results.size() - std::min<std::size_t>(2, count); k < mine.results.size(); ++k)
            recentOutside += mine.results[k].outsideFirstYear ? 1 : 0;
        if (recentOutside > 0)
            mine.warning = std::string("Model '" + cohort.models[m].name + "': calibration in the most recent period"
                                   + (recentOutside > 1 ? "s lies" : " lies") + " outside the first year's interval: the model may be drifting.");
    };
    // The models' analyses are independent: one per thread, two threads, each writing only its
    // own slot; merged in model order, so the result does not depend on the threads.
    std::vector<ModelPeriods> perModel(cohort.models.size());
    onTwoThreads(cohort.models.size(), [&](std::size_t m) { analyseModel(m, perModel[m]); });
    for (ModelPeriods& mine : perModel) {
        out.firstYear.push_back(std::move(*mine.firstYear));
        if (mine.latestYear)
            out.latestYear.push_back(std::move(*mine.latestYear));
        out.results.insert(out.results.end(), std::make_move_iterator(mine.results.begin()),
                           std::make_move_iterator(mine.results.end()));
        if (mine.warning)
            out.warnings.push_back(std::move(*mine.warning));
    }
    for (const std::size_t k : periodsWithRows) {
        const auto& index = periods.rows(k);
        if (levelMonth[dates.codes[index.front()]] < firstMonth + 12)
            out.firstYearPeriods.push_back(periodNames[k]);
        else if (levelMonth[dates.codes[index.front()]] >= latestFrom)
            out.latestYearPeriods.push_back(periodNames[k]);
    }
    out.note = "Drift has usual causes: a change in case mix (who is admitted and discharged), changes in care (a new "
               "programme that lowers readmissions), and changes in coding - risk scores built on diagnosis codes rise when "
               "coding becomes more intensive, without any change in the patients.";
    return out;
}

} // namespace plumbline
