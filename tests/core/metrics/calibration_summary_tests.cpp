#include "metrics/binomial_interval.hpp"
#include "metrics/calibration_summary.hpp"
#include "support/check_datasets.hpp"
#include "metrics/overall_accuracy.hpp"
#include "metrics/risk_groups.hpp"
#include "metrics/threshold_metrics.hpp"

#include <catch2/catch.hpp>

using namespace plumbline;
using namespace plumbline::test;
using Catch::Matchers::WithinAbs;

// Check values: docs/methods.md §8-§11, §13 and §14, computed with python3 (numpy, scipy 1.10,
// statsmodels 0.13.5 proportion_confint) and R 4.2.2. The O/E SE (Debray et al. 2017) and its
// exact Poisson limits are from memory; O < 10 for the exact interval is common practice.
TEST_CASE("O/E and its intervals match the check values", "[calibration]")
{
    const auto a = toy20A(), gen = gen1000();
    const Estimate logNormal = observedExpectedRatio(a.y, a.p, 0.95, CiMethod::LogNormal);
    CHECK_THAT(*logNormal.value, WithinAbs(1.1267606, 1e-7));
    CHECK_THAT(*logNormal.seLog, WithinAbs(0.2738613, 1e-7));
    // `se` is on the ratio's own scale (delta method): O/E · SE(log O/E).
    CHECK_THAT(*logNormal.se, WithinAbs(1.1267606 * 0.2738613, 1e-7));
    CHECK_THAT(*logNormal.lower, WithinAbs(0.6587498, 1e-7));
    CHECK_THAT(*logNormal.upper, WithinAbs(1.9272710, 1e-7));
    const Estimate exact = observedExpectedRatio(a.y, a.p, 0.95, CiMethod::ExactPoisson);
    CHECK_THAT(*exact.lower, WithinAbs(0.4864552, 1e-7));
    CHECK_THAT(*exact.upper, WithinAbs(2.2201675, 1e-7));
    CHECK(observedExpectedRatio(a.y, a.p, 0.95).ciMethod == CiMethod::ExactPoisson); // O = 8 is small
    const Estimate g = observedExpectedRatio(gen.y, gen.p, 0.95);
    CHECK(g.ciMethod == CiMethod::LogNormal);
    CHECK_THAT(*g.value, WithinAbs(0.9331141, 1e-7));
    CHECK_THAT(*g.lower, WithinAbs(0.8486326, 1e-7));
    CHECK_THAT(*g.upper, WithinAbs(1.0260058, 1e-7));
}

TEST_CASE("O = 0 gives the exact Poisson upper limit chi-square(0.975 2)/(2E)", "[calibration]")
{
    const std::vector<std::uint8_t> y{0, 0, 0, 0};
    const std::vector<double> p{0.25, 0.25, 0.25, 0.25};
    const Estimate oe = observedExpectedRatio(y, p, 0.95);
    CHECK(*oe.value == 0.0);
    CHECK(*oe.lower == 0.0);
    CHECK_THAT(*oe.upper, WithinAbs(7.3777589 / 2.0, 1e-6)); // χ²_{0.975}(2) = 7.3777589 (scipy 1.10 chi2.ppf; docs/methods.md §8)
}

TEST_CASE("Spiegelhalter's z matches the check values and is undefined when all p = 0.5", "[calibration]")
{
    // Spiegelhalter 1986 (formula from memory), computed with numpy and scipy 1.10 (docs/methods.md §9).
    const auto a = toy20A(), gen = gen1000();
    const auto toy = spiegelhalterTest(a.y, a.p);
    CHECK_THAT(toy->z, WithinAbs(1.3281809, 1e-7));
    CHECK_THAT(toy->pValue, WithinAbs(0.1841184, 1e-7));
    const auto g = spiegelhalterTest(gen.y, gen.p);
    CHECK_THAT(g->z, WithinAbs(1.3982152, 1e-7));
    CHECK_THAT(g->pValue, WithinAbs(0.1620485, 1e-7));
    CHECK_FALSE(spiegelhalterTest(a.y, std::vector<double>(20, 0.5)));
}

