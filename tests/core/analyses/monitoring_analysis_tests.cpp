#include "analyses/dated_sequence.hpp"
#include "analyses/monitoring_analysis.hpp"
#include "analyses/validation.hpp"
#include "metrics/bernoulli_cusum.hpp"
#include "resampling/random_stream.hpp"

#include <catch2/catch.hpp>

#include <algorithm>
#include <cmath>
#include <map>

using namespace plumbline;
using Catch::Matchers::WithinAbs;

namespace {

// A cohort built in memory: one model "risk", a period column of ISO dates (days after
// 2024-01-01) and, when given, a site column.
Cohort datedCohort(const std::vector<int>& dayOffsets, const std::vector<double>& risks, const std::vector<std::uint8_t>& outcomes,
                   const std::vector<std::string>& sites = {})
{
    Cohort cohort;
    cohort.outcome = outcomes;
    cohort.models.push_back({"risk", risks});
    DateColumn dates;
    dates.name = "discharge_date";
    std::map<std::string, std::uint32_t> seen;
    for (const int offset : dayOffsets) {
        const std::string text = offset < 0 ? std::string("(missing)") : isoDate(std::int64_t(19723) + offset); // 19723 = 2024-01-01
        auto [at, added] = seen.emplace(text, std::uint32_t(dates.levels.size()));
        if (added) {
            dates.levels.push_back(text);
            dates.written.push_back(readWrittenDate(text));
        }
        dates.codes.push_back(at->second);
    }
    cohort.period = dates;
    if (!sites.empty()) {
        CategoricalColumn column;
        column.name = "hospital";
        std::map<std::string, std::uint32_t> levels;
        for (const auto& site : sites) {
            auto [at, added] = levels.emplace(site, std::uint32_t(column.levels.size()));
            if (added)
                column.levels.push_back(site);
            column.codes.push_back(at->second);
        }
        cohort.cluster = column;
    }
    for (std::size_t i = 0; i < outcomes.size(); ++i)
        cohort.sourceLines.push_back(std::uint32_t(i + 2));
    return cohort;
}

double expit(double x) { return 1.0 / (1.0 + std::exp(-x)); }

// A simulated cohort over `days` days with `perDay` patients a day: risks from a logit-normal
// case mix (mean logit −1.7, sd 0.8), outcomes Bernoulli of the true risk, which from day
// `changeDay` on is the predicted one with its odds multiplied by `trueOdds`; from day
// `inflateDay` on the predicted logit is raised by `inflate` while outcomes keep the original risk.
struct Simulation {
    int days = 730, perDay = 3, changeDay = 1 << 30, inflateDay = 1 << 30;
    double trueOdds = 1.0, inflate = 0.0;
};

Cohort simulatedCohort(const Simulation& s, std::uint64_t seed)
{
    RandomStream random(seed, 99);
    std::vector<int> day;
    std::vector<double> predicted;
    std::vector<std::uint8_t> y;
    for (int d = 0; d < s.days; ++d)
        for (int k = 0; k < s.perDay; ++k) {
            const double base = -1.7 + 0.8 * random.normal();
            const double truth = expit(base + (d >= s.changeDay ? std::log(s.trueOdds) : 0.0));
            day.push_back(d);
            predicted.push_back(expit(base + (d >= s.inflateDay ? s.inflate : 0.0)));
            y.push_back(random.uniform() < truth ? 1 : 0);
        }
    return datedCohort(day, predicted, y);
}

} // namespace

TEST_CASE("Monitoring reads patients by date and within a day in source-line order, leaving undated rows out", "[monitoring]")
{
    // Rows: days 3, 1, 1, (missing), 0, 3 → order by day, then source line (row order here).
    Cohort cohort = datedCohort({3, 1, 1, -1, 0, 3}, {0.1, 0.2, 0.3, 0.4, 0.5, 0.6}, {0, 1, 0, 1, 0, 1});
    // Lines of a file read in another order (joined files): row 2 sits above row 1 in the file.
    cohort.sourceLines = {10, 21, 20, 30, 40, 9};
    const DatedSequence sequence = datedSequence(cohort, *cohort.period, DateFormat::Iso);
    CHECK(sequence.rows == std::vector<std::uint32_t>{4, 2, 1, 5, 0});
    CHECK(sequence.undated == 1);
    CHECK(isoDate(sequence.days.front()) == "2024-01-01");
    CHECK(isoDate(sequence.days.back()) == "2024-01-04");
    CHECK(isoDate(0) == "1970-01-01");
    CHECK(isoDate(19723 + 59) == "2024-02-29");
    // Day/month order is an analysis setting: 03/04/2025 is 3 April read day first.
    CHECK(dayNumber(readWrittenDate("03/04/2025"), DateFormat::DayFirst) == dayNumber(readWrittenDate("2025-04-03"), DateFormat::Iso));
    CHECK_FALSE(dayNumber(readWrittenDate("2025-02-30"), DateFormat::Iso));
}

