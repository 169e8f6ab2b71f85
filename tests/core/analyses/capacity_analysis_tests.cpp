#include "analyses/capacity_analysis.hpp"
#include "analyses/validation.hpp"

#include "resampling/random_stream.hpp"

#include <catch2/catch.hpp>

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <functional>
#include <map>
#include <optional>
#include <vector>

using namespace plumbline;
using Catch::Matchers::WithinAbs;

namespace {

// A cohort of `rows` patients with dates from 2025-01-10 to 2025-03-20 and, when `tied`, risks on
// a grid of 15 values (many ties), otherwise continuous ones. Outcomes drawn from the risks.
Cohort datedCohort(std::size_t rows, bool tied, std::uint64_t seed)
{
    RandomStream random(seed);
    Cohort cohort;
    cohort.models.push_back({"score", {}});
    DateColumn dates;
    dates.name = "discharge_date";
    // Every day of the span is a level (so the span is fixed whatever is drawn).
    char text[16];
    for (int m = 1; m <= 3; ++m)
        for (int d = 1; d <= 31; ++d) {
            if ((m == 1 && d < 10) || (m == 2 && d > 28) || (m == 3 && d > 20))
                continue;
            std::snprintf(text, sizeof text, "2025-%02d-%02d", m, d);
            dates.levels.push_back(text);
            dates.written.push_back(readWrittenDate(text));
        }
    for (std::size_t i = 0; i < rows; ++i) {
        const double p = tied ? double(1 + random.below(15)) / 20.0 : 0.02 + 0.9 * random.uniform();
        cohort.models[0].values.push_back(p);
        cohort.outcome.push_back(random.uniform() < p ? 1 : 0);
        cohort.sourceLines.push_back(std::uint32_t(i + 2));
        // The first and last days always hold a patient.
        const auto code = i == 0 ? 0u : i == 1 ? std::uint32_t(dates.levels.size() - 1) : std::uint32_t(random.below(dates.levels.size()));
        dates.codes.push_back(code);
    }
    cohort.period = dates;
    return cohort;
}

struct DirectCount {
    std::size_t n = 0, events = 0, flagged = 0, tp = 0, fp = 0, tn = 0, fn = 0;
};

// The confusion matrix at threshold t over the rows whose date starts with `prefix` (all when
// empty), counted row by row.
DirectCount countDirectly(const Cohort& cohort, double t, const std::string& prefix = {})
{
    DirectCount c;
    for (std::size_t i = 0; i < cohort.rows(); ++i) {
        if (!prefix.empty() && !cohort.period->levels[cohort.period->codes[i]].starts_with(prefix))
            continue;
        const bool flagged = cohort.models[0].values[i] >= t, event = cohort.outcome[i] == 1;
        ++c.n;
        c.events += event;
        c.flagged += flagged;
        c.tp += flagged && event;
        c.fp += flagged && !event;
        c.tn += !flagged && !event;
        c.fn += !flagged && event;
    }
    return c;
}

// The k-th highest risk among the rows of `prefix`.
double kthHighest(const Cohort& cohort, std::size_t k, const std::string& prefix = {})
{
    std::vector<double> risks;
    for (std::size_t i = 0; i < cohort.rows(); ++i)
        if (prefix.empty() || cohort.period->levels[cohort.period->codes[i]].starts_with(prefix))
            risks.push_back(cohort.models[0].values[i]);
    std::sort(risks.begin(), risks.end(), std::greater<>());
    return risks[k - 1];
}

// The threshold that flags at most k of the rows of `prefix`, by hand: the k-th highest risk, or,
// when patients share it beyond the k-th, the lowest risk above it (nullopt when there is none).
std::optional<double> ceilingThreshold(const Cohort& cohort, std::size_t k, const std::string& prefix = {})
{
    std::vector<double> risks;
    for (std::size_t i = 0; i < cohort.rows(); ++i)
        if (prefix.empty() || cohort.period->levels[cohort.period->codes[i]].starts_with(prefix))
            risks.push_back(cohort.models[0].values[i]);
    std::sort(risks.begin(), risks.end(), std::greater<>());
    const double kth = risks[k - 1];
    if (k == risks.size() || risks[k] != kth)
        return kth;
    std::optional<double> above;
    for (double r : risks)
        if (r > kth)
            above = r; // descending: the last one above is the lowest
    return above;
}

// Wilson's score interval written out (Wilson 1927, JASA 22:209); z for 95 % is
// scipy.stats.norm.ppf(0.975) = 1.959963984540054 (scipy 1.10).
std::pair<double, double> wilson(double x, double n)
{
    const double z = 1.959963984540054, p = x / n;
    const double centre = (p + z * z / (2 * n)) / (1 + z * z / n);
    const double half = z * std::sqrt(p * (1 - p) / n + z * z / (4 * n * n)) / (1 + z * z / n);
    return {centre - half, centre + half};
}

CapacityAnalysis analyse(const Cohort& cohort, const std::string& text)
{
    const auto spec = parseCapacity(text, "--capacity");
    REQUIRE(spec);
    const std::vector<ScoreOrder> orders{ascendingOrder(cohort.models[0].values)};
    auto result = analyseCapacity(cohort, *spec, orders, 0.95, CiMethod::Wilson, std::nullopt, PeriodUnit::Month);
    REQUIRE(result);
    return *result;
}

} // namespace

