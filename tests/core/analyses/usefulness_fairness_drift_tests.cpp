#include "reporting/decision_summary.hpp"
#include "support/check_datasets.hpp"
#include "files/cohort_simulator.hpp"
#include "analyses/decision_curve.hpp"
#include "support/intake_test_support.hpp"
#include "analyses/period_analysis.hpp"
#include "analyses/subgroup_analysis.hpp"
#include "analyses/validation.hpp"
#include "metrics/score_order.hpp"

#include <catch2/catch.hpp>

#include <algorithm>
#include <cmath>

using namespace plumbline;
using namespace plumbline::test;
using Catch::Matchers::WithinAbs;

TEST_CASE("The decision curve matches the Toy-20 and Gen-1000 net benefit check values", "[decision]")
{
    // Computed with numpy (docs/methods.md §14; Vickers & Elkin 2006, formula from memory):
    // Toy-20 A at 0.1 / 0.2 / 0.3 / 0.5: NB 0.344444, 0.262500, 0.192857,
    // 0.100000; treat all 0.333333, 0.25, 0.142857, −0.2; sNB 0.861111, 0.65625, 0.482143, 0.25;
    // net reduction per 100: 10, 5, 11.6667, 30. Gen-1000: NB 0.220889, 0.154750, 0.103000.
    const auto a = toy20A();
    const ModelSupport support = buildModelSupport(a.p, ascendingOrder(a.p), true);
    const std::vector<double> t{0.1, 0.2, 0.3, 0.5};
    const auto curve = decisionCurve(support, sampleCounts(support, a.y), t);
    const double nb[4] = {0.344444, 0.262500, 0.192857, 0.100000}, all[4] = {0.333333, 0.25, 0.142857, -0.2};
    const double snb[4] = {0.861111, 0.65625, 0.482143, 0.25}, reduction[4] = {10.0, 5.0, 11.6667, 30.0};
    for (std::size_t k = 0; k < 4; ++k) {
        CHECK_THAT(curve[k].netBenefit, WithinAbs(nb[k], 5e-7));
        CHECK_THAT(curve[k].treatAll, WithinAbs(all[k], 5e-7));
        CHECK_THAT(curve[k].standardized, WithinAbs(snb[k], 5e-7));
        CHECK_THAT(curve[k].netReductionPer100, WithinAbs(reduction[k], 5e-5));
    }
    const auto gen = gen1000();
    const ModelSupport genSupport = buildModelSupport(gen.p, ascendingOrder(gen.p), true);
    const std::vector<double> g{0.1, 0.2, 0.3};
    const auto genCurve = decisionCurve(genSupport, sampleCounts(genSupport, gen.y), g);
    CHECK_THAT(genCurve[0].netBenefit, WithinAbs(0.220889, 5e-7));
    CHECK_THAT(genCurve[1].netBenefit, WithinAbs(0.154750, 5e-7));
    CHECK_THAT(genCurve[2].netBenefit, WithinAbs(0.103000, 5e-7));
    CHECK_THAT(genCurve[0].standardized, WithinAbs(0.738759, 5e-7));
}

TEST_CASE("The sample's decision curve from counts at or above each threshold equals the one from support points", "[decision]")
{
    for (const auto& data : {toy20A(), gen1000()}) {
        const ScoreOrder order = ascendingOrder(data.p);
        const ModelSupport support = buildModelSupport(data.p, order, true);
        const std::vector<double> t = decisionGrid(0.01, 0.6, 0.01);
        const auto fromSupport = decisionCurve(support, sampleCounts(support, data.y), t);
        const auto events = static_cast<std::size_t>(std::count(data.y.begin(), data.y.end(), std::uint8_t{1}));
        const auto fromCounts = decisionCurve(countsAtOrAbove(data.y, data.p, order, t), events, data.y.size(), t);
        REQUIRE(fromCounts.size() == fromSupport.size());
        for (std::size_t k = 0; k < t.size(); ++k) {
            CHECK(fromCounts[k].threshold == fromSupport[k].threshold);
            CHECK(fromCounts[k].netBenefit == fromSupport[k].netBenefit);
            CHECK(fromCounts[k].treatAll == fromSupport[k].treatAll);
            CHECK(fromCounts[k].standardized == fromSupport[k].standardized);
            CHECK(fromCounts[k].netReductionPer100 == fromSupport[k].netReductionPer100);
        }
    }
}