TEST_CASE("Monitoring's charts are the recursions on the dated sequence, per site and overall", "[monitoring]")
{
    // 2 years, 2 sites: the overall scope's paths are the recursions over all dated patients in
    // order (Lovegrove et al. 1997; Steiner et al. 2000, written out here), a site's over its own.
    RandomStream random(5, 1);
    std::vector<int> day;
    std::vector<double> p;
    std::vector<std::uint8_t> y;
    std::vector<std::string> site;
    for (int d = 0; d < 730; ++d)
        for (int k = 0; k < 2; ++k) {
            day.push_back(d);
            p.push_back(0.05 + 0.3 * random.uniform());
            y.push_back(random.uniform() < p.back() ? 1 : 0);
            site.push_back(k == 0 ? "North" : random.uniform() < 0.5 ? "South" : "Tiny");
        }
    // "Tiny" keeps only 5 patients; the rest of its rows become South's.
    int tiny = 0;
    for (auto& s : site)
        if (s == "Tiny" && ++tiny > 5)
            s = "South";
    const Cohort cohort = datedCohort(day, p, y, site);
    MonitoringSettings settings;
    settings.simulatedRuns = 60;
    const MonitoringAnalysis m = analyseMonitoring(cohort, *cohort.period, DateFormat::Iso, PeriodUnit::Quarter, 0.95, 11, settings);
    REQUIRE(m.scopes.size() == 3); // overall, North, South; Tiny below the minimum cell
    CHECK(m.siteColumn == "hospital");
    CHECK(std::any_of(m.notes.begin(), m.notes.end(), [](const std::string& n) { return n.find("'Tiny'") != std::string::npos; }));
    const MonitoringScope& all = m.scopes[0];
    CHECK(all.site.empty());
    CHECK(all.patients == 1460);
    CHECK(all.firstDate == "2024-01-01");
    CHECK(all.lastDate == "2025-12-30");
    CHECK_THAT(all.patientsPerYear, WithinAbs(1460.0 / (730.0 / 365.25), 1e-9));
    double v = 0.0;
    for (std::size_t i = 0; i < p.size(); ++i)
        v += p[i] - y[i];
    CHECK_THAT(all.finalExpectedMinusObserved, WithinAbs(v, 1e-9));
    REQUIRE(all.charts.size() == 2);
    for (const CusumChart& chart : all.charts) {
        CHECK_THAT(chart.targetRunLength, WithinAbs(5.0 * all.patientsPerYear, 1e-6));
        CHECK(chart.limit.runs == 60);
        CHECK(chart.seed == settings.seed);
        // Steiner et al.'s recursion by hand at the chosen h; signals with their patient, date and site.
        double s = 0.0;
        std::size_t since = 0, k = 0;
        for (std::size_t i = 0; i < p.size(); ++i) {
            s = std::max(0.0, s + y[i] * std::log(chart.oddsRatio) - std::log(1.0 - p[i] + chart.oddsRatio * p[i]));
            ++since;
            if (s >= chart.limit.limit) {
                REQUIRE(k < chart.signalList.size());
                CHECK(chart.signalList[k].patient == i + 1);
                CHECK(chart.signalList[k].patientsSinceReset == since);
                CHECK(chart.signalList[k].date == isoDate(19723 + day[i]));
                CHECK(chart.signalList[k].site == site[i]);
                ++k;
                s = 0.0;
                since = 0;
            }
        }
        CHECK(k == chart.signalList.size());
    }
    CHECK(all.charts[0].direction == CusumDirection::Worse);
    CHECK(all.charts[0].oddsRatio == 2.0);
    CHECK(all.charts[1].oddsRatio == 0.5);
    // Quarters: 8 of them, the first four the first year; the latest year the last four.
    CHECK(all.periods.size() == 8);
    CHECK(all.periods.front().period == "2024-Q1");
    CHECK(all.firstYearPeriods.size() == 4);
    CHECK(all.latestYearPeriods.size() == 4);
    CHECK(all.periods[0].values.n == 2 * 91);
    REQUIRE(all.codingShift);
    CHECK_FALSE(all.codingShift->flagged);
    // A site's scope is its own subsequence.
    const MonitoringScope& north = m.scopes[1];
    CHECK(north.site == "North");
    CHECK(north.patients == 730);
    double vn = 0.0;
    for (std::size_t i = 0; i < p.size(); i += 2)
        vn += p[i] - y[i];
    CHECK_THAT(north.finalExpectedMinusObserved, WithinAbs(vn, 1e-9));
    for (const auto& signal : north.charts[0].signalList)
        CHECK(signal.site == "North");
}