TEST_CASE("Tie-aware risk groups and Hosmer-Lemeshow match the check values", "[calibration]")
{
    // Computed with numpy and scipy 1.10 (docs/methods.md §10); df = g for external validation is
    // from memory (Hosmer, Lemeshow & Sturdivant 2013).
    const auto a = toy20A(), gen = gen1000();
    const auto toyGroups = riskGroups(a.y, a.p, 5, 0.95, CiMethod::Wilson);
    REQUIRE(toyGroups.size() == 5);
    const std::size_t events[5] = {1, 1, 1, 2, 3};
    const double expected[5] = {0.33, 0.67, 1.20, 1.90, 3.00};
    for (std::size_t k = 0; k < 5; ++k) {
        CHECK(toyGroups[k].n == 4);
        CHECK(toyGroups[k].events == events[k]);
        CHECK_THAT(toyGroups[k].expected, WithinAbs(expected[k], 1e-12));
    }
    const auto toyHl = hosmerLemeshow(toyGroups);
    CHECK_THAT(toyHl->statistic, WithinAbs(1.7355032, 1e-7));
    CHECK(toyHl->df == 5);
    CHECK_THAT(toyHl->pValue, WithinAbs(0.8843969, 1e-7));
    const auto genGroups = riskGroups(gen.y, gen.p, 10, 0.95, CiMethod::Wilson);
    REQUIRE(genGroups.size() == 10);
    const std::size_t genEvents[10] = {10, 12, 14, 19, 23, 29, 36, 46, 51, 59};
    for (std::size_t k = 0; k < 10; ++k)
        CHECK(genGroups[k].events == genEvents[k]);
    const auto genHl = hosmerLemeshow(genGroups);
    CHECK_THAT(genHl->statistic, WithinAbs(10.4995929, 1e-6));
    CHECK_THAT(genHl->pValue, WithinAbs(0.3978075, 1e-7));
}

TEST_CASE("Risk groups never split a tie block and merge a small last group", "[calibration]")
{
    // Target 7/3 patients per group: the four 0.2s close the first group at 5 patients; the
    // single 0.3 and 0.4 would form groups of 1, and the last (< half a target) is merged.
    const std::vector<std::uint8_t> y{0, 1, 0, 1, 0, 1, 0};
    const std::vector<double> p{0.1, 0.2, 0.2, 0.2, 0.2, 0.3, 0.4};
    const auto groups = riskGroups(y, p, 3, 0.95, CiMethod::Wilson);
    REQUIRE(groups.size() == 2);
    CHECK(groups[0].n == 5);
    CHECK(groups[0].riskMax == 0.2);
    CHECK(groups[1].n == 2);
    CHECK(groups[1].riskMin == 0.3);
    CHECK(groups[1].riskMax == 0.4);
}

TEST_CASE("Risk groups on heavily tied data keep every tie block whole", "[calibration]")
{
    std::vector<std::uint8_t> y;
    std::vector<double> p;
    for (int i = 0; i < 500; ++i) {
        p.push_back(double(i % 7) / 10.0 + 0.05); // seven values, 71-72 patients each
        y.push_back(i % 3 == 0 ? 1 : 0);
    }
    const auto groups = riskGroups(y, p, 10, 0.95, CiMethod::Wilson);
    std::size_t total = 0;
    for (std::size_t k = 0; k < groups.size(); ++k) {
        total += groups[k].n;
        if (k + 1 < groups.size())
            CHECK(groups[k].riskMax < groups[k + 1].riskMin);
    }
    CHECK(total == 500);
    CHECK(groups.size() == 7);
}

TEST_CASE("Wilson and Clopper-Pearson intervals match statsmodels proportion_confint", "[calibration]")
{
    // statsmodels 0.13.5 proportion_confint, methods 'wilson' and 'beta' (docs/methods.md §11).
    struct Row { std::size_t x, n; double wl, wu, cl, cu; };
    const Row rows[] = {{0, 4, 0, 0.4898908, 0, 0.6023646},
                        {1, 4, 0.0455873, 0.6993582, 0.0063095, 0.8058796},
                        {4, 4, 0.5101092, 1, 0.3976354, 1},
                        {30, 200, 0.1071359, 0.2060558, 0.1035495, 0.2071587}};
    for (const Row& r : rows) {
        const Interval w = wilsonInterval(r.x, r.n, 0.95);
        const Interval c = clopperPearsonInterval(r.x, r.n, 0.95);
        CHECK_THAT(w.lower, WithinAbs(r.wl, 1e-7));
        CHECK_THAT(w.upper, WithinAbs(r.wu, 1e-7));
        CHECK_THAT(c.lower, WithinAbs(r.cl, 1e-7));
        CHECK_THAT(c.upper, WithinAbs(r.cu, 1e-7));
    }
}