TEST_CASE("The default decision grid runs from 0.05 to 0.50 by 0.01 with exact values", "[decision]")
{
    const auto grid = decisionGrid(0.05, 0.50, 0.01);
    REQUIRE(grid.size() == 46);
    CHECK(grid.front() == 0.05);
    CHECK(grid[3] == 0.08);
    CHECK(grid.back() == 0.5);
}

TEST_CASE("Dates fall into months and quarters at the boundaries", "[periods]")
{
    CHECK(periodOf("2025-03-31", DateFormat::Iso, PeriodUnit::Month) == "2025-03");
    CHECK(periodOf("2025-04-01", DateFormat::Iso, PeriodUnit::Month) == "2025-04");
    CHECK(periodOf("2025-03-31", DateFormat::Iso, PeriodUnit::Quarter) == "2025-Q1");
    CHECK(periodOf("2025-04-01", DateFormat::Iso, PeriodUnit::Quarter) == "2025-Q2");
    CHECK(periodOf("2024-12-31", DateFormat::Iso, PeriodUnit::Quarter) == "2024-Q4");
    CHECK(periodOf("2025-01-01", DateFormat::Iso, PeriodUnit::Quarter) == "2025-Q1");
    CHECK(periodOf("2024-02-29", DateFormat::Iso, PeriodUnit::Month) == "2024-02"); // leap day
    CHECK_FALSE(periodOf("2025-02-29", DateFormat::Iso, PeriodUnit::Month));       // not a leap year
    CHECK_FALSE(periodOf("2025-13-01", DateFormat::Iso, PeriodUnit::Month));
    CHECK(periodOf("2025-06-30T23:59", DateFormat::Iso, PeriodUnit::Month) == "2025-06");
    CHECK(periodOf("03/04/2025", DateFormat::DayFirst, PeriodUnit::Month) == "2025-04");
    CHECK(periodOf("03/04/2025", DateFormat::MonthFirst, PeriodUnit::Month) == "2025-03");
    CHECK(periodOf("31/12/2025", DateFormat::DayFirst, PeriodUnit::Quarter) == "2025-Q4");
    CHECK_FALSE(periodOf("31/12/2025", DateFormat::MonthFirst, PeriodUnit::Month));
}

TEST_CASE("Ambiguous dates are refused with a message and a stated format is followed", "[periods]")
{
    IntakeSettings settings = settingsFor({"p"});
    settings.periodColumn = "d";
    std::string text = "y,p,d\n";
    for (int i = 0; i < 40; ++i)
        text += std::to_string(i % 3 == 0) + ",0." + std::to_string(1 + i % 8) + "," + std::to_string(1 + i % 12) + "/0" + std::to_string(1 + i % 9) + "/2025\n";
    const auto intake = intakeOf(settings, text);
    REQUIRE(intake);
    REQUIRE(intake->cohort.period);
    const auto refused = analysePeriods(intake->cohort, *intake->cohort.period, std::nullopt, PeriodUnit::Month, 0.95);
    REQUIRE_FALSE(refused);
    CHECK(refused.error().remedy.find("--date-format") != std::string::npos);
    CHECK(refused.error().column == "d");
    CHECK(refused.error().value == "1/01/2025");
    CHECK(refused.error().line == 2); // the first data row, after the header
    // The whole validation still runs and says why there is no view over time.
    const ValidationResult whole = runValidation(intake->cohort, PanelSettings{});
    CHECK_FALSE(whole.periods);
    CHECK(std::ranges::any_of(whole.warnings, [](const std::string& w) { return w.find("--date-format") != std::string::npos; }));
    const auto monthFirst = analysePeriods(intake->cohort, *intake->cohort.period, DateFormat::MonthFirst, PeriodUnit::Quarter, 0.95);
    REQUIRE(monthFirst);
    CHECK(monthFirst->undated == 0);
}

namespace {

// The simulated sample scenario's local model, by period of discharge.
std::expected<PeriodAnalysis, InputError> samplePeriodsOfLocalModel(PeriodUnit unit)
{
    const auto files = simulateCohort({24000, 20240101}, false);
    IntakeSettings settings = settingsFor({"local_score"}, "readmitted_30d");
    settings.periodColumn = "discharge_date";
    const auto intake = intakeOf(settings, files.cohort);
    if (!intake)
        return std::unexpected(intake.error());
    return analysePeriods(intake->cohort, *intake->cohort.period, std::nullopt, unit, 0.95);
}

} // namespace