TEST_CASE("Monitoring needs risks: a points score gets a note and no charts", "[monitoring]")
{
    Cohort cohort = datedCohort({0, 1, 2}, {3.0, 5.0, 7.0}, {0, 1, 0});
    cohort.scale = ScoreScale::Points;
    const MonitoringAnalysis m = analyseMonitoring(cohort, *cohort.period, DateFormat::Iso, PeriodUnit::Month, 0.95, 11, {});
    CHECK(m.scopes.empty());
    REQUIRE(m.notes.size() == 1);
    CHECK(m.notes[0].find("needs risks") != std::string::npos);
}

TEST_CASE("A deterioration of odds ratio 2 from a date is signalled after it and not before it in most of 200 series", "[monitoring]")
{
    // Two years of 3 patients a day; from the start of the second year outcomes follow the
    // predicted odds times 2. The worse chart's limit is chosen by the analysis itself (in-control
    // ARL of 5 years' volume, 50 runs to keep the test short). Expected share: about
    // exp(−1095/5475) ≈ 0.82 without a false signal in the first year, times nearly sure detection
    // in the second (measured with seeds 1000-1199: 162 of 200, 0.81; a false signal before the change in 38).
    Simulation s;
    s.changeDay = 365;
    s.trueOdds = 2.0;
    MonitoringSettings settings;
    settings.simulatedRuns = 50;
    int detectedOnlyAfter = 0, falseBefore = 0;
    for (std::uint64_t series = 0; series < 200; ++series) {
        const Cohort cohort = simulatedCohort(s, 1000 + series);
        settings.seed = 500 + series;
        const MonitoringAnalysis m = analyseMonitoring(cohort, *cohort.period, DateFormat::Iso, PeriodUnit::Month, 0.95, 11, settings);
        const auto& signals = m.scopes.at(0).charts.at(0).signalList;
        const bool before = std::any_of(signals.begin(), signals.end(), [](const CusumSignal& x) { return x.date < "2024-12-31"; });
        const bool after = std::any_of(signals.begin(), signals.end(), [](const CusumSignal& x) { return x.date >= "2024-12-31"; });
        falseBefore += before ? 1 : 0;
        detectedOnlyAfter += after && !before ? 1 : 0;
    }
    INFO("signalled only after the change in " << detectedOnlyAfter << " of 200; a false signal before it in " << falseBefore);
    CHECK(detectedOnlyAfter >= 150);
    CHECK(falseBefore <= 50);
}