TEST_CASE("A share capacity flags that share of the patients and its metrics match a direct count", "[capacity]")
{
    const Cohort cohort = datedCohort(1000, false, 5);
    const CapacityAnalysis a = analyse(cohort, "10%");
    REQUIRE(a.overall.size() == 1);
    const CapacityResult& r = a.overall[0];
    CHECK(r.at.requested == 100); // 10 % of 1000, rounded down
    REQUIRE(r.at.threshold);
    CHECK(*r.at.threshold == kthHighest(cohort, 100));
    const DirectCount d = countDirectly(cohort, *r.at.threshold);
    CHECK(d.flagged == 100); // continuous risks: exactly the capacity
    CHECK(r.at.exact());
    CHECK(r.tp == d.tp);
    CHECK(r.fp == d.fp);
    CHECK(r.tn == d.tn);
    CHECK(r.fn == d.fn);
    CHECK_THAT(*r.sensitivity.value, WithinAbs(double(d.tp) / double(d.tp + d.fn), 1e-15));
    CHECK_THAT(*r.specificity.value, WithinAbs(double(d.tn) / double(d.tn + d.fp), 1e-15));
    CHECK_THAT(*r.ppv.value, WithinAbs(double(d.tp) / 100.0, 1e-15));
    CHECK_THAT(*r.eventsPer100Flagged, WithinAbs(100.0 * double(d.tp) / 100.0, 1e-12));
    // Net benefit = TP/N − FP/N · t/(1 − t) (Vickers & Elkin 2006, Med Decis Making 26:565).
    const double t = *r.at.threshold, n = double(d.n);
    CHECK_THAT(*r.netBenefit, WithinAbs(double(d.tp) / n - double(d.fp) / n * t / (1 - t), 1e-15));
    // The intervals are the panel's Wilson intervals, written out above.
    const auto [sensLow, sensHigh] = wilson(double(d.tp), double(d.tp + d.fn));
    CHECK_THAT(r.sensitivity.ci->lower, WithinAbs(sensLow, 1e-12));
    CHECK_THAT(r.sensitivity.ci->upper, WithinAbs(sensHigh, 1e-12));
    const auto [ppvLow, ppvHigh] = wilson(double(d.tp), 100.0);
    CHECK_THAT(r.ppv.ci->lower, WithinAbs(ppvLow, 1e-12));
    CHECK_THAT(r.ppv.ci->upper, WithinAbs(ppvHigh, 1e-12));
}

TEST_CASE("A share capacity on tied risks flags at most the capacity and reports the tie below", "[capacity]")
{
    const Cohort cohort = datedCohort(1000, true, 6);
    const CapacityAnalysis a = analyse(cohort, "12.5%");
    const CapacityResult& r = a.overall[0];
    CHECK(r.at.requested == 125);
    const double kth = kthHighest(cohort, 125);
    const DirectCount atKth = countDirectly(cohort, kth);
    // With fifteen risk values among 1000 patients the 125th sits inside a tie (seed 6).
    REQUIRE(atKth.flagged != 125);
    const auto t = ceilingThreshold(cohort, 125);
    REQUIRE(t);
    REQUIRE(r.at.threshold);
    CHECK(*r.at.threshold == *t);
    const DirectCount d = countDirectly(cohort, *t);
    CHECK(r.at.flagged == d.flagged);
    CHECK(r.at.flagged < 125); // a capacity is a ceiling
    const std::size_t tiedBelow = std::size_t(std::count(cohort.models[0].values.begin(), cohort.models[0].values.end(), kth));
    CHECK(*r.at.nextRiskDown == kth);
    CHECK(r.at.tiedAtNextRiskDown == tiedBelow);
    CHECK(r.at.flaggedAtNextRiskDown == atKth.flagged);
    CHECK(r.tp == d.tp);
    CHECK(r.fp == d.fp);
    CHECK(!r.at.exact());
    // The warning reaches the report's summary: it names no count of tied patients.
    bool said = false;
    for (const auto& w : a.warnings) {
        said = said || w.find("tied at the risk where the capacity") != std::string::npos;
        CHECK(w.find(std::to_string(tiedBelow)) == std::string::npos);
        CHECK(w.find(std::to_string(atKth.flagged)) == std::string::npos);
    }
    CHECK(said);
}