TEST_CASE("Calibration drift in the sample scenario's second year is flagged", "[periods]")
{
    // The simulator lowers readmissions from January 2025 (sample-data/README.md): the local
    // model's O/E in the last quarters falls below the first year's interval.
    const auto periods = samplePeriodsOfLocalModel(PeriodUnit::Quarter);
    REQUIRE(periods);
    REQUIRE(periods->results.size() == 8);
    CHECK(periods->results.front().period == "2024-Q1");
    CHECK(periods->firstYearPeriods.size() == 4);
    CHECK_FALSE(periods->results[0].outsideFirstYear);
    CHECK(periods->results.back().outsideFirstYear);
    CHECK(*periods->results.back().oe.value < 0.9);
    REQUIRE_FALSE(periods->warnings.empty());
    CHECK(periods->note.find("coding") != std::string::npos);
}

TEST_CASE("A calibrated model without drift raises no drift flag", "[periods]")
{
    // 24 months of 1000 patients whose outcomes follow their scores exactly (events are placed
    // deterministically so that every month's O/E is 1): no period may be flagged and no warning
    // raised. Comparing a month's point estimate with the pooled year's narrow interval would
    // still be fine here; the noisy case is the sample scenario's local model in 2025-01.
    IntakeSettings settings = settingsFor({"p"});
    settings.periodColumn = "d";
    std::string text = "y,p,d\n";
    for (int month = 0; month < 24; ++month)
        for (int i = 0; i < 1000; ++i) {
            const char* risk = i < 500 ? "0.1" : "0.3";
            const bool event = i < 500 ? (i % 10 == 0) : ((i - 500) % 10 < 3);
            const int year = 2024 + month / 12, mm = 1 + month % 12;
            text += std::string(event ? "1," : "0,") + risk + "," + std::to_string(year) + "-" + (mm < 10 ? "0" : "")
                    + std::to_string(mm) + "-15\n";
        }
    const auto intake = intakeOf(settings, text);
    REQUIRE(intake);
    const auto periods = analysePeriods(intake->cohort, *intake->cohort.period, std::nullopt, PeriodUnit::Month, 0.95);
    REQUIRE(periods);
    REQUIRE(periods->results.size() == 24);
    for (const auto& r : periods->results) {
        CHECK_THAT(*r.oe.value, WithinAbs(1.0, 1e-12));
        CHECK_FALSE(r.outsideFirstYear);
    }
    CHECK(periods->warnings.empty());
    // The latest 12 months are the second year, and agree with the first (O/E 1 by construction).
    REQUIRE(periods->latestYearPeriods.size() == 12);
    CHECK(periods->latestYearPeriods.front() == "2025-01");
    CHECK(periods->latestYearPeriods.back() == "2025-12");
    REQUIRE(periods->latestYear.size() == 1);
    CHECK_THAT(*periods->latestYear[0].oe.value, WithinAbs(1.0, 1e-12));
}