TEST_CASE("The coding-shift question is asked when predicted risk is inflated in year two, not on a drift-free cohort", "[monitoring]")
{
    MonitoringSettings settings;
    settings.simulatedRuns = 50;
    // Drift-free: ten simulated cohorts, none flagged.
    for (std::uint64_t seed = 1; seed <= 10; ++seed) {
        const Cohort cohort = simulatedCohort(Simulation{}, seed);
        const MonitoringAnalysis m = analyseMonitoring(cohort, *cohort.period, DateFormat::Iso, PeriodUnit::Month, 0.95, 11, settings);
        REQUIRE(m.scopes.at(0).codingShift);
        CHECK_FALSE(m.scopes[0].codingShift->flagged);
        CHECK(m.scopes[0].question.empty());
        CHECK(*m.scopes[0].latestYearPsi < 0.1);
    }
    // Year two's predicted logits raised by 0.5 with outcomes unchanged (scores coded more
    // intensively): flagged, worded as a question, and the score distribution shifted.
    Simulation inflated;
    inflated.inflateDay = 366; // 2024 is a leap year: day 366 is 2025-01-01
    inflated.inflate = 0.5;
    for (std::uint64_t seed = 1; seed <= 10; ++seed) {
        const Cohort cohort = simulatedCohort(inflated, seed);
        const MonitoringAnalysis m = analyseMonitoring(cohort, *cohort.period, DateFormat::Iso, PeriodUnit::Month, 0.95, 11, settings);
        const MonitoringScope& all = m.scopes.at(0);
        REQUIRE(all.codingShift);
        CHECK(all.codingShift->flagged);
        CHECK(all.codingShift->predictedRatio > 1.2);
        CHECK_FALSE(all.codingShift->observedRose);
        CHECK(all.question == "Predicted risk rose while the observed rate did not (PSI measures the spread of the scores, not their level): "
                              "has coding or documentation changed?");
        CHECK(*all.latestYearPsi > 0.1);
        // Months of ~90 patients are noisy (a same-distribution month gives about 9/90): compared as averages.
        double firstYear = 0.0, secondYear = 0.0;
        for (const auto& row : all.periods)
            (row.firstYear ? firstYear : secondYear) += row.psi / 12.0;
        CHECK(secondYear > firstYear + 0.1);
    }
    // A truly sicker population (risks and outcomes both up) is not flagged.
    Simulation sicker;
    sicker.inflateDay = 366;
    sicker.inflate = 0.5;
    sicker.changeDay = 366;
    sicker.trueOdds = std::exp(0.5);
    const Cohort cohort = simulatedCohort(sicker, 3);
    const MonitoringAnalysis m = analyseMonitoring(cohort, *cohort.period, DateFormat::Iso, PeriodUnit::Month, 0.95, 11, settings);
    CHECK(m.scopes.at(0).codingShift->predictedRose);
    CHECK(m.scopes[0].codingShift->observedRose);
    CHECK_FALSE(m.scopes[0].codingShift->flagged);
}

TEST_CASE("runValidation fills the monitoring from the period column, with the settings' seed", "[monitoring]")
{
    const Cohort cohort = simulatedCohort(Simulation{}, 4);
    PanelSettings settings;
    settings.monitoring.simulatedRuns = 50;
    settings.monitoring.seed = 77;
    const ValidationResult result = runValidation(cohort, settings);
    REQUIRE(result.monitoring);
    REQUIRE(result.monitoring->scopes.size() == 1);
    CHECK(result.monitoring->scopes[0].charts[0].seed == 77);
    CHECK(result.monitoring->scopes[0].charts[0].limit.reached);
    Cohort undated = cohort;
    undated.period.reset();
    CHECK_FALSE(runValidation(undated, settings).monitoring);
}

TEST_CASE("runValidation puts monitoring's findings in the run's warnings: a worse signal and the coding-shift question", "[monitoring]")
{
    // Deterioration (odds ×2) from the second year: the worse chart signals, and the summary says so.
    Simulation worse;
    worse.changeDay = 365;
    worse.trueOdds = 2.0;
    PanelSettings settings;
    settings.monitoring.simulatedRuns = 50;
    const ValidationResult result = runValidation(simulatedCohort(worse, 5), settings);
    REQUIRE(result.monitoring);
    const auto& signals = result.monitoring->scopes.at(0).charts.at(0).signalList;
    REQUIRE_FALSE(signals.empty());
    const std::string expected = "Monitoring: risk overall (all patients): the CUSUM for worse outcomes than predicted signalled on "
                                 + signals.front().date + " (";
    CHECK(std::any_of(result.warnings.begin(), result.warnings.end(), [&](const std::string& w) { return w.starts_with(expected); }));
    // Scores inflated in year two: the question appears among the warnings with its numbers.
    Simulation inflated;
    inflated.inflateDay = 366;
    inflated.inflate = 0.5;
    const ValidationResult coded = runValidation(simulatedCohort(inflated, 1), settings);
    CHECK(std::any_of(coded.warnings.begin(), coded.warnings.end(), [](const std::string& w) {
        return w.find("has coding or documentation changed?") != std::string::npos && w.find("Mean predicted risk 0.") != std::string::npos;
    }));
}