TEST_CASE("A rate capacity is the rate times the span of the dates and each month gets its own", "[capacity]")
{
    for (const bool tied : {false, true}) {
        const Cohort cohort = datedCohort(2000, tied, 7);
        const CapacityAnalysis a = analyse(cohort, "40/week");
        // 2025-01-10 to 2025-03-20, both counted: 22 + 28 + 20 = 70 days = 10 weeks → 400 patients.
        REQUIRE(a.spanDays);
        CHECK(*a.spanDays == 70.0);
        CHECK(*a.firstDate == "2025-01-10");
        CHECK(*a.lastDate == "2025-03-20");
        const CapacityResult& r = a.overall[0];
        CHECK(r.at.requested == 400);
        CHECK(*r.at.threshold == *ceilingThreshold(cohort, 400));
        CHECK(r.at.flagged == countDirectly(cohort, *r.at.threshold).flagged);
        if (!tied)
            CHECK(r.at.flagged == 400);
        // Each month: 40 per week over its days inside the span (22, 28 and 20 days).
        const std::map<std::string, double> days{{"2025-01", 22.0}, {"2025-02", 28.0}, {"2025-03", 20.0}};
        REQUIRE(a.periods.size() == 3);
        for (const CapacityResult& p : a.periods) {
            const double capacity = 40.0 * days.at(p.period) / 7.0;
            CHECK_THAT(p.capacity, WithinAbs(capacity, 1e-9));
            CHECK(p.at.requested == std::size_t(std::floor(capacity)));
            const double t = *ceilingThreshold(cohort, p.at.requested, p.period);
            CHECK(*p.at.threshold == t);
            const DirectCount d = countDirectly(cohort, t, p.period);
            CHECK(p.patients == d.n);
            CHECK(p.at.flagged == d.flagged);
            CHECK(p.tp == d.tp);
            CHECK(p.fn == d.fn);
            if (!tied)
                CHECK(p.at.flagged == p.at.requested);
            else
                CHECK(p.at.exact() == (d.flagged == p.at.requested));
            // The whole cohort's threshold applied to this month, counted directly.
            const std::size_t byOverall = countDirectly(cohort, *r.at.threshold, p.period).flagged;
            CHECK(*p.flaggedByOverallThreshold == byOverall);
            CHECK(p.at.flagged <= p.at.requested);
            // Over capacity only beyond the stated 10 % margin (common practice), not one patient over.
            CHECK(p.overallThresholdOverflows == (double(byOverall) > 1.1 * double(p.at.requested)));
        }
    }
}

TEST_CASE("A share capacity per month is that share of the month's patients", "[capacity]")
{
    const Cohort cohort = datedCohort(1500, true, 8);
    const CapacityAnalysis a = analyse(cohort, "20%");
    REQUIRE(a.periods.size() == 3);
    for (const CapacityResult& p : a.periods) {
        const DirectCount all = countDirectly(cohort, -1.0, p.period);
        CHECK(p.patients == all.n);
        CHECK(p.at.requested == std::size_t(std::floor(0.2 * double(all.n) + 1e-9)));
        const double t = *ceilingThreshold(cohort, p.at.requested, p.period);
        CHECK(p.at.flagged == countDirectly(cohort, t, p.period).flagged);
        CHECK(p.at.flagged <= p.at.requested);
    }
}

TEST_CASE("A month is over capacity only when the whole-cohort threshold exceeds it by more than the margin", "[capacity]")
{
    // The stated margin is 10 % (common practice, docs/methods.md §21c): one patient over is no overflow.
    CHECK(overCapacityMargin == 0.10);
    CHECK_FALSE(overflowsCapacity(101, 100));
    CHECK_FALSE(overflowsCapacity(110, 100));
    CHECK(overflowsCapacity(111, 100));
    CHECK_FALSE(overflowsCapacity(2, 2));
    CHECK(overflowsCapacity(3, 2));
    CHECK(overflowsCapacity(1, 0));
}

TEST_CASE("A rate capacity without dates is refused and runValidation says why", "[capacity]")
{
    Cohort cohort = datedCohort(200, false, 9);
    cohort.period.reset();
    const auto spec = parseCapacity("40/week", "--capacity");
    const std::vector<ScoreOrder> orders{ascendingOrder(cohort.models[0].values)};
    const auto refused = analyseCapacity(cohort, *spec, orders, 0.95, CiMethod::Wilson, std::nullopt, PeriodUnit::Month);
    REQUIRE(!refused);
    CHECK(refused.error().message().find("--period") != std::string::npos);
    PanelSettings settings;
    settings.capacity = *spec;
    const ValidationResult result = runValidation(cohort, settings);
    CHECK(!result.capacity);
    CHECK(std::any_of(result.warnings.begin(), result.warnings.end(),
                      [](const std::string& w) { return w.starts_with("No capacity threshold"); }));
    settings.capacity = *parseCapacity("5%", "--capacity");
    const ValidationResult shared = runValidation(cohort, settings);
    REQUIRE(shared.capacity);
    CHECK(shared.capacity->overall[0].at.requested == 10);
    CHECK(shared.capacity->periods.empty());
}