TEST_CASE("Periods computed with the cohort's score orders given equal those sorted on their own", "[periods]")
{
    const auto files = simulateCohort({24000, 20240101}, false);
    IntakeSettings settings = settingsFor({"supplier_score", "local_score"}, "readmitted_30d");
    settings.periodColumn = "discharge_date";
    const auto intake = intakeOf(settings, files.cohort);
    REQUIRE(intake);
    const Cohort& cohort = intake->cohort;
    const std::vector<ScoreOrder> orders{ascendingOrder(cohort.models[0].values), ascendingOrder(cohort.models[1].values)};
    const auto own = analysePeriods(cohort, *cohort.period, std::nullopt, PeriodUnit::Month, 0.95);
    const auto given = analysePeriods(cohort, *cohort.period, std::nullopt, PeriodUnit::Month, 0.95, false, &orders);
    REQUIRE(own);
    REQUIRE(given);
    REQUIRE(own->results.size() == given->results.size());
    const auto same = [](const Estimate& a, const Estimate& b) {
        return a.value == b.value && a.se == b.se && a.lower == b.lower && a.upper == b.upper;
    };
    for (std::size_t k = 0; k < own->results.size(); ++k) {
        CHECK(own->results[k].period == given->results[k].period);
        CHECK(own->results[k].n == given->results[k].n);
        CHECK(same(own->results[k].c, given->results[k].c));
        CHECK(same(own->results[k].oe, given->results[k].oe));
        CHECK(same(own->results[k].calibrationIntercept, given->results[k].calibrationIntercept));
    }
    REQUIRE(given->firstYear.size() == 2);
    CHECK(same(own->firstYear[1].c, given->firstYear[1].c));
    CHECK(same(own->latestYear[1].c, given->latestYear[1].c));
    // The C statistic of a period is the one of its rows on their own.
    std::vector<std::uint8_t> y;
    std::vector<double> p;
    for (std::size_t i = 0; i < cohort.rows(); ++i)
        if (cohort.period->levels[cohort.period->codes[i]].starts_with("2024-03")) {
            y.push_back(cohort.outcome[i]);
            p.push_back(cohort.models[0].values[i]);
        }
    const auto march = std::find_if(given->results.begin(), given->results.end(), [](const PeriodResult& r) { return r.period == "2024-03"; });
    REQUIRE(march != given->results.end());
    CHECK(march->c.value == cStatistic(y, p, CStatisticScale::Logit, 0.95).value);
}

TEST_CASE("The latest months' O/E is pooled over the last 12 months after the first year", "[periods]")
{
    // The sample scenario lowers readmissions from January 2025: pooled over 2025 the local
    // model's O/E lies below the first year's interval, and the decision summary says so.
    const auto quarters = samplePeriodsOfLocalModel(PeriodUnit::Quarter);
    REQUIRE(quarters);
    CHECK(quarters->latestYearPeriods == std::vector<std::string>{"2025-Q1", "2025-Q2", "2025-Q3", "2025-Q4"});
    REQUIRE(quarters->latestYear.size() == 1);
    CHECK(*quarters->latestYear[0].oe.upper < *quarters->firstYear[0].oe.lower);
    // Pooling the four quarters: the same as the ratio of their summed events to summed expected.
    double events = 0.0, expected = 0.0;
    for (const auto& r : quarters->results)
        if (r.period >= "2025-Q1") {
            events += double(r.events);
            expected += double(r.events) / *r.oe.value;
        }
    CHECK_THAT(*quarters->latestYear[0].oe.value, WithinAbs(events / expected, 1e-9));

    ValidationResult result;
    result.periods = *quarters;
    const DecisionSummary summary = summariseForDecision(Cohort{}, result, 0.2);
    const bool said = std::any_of(summary.findings.begin(), summary.findings.end(), [](const DecisionFinding& f) {
        return f.text.find("in the latest months (2025-Q1 to 2025-Q4): calibration has changed - fewer events") != std::string::npos;
    });
    CHECK(said);
}

TEST_CASE("A month whose interval overlaps the first year's is not flagged", "[periods]")
{
    // The sample scenario's local model in 2025-01 (n ~ 1000): its O/E point estimate lies just
    // below the pooled first year's narrow interval but its own interval overlaps it, so it is
    // chance, not drift; the last months, whose intervals lie wholly below, are flagged.
    const auto periods = samplePeriodsOfLocalModel(PeriodUnit::Month);
    REQUIRE(periods);
    REQUIRE(periods->results.size() == 24);
    for (const auto& r : periods->results) {
        if (!r.outsideFirstYear)
            continue;
        CHECK(r.period >= "2025-01");
        // Flagged only when the whole interval misses the first year's interval.
        CHECK((*r.oe.upper < 0.95 || *r.calibrationIntercept.upper < 0.0));
    }
    CHECK(periods->results.back().outsideFirstYear);
}