TEST_CASE("Brier scaled Brier log loss and Nagelkerke R2 match the check values", "[overall]")
{
    // Computed with numpy and scikit-learn 1.2.1 (docs/methods.md §13).
    const auto a = toy20A(), gen = gen1000();
    const OverallAccuracy toy = overallAccuracy(a.y, a.p);
    CHECK_THAT(*toy.brier, WithinAbs(0.22629, 1e-9));
    CHECK_THAT(*toy.scaledBrier, WithinAbs(0.0571250, 1e-7));
    CHECK_THAT(*toy.logLoss, WithinAbs(0.6671839, 1e-7));
    CHECK_THAT(*toy.nagelkerkeR2, WithinAbs(0.0156650, 1e-7));
    const OverallAccuracy g = overallAccuracy(gen.y, gen.p);
    CHECK_THAT(*g.brier, WithinAbs(0.1842094, 1e-7));
    CHECK_THAT(*g.scaledBrier, WithinAbs(0.1211344, 1e-7));
    CHECK_THAT(*g.logLoss, WithinAbs(0.5481408, 1e-7));
    CHECK_THAT(*g.nagelkerkeR2, WithinAbs(0.1651544, 1e-7));
}

TEST_CASE("A risk of 0 or 1 contradicted by the outcome makes the log loss undefined and counted", "[overall]")
{
    const std::vector<std::uint8_t> y{1, 0, 1, 0};
    const std::vector<double> p{0.0, 0.2, 1.0, 1.0};
    const OverallAccuracy o = overallAccuracy(y, p);
    CHECK_FALSE(o.logLoss);
    CHECK_FALSE(o.nagelkerkeR2);
    CHECK(o.contradictedCertainties == 2);
    CHECK(o.brier);
}

TEST_CASE("Threshold metrics and net benefit match the Toy-20 check table", "[thresholds]")
{
    // Computed with numpy (docs/methods.md §14; net benefit after Vickers & Elkin 2006, formula from
    // memory); t = 0.2 and 0.3 hit tied risks, so p >= t matters.
    const auto a = toy20A();
    const std::vector<double> t{0.1, 0.2, 0.3, 0.5};
    const auto rows = thresholdMetrics(a.y, a.p, t, 0.95, CiMethod::Wilson);
    const std::size_t tp[4] = {8, 7, 6, 4}, fp[4] = {10, 7, 5, 2};
    const double nb[4] = {0.344444, 0.262500, 0.192857, 0.100000};
    const double all[4] = {0.333333, 0.250000, 0.142857, -0.200000};
    const double nne[4] = {2.25, 2.0, 1.8333, 1.5};
    for (std::size_t k = 0; k < 4; ++k) {
        CHECK(rows[k].tp == tp[k]);
        CHECK(rows[k].fp == fp[k]);
        CHECK(rows[k].tp + rows[k].fn == 8);
        CHECK_THAT(rows[k].netBenefit, WithinAbs(nb[k], 5e-7));
        CHECK_THAT(rows[k].netBenefitTreatAll, WithinAbs(all[k], 5e-7));
        CHECK_THAT(*rows[k].numberNeededToEvaluate, WithinAbs(nne[k], 5e-5));
    }
    CHECK_THAT(*rows[1].specificity.value, WithinAbs(0.4167, 5e-5));
    CHECK_THAT(*rows[2].npv.value, WithinAbs(0.7778, 5e-5));
    CHECK_THAT(*rows[3].flagRate.value, WithinAbs(0.30, 1e-12));
}

TEST_CASE("Threshold metrics match the Gen-1000 check values", "[thresholds]")
{
    // Computed with numpy (docs/methods.md §14).
    const auto gen = gen1000();
    const std::vector<double> t{0.1, 0.2, 0.3};
    const auto rows = thresholdMetrics(gen.y, gen.p, t, 0.95, CiMethod::Wilson);
    CHECK(rows[0].tp == 282);
    CHECK(rows[0].fp == 550);
    CHECK_THAT(rows[0].netBenefit, WithinAbs(0.220889, 5e-7));
    CHECK(rows[1].tp == 247);
    CHECK(rows[1].fp == 369);
    CHECK_THAT(rows[1].netBenefit, WithinAbs(0.154750, 5e-7));
    CHECK(rows[2].tp == 214);
    CHECK(rows[2].fp == 259);
    CHECK_THAT(rows[2].netBenefitTreatAll, WithinAbs(-0.001429, 5e-7));
}

TEST_CASE("The exact Poisson O/E interval is used below 10 events and the log-normal one from 10", "[calibration]")
{
    // The cut-off: fewer than 10 observed events (common practice; docs/methods.md §8).
    auto methodWith = [](int events) {
        std::vector<std::uint8_t> y(100, 0);
        for (int i = 0; i < events; ++i)
            y[std::size_t(i)] = 1;
        const std::vector<double> p(100, 0.1);
        return observedExpectedRatio(y, p, 0.95).ciMethod;
    };
    CHECK(methodWith(9) == CiMethod::ExactPoisson);
    CHECK(methodWith(10) == CiMethod::LogNormal);
}
