#include "support/check_datasets.hpp"
#include "reporting/decision_summary.hpp"
#include "analyses/validation.hpp"

#include <catch2/catch.hpp>

using namespace plumbline;
using namespace plumbline::test;
using Catch::Matchers::WithinAbs;

namespace {

Cohort toyCohort()
{
    Cohort cohort;
    cohort.outcome = toy20A().y;
    cohort.models.push_back({"A", toy20A().p});
    return cohort;
}

bool saysSomething(const DecisionSummary& s, const std::string& words)
{
    for (const auto& f : s.findings)
        if (f.text.find(words) != std::string::npos)
            return true;
    return false;
}

} // namespace

TEST_CASE("The decision summary's counts and net benefit at the care team's threshold are those worked by hand", "[summary]")
{
    // Toy-20 (docs/methods.md §2): 20 patients, 8 events, sum of risks 7.1. At t = 0.3 the
    // patients with risk >= 0.3 are the last eleven (risks 0.30 ... 0.90), 6 with the event and 5
    // without: net benefit 6/20 - 5/20 * 0.3/0.7 = 0.192857..., treat all 8/20 - 12/20 * 0.3/0.7 =
    // 0.142857... (Vickers & Elkin 2006 definition; worked by hand).
    const Cohort cohort = toyCohort();
    const ValidationResult result = runValidation(cohort, PanelSettings{});
    const DecisionSummary s = summariseForDecision(cohort, result, 0.3);
    CHECK(s.patients == 20);
    CHECK(s.events == 8);
    CHECK_THAT(s.eventRate, WithinAbs(0.4, 1e-15));
    REQUIRE(s.models.size() == 1);
    const DecisionSummaryModel& m = s.models[0];
    CHECK_THAT(m.meanRisk, WithinAbs(0.355, 1e-12));
    CHECK_THAT(m.flagged, WithinAbs(0.55, 1e-12));
    REQUIRE(m.netBenefit);
    CHECK_THAT(*m.netBenefit, WithinAbs(0.3 - 0.25 * 0.3 / 0.7, 1e-12));
    CHECK_THAT(*m.netBenefitTreatAll, WithinAbs(0.4 - 0.6 * 0.3 / 0.7, 1e-12));
    CHECK(m.c.value == result.models[0].metrics[CStatistic].estimate.value);
    CHECK(saysSomething(s, "does better than either default"));
    CHECK(saysSomething(s, "flags 55 %"));
}

TEST_CASE("Findings follow the intervals: over-prediction and too extreme risks are named only when the interval says so", "[summary]")
{
    // Risks twice too extreme around the truth and too high on average: outcomes drawn so that
    // the observed rate is well below the mean risk (generated test input).
    Cohort cohort;
    std::vector<double> risks;
    for (int i = 0; i < 2000; ++i) {
        const double truth = 0.05 + 0.3 * double(i % 100) / 100.0;
        const double risk = std::min(0.95, 0.02 + 2.0 * truth);
        cohort.outcome.push_back((i * 7919) % 1000 < int(truth * 1000) ? 1 : 0);
        risks.push_back(risk);
    }
    cohort.models.push_back({"too high", risks});
    const ValidationResult result = runValidation(cohort, PanelSettings{});
    const DecisionSummary s = summariseForDecision(cohort, result, 0.2);
    REQUIRE(result.models[0].metrics[OeRatio].estimate.upper);
    CHECK(*result.models[0].metrics[OeRatio].estimate.upper < 1.0);
    CHECK(saysSomething(s, "too high over-predicts overall"));
    const Estimate& slope = result.models[0].metrics[CalibrationSlope].estimate;
    if (*slope.upper < 1.0)
        CHECK(saysSomething(s, "too extreme"));
    else
        CHECK_FALSE(saysSomething(s, "too extreme"));
    // A well-calibrated model gets no over- or under-prediction finding.
    Cohort fair;
    fair.outcome = cohort.outcome;
    std::vector<double> truth;
    for (int i = 0; i < 2000; ++i)
        truth.push_back(0.05 + 0.3 * double(i % 100) / 100.0);
    fair.models.push_back({"fair", truth});
    const DecisionSummary f = summariseForDecision(fair, runValidation(fair, PanelSettings{}), 0.2);
    CHECK_FALSE(saysSomething(f, "over-predicts"));
    CHECK_FALSE(saysSomething(f, "under-predicts"));
    CHECK(saysSomething(f, "consistent with its risks"));
}