TEST_CASE("Each subgroup's panel equals a full validation on that subgroup's rows alone", "[subgroups]")
{
    const auto files = simulateCohort({6000, 77}, false);
    IntakeSettings settings = settingsFor({"supplier_score", "local_score"}, "readmitted_30d");
    settings.groupColumns = {"hospital"};
    const auto intake = intakeOf(settings, files.cohort);
    REQUIRE(intake);
    // As runValidation calls it: with the whole cohort's score orders, which each level filters
    // to its own rows instead of sorting again (the reference below sorts its own).
    std::vector<ScoreOrder> orders;
    for (const auto& model : intake->cohort.models)
        orders.push_back(ascendingOrder(model.values));
    const SubgroupAnalysis subgroups = analyseSubgroups(intake->cohort, PanelSettings{}, 11, orders);
    const CategoricalColumn& hospital = intake->cohort.groups[0];
    for (std::uint32_t code = 0; code < hospital.levels.size(); ++code) {
        // The rows of this hospital, taken independently of the analysis.
        Cohort alone;
        alone.models = {{"supplier_score", {}}, {"local_score", {}}};
        for (std::size_t i = 0; i < intake->cohort.rows(); ++i)
            if (hospital.codes[i] == code) {
                alone.outcome.push_back(intake->cohort.outcome[i]);
                alone.models[0].values.push_back(intake->cohort.models[0].values[i]);
                alone.models[1].values.push_back(intake->cohort.models[1].values[i]);
            }
        const ValidationResult reference = runValidation(alone, PanelSettings{});
        for (std::size_t m = 0; m < 2; ++m) {
            const auto found = std::find_if(subgroups.results.begin(), subgroups.results.end(), [&](const SubgroupResult& r) {
                return r.level == hospital.levels[code] && r.model == alone.models[m].name;
            });
            REQUIRE(found != subgroups.results.end());
            CHECK(found->n == alone.rows());
            for (std::size_t k = 0; k < PanelMetricCount; ++k) {
                INFO(hospital.levels[code] << " " << panelKeys[k]);
                CHECK(found->panel.metrics[k].estimate.value == reference.models[m].metrics[k].estimate.value);
                CHECK(found->panel.metrics[k].estimate.lower == reference.models[m].metrics[k].estimate.lower);
            }
        }
    }
    // The supplier score is too extreme at Ashford and calibrated on average at Saltmarsh only:
    // its calibration differs across the five hospitals (Cochran's Q on 5 - 1 degrees of freedom).
    const auto het = std::find_if(subgroups.heterogeneity.begin(), subgroups.heterogeneity.end(), [](const HeterogeneityTest& h) {
        return h.model == "supplier_score" && h.metric == "calibration_intercept";
    });
    REQUIRE(het != subgroups.heterogeneity.end());
    REQUIRE(hospital.levels.size() == 5);
    CHECK(het->df == 4);
}

TEST_CASE("Small subgroup levels are shown and flagged not hidden", "[subgroups]")
{
    IntakeSettings settings = settingsFor({"p"});
    settings.groupColumns = {"g"};
    std::string text = "y,p,g\n";
    for (int i = 0; i < 300; ++i)
        text += std::to_string(i % 4 == 0) + ",0." + std::to_string(10 + i % 80) + ",big\n";
    for (int i = 0; i < 6; ++i)
        text += std::to_string(i % 2) + ",0.3,tiny\n";
    const auto intake = intakeOf(settings, text);
    const SubgroupAnalysis subgroups = analyseSubgroups(intake->cohort, PanelSettings{}, 11);
    const auto tiny = std::find_if(subgroups.results.begin(), subgroups.results.end(), [](const SubgroupResult& r) { return r.level == "tiny"; });
    REQUIRE(tiny != subgroups.results.end());
    CHECK(tiny->tooSmall);
    CHECK(tiny->n == 6);
}

TEST_CASE("Funnel limits approach the normal limits for large expected counts", "[subgroups]")
{
    // For large E, exact Poisson limits tend to 1 ± z/sqrt(E) (normal approximation to the
    // Poisson; common practice; docs/methods.md §20): E = 10,000 gives 0.9804 and 1.0196 at 95 %.
    CHECK_THAT(funnelLimit(10000.0, 0.025, false), WithinAbs(1.0 - 1.959964 / 100.0, 0.0006));
    CHECK_THAT(funnelLimit(10000.0, 0.025, true), WithinAbs(1.0 + 1.959964 / 100.0, 0.0006));
    CHECK(funnelLimit(100.0, 0.001, false) < funnelLimit(100.0, 0.025, false));
    CHECK(funnelLimit(100.0, 0.001, true) > funnelLimit(100.0, 0.025, true));
    CHECK(funnelLimit(5.0, 0.025, false) >= 0.0);
}
