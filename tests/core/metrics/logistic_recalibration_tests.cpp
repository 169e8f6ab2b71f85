#include "support/check_datasets.hpp"
#include "metrics/calibration_lr_tests.hpp"
#include "metrics/logistic_recalibration.hpp"

#include <catch2/catch.hpp>

using namespace plumbline;
using namespace plumbline::test;
using Catch::Matchers::WithinAbs;

// Check values: docs/methods.md §6-§7 and §15, computed with statsmodels 0.13.5 (GLM with offset,
// Logit, frequency weights) and R 4.2.2 glm, which agree to all printed digits; the models of
// Van Calster et al. 2016 (offset intercept) and Cox 1958 (slope, from memory).
TEST_CASE("Calibration-in-the-large matches the offset-GLM check values", "[calibration]")
{
    const auto a = toy20A(), gen = gen1000();
    const auto toy = fitCalibrationIntercept(a.y, clampedLogits(a.p));
    REQUIRE(toy);
    CHECK_THAT(toy->alpha, WithinAbs(0.2603346, 1e-7));
    // An earlier reference printed SE 0.5320226 (docs/methods.md §2); statsmodels 0.13.5
    // GLM(offset).fit(tol=1e-14) under Debian's /usr/bin/python3 gives 0.53202336, as does
    // 1/sqrt(Σπ(1−π)) at the exact root.
    CHECK_THAT(toy->se, WithinAbs(0.53202336, 1e-8));
    CHECK_THAT(toy->logLikelihood, WithinAbs(-13.2256309, 1e-7));
    const auto g = fitCalibrationIntercept(gen.y, clampedLogits(gen.p));
    REQUIRE(g);
    CHECK_THAT(g->alpha, WithinAbs(-0.1235969, 1e-7));
    CHECK_THAT(g->se, WithinAbs(0.0765274, 1e-7));
}

TEST_CASE("Calibration slope and intercept match the logistic-regression check values", "[calibration]")
{
    const auto a = toy20A(), gen = gen1000();
    const auto toy = fitCalibrationSlope(a.y, clampedLogits(a.p));
    REQUIRE(toy);
    CHECK_THAT(toy->intercept, WithinAbs(-0.0550359, 1e-7));
    CHECK_THAT(toy->interceptSe, WithinAbs(0.5411643, 1e-7));
    CHECK_THAT(toy->slope, WithinAbs(0.5024740, 1e-7));
    // An earlier reference printed 0.3853744 (docs/methods.md §2); statsmodels 0.13.5
    // Logit(tol=1e-14) gives 0.38537464.
    CHECK_THAT(toy->slopeSe, WithinAbs(0.38537464, 1e-8));
    CHECK_THAT(toy->logLikelihood, WithinAbs(-12.5117291, 1e-7));
    CHECK_THAT(logLikelihoodOfLogits(a.y, clampedLogits(a.p)), WithinAbs(-13.3436788, 1e-7));
    const auto g = fitCalibrationSlope(gen.y, clampedLogits(gen.p));
    REQUIRE(g);
    CHECK_THAT(g->intercept, WithinAbs(-0.2381924, 1e-7));
    CHECK_THAT(g->interceptSe, WithinAbs(0.0867097, 1e-7));
    CHECK_THAT(g->slope, WithinAbs(0.7979601, 1e-7));
    CHECK_THAT(g->slopeSe, WithinAbs(0.0748764, 1e-7));
}

TEST_CASE("Frequency-weighted recalibration equals the fit on the expanded rows", "[calibration]")
{
    // statsmodels 0.13.5 with frequency weights, equal to the expanded rows (docs/methods.md §15):
    // Toy-20 with these counts gives (a, b) = (−0.9669542, 0.2015165).
    const auto a = toy20A();
    const std::vector<double> c{2, 0, 1, 1, 0, 3, 1, 0, 1, 2, 1, 0, 1, 1, 0, 2, 1, 1, 0, 2};
    const auto fit = fitCalibrationSlope(a.y, clampedLogits(a.p), c);
    REQUIRE(fit);
    CHECK_THAT(fit->intercept, WithinAbs(-0.9669542, 1e-7));
    CHECK_THAT(fit->slope, WithinAbs(0.2015165, 1e-7));
}

TEST_CASE("Separation and constant risks make the slope not estimable", "[calibration]")
{
    const std::vector<std::uint8_t> y{0, 0, 0, 1, 1, 1};
    const std::vector<double> separated{0.1, 0.2, 0.3, 0.6, 0.7, 0.8};
    CHECK_FALSE(fitCalibrationSlope(y, clampedLogits(separated)));
    const std::vector<double> constant(6, 0.4);
    CHECK_FALSE(fitCalibrationSlope(y, clampedLogits(constant)));
    CHECK(fitCalibrationIntercept(y, clampedLogits(constant)));
    std::size_t clamped = 0;
    clampedLogits(std::vector<double>{0.0, 0.5, 1.0}, &clamped);
    CHECK(clamped == 2);
}

TEST_CASE("The three calibration likelihood-ratio tests match the check values", "[calibration]")
{
    // Miller, Hui & Tierney 1991 (from memory); statsmodels 0.13.5 and R 4.2.2 log-likelihoods, scipy
    // 1.10 chi2.sf (docs/methods.md §7).
    const auto a = toy20A(), gen = gen1000();
    const auto toy = calibrationLikelihoodRatioTests(a.y, clampedLogits(a.p));
    REQUIRE(toy);
    REQUIRE(toy->joint);
    REQUIRE(toy->slopeGivenIntercept);
    CHECK_THAT(toy->joint->statistic, WithinAbs(1.663900, 1e-6));
    CHECK_THAT(toy->joint->pValue, WithinAbs(0.435200, 1e-6));
    CHECK(toy->joint->df == 2);
    CHECK_THAT(toy->interceptOnly.statistic, WithinAbs(0.236096, 1e-6));
    CHECK_THAT(toy->interceptOnly.pValue, WithinAbs(0.627040, 1e-6));
    CHECK_THAT(toy->slopeGivenIntercept->statistic, WithinAbs(1.427804, 1e-6));
    CHECK_THAT(toy->slopeGivenIntercept->pValue, WithinAbs(0.232123, 1e-6));
    const auto g = calibrationLikelihoodRatioTests(gen.y, clampedLogits(gen.p));
    REQUIRE(g);
    REQUIRE(g->joint);
    REQUIRE(g->slopeGivenIntercept);
    CHECK_THAT(g->joint->statistic, WithinAbs(9.556620, 1e-6));
    CHECK_THAT(g->joint->pValue, WithinAbs(0.008410, 1e-6));
    CHECK_THAT(g->interceptOnly.statistic, WithinAbs(2.635690, 1e-6));
    CHECK_THAT(g->interceptOnly.pValue, WithinAbs(0.104487, 1e-6));
    CHECK_THAT(g->slopeGivenIntercept->statistic, WithinAbs(6.920930, 1e-6));
    CHECK_THAT(g->slopeGivenIntercept->pValue, WithinAbs(0.008519, 1e-6));
}

// The replicate estimates stop early with a second-order correction: held to 1e-12 of the full
// fits above (which iterate to a Newton step below 1e-10 and are checked against statsmodels),
// from warm and cold starts, on frequency-weighted points like a bootstrap replicate's (counts 0
// to 4, about a third zero) and with extreme linear predictors.
TEST_CASE("Replicate calibration estimates agree with the full fits to 1e-12", "[calibration]")
{
    const auto gen = gen1000();
    std::vector<double> lp = clampedLogits(gen.p);
    lp.push_back(-36.0); // a clamped risk near zero, with a patient
    lp.push_back(8.0);
    for (std::uint64_t seed = 1; seed <= 40; ++seed) {
        std::uint64_t state = seed * 0x9E3779B97F4A7C15ull;
        auto next = [&state] {
            state ^= state << 13;
            state ^= state >> 7;
            state ^= state << 17;
            return state;
        };
        std::vector<double> events(lp.size()), trials(lp.size());
        for (std::size_t k = 0; k < lp.size(); ++k) {
            trials[k] = double(next() % 5 == 0 ? 0 : next() % 4);
            const double y = k < gen.y.size() ? gen.y[k] : double(k % 2);
            events[k] = trials[k] * y;
        }
        const BinomialPoints points{lp, events, trials};
        const auto fullIntercept = fitCalibrationIntercept(points, 0.0);
        const auto fullSlope = fitCalibrationSlope(points, 0.0, 1.0);
        REQUIRE(fullIntercept);
        REQUIRE(fullSlope);
        for (const double offset : {0.0, 0.004, 0.3, 2.0}) {
            INFO("seed " << seed << " start offset " << offset);
            const auto intercept = calibrationInterceptEstimate(points, fullIntercept->alpha + offset);
            REQUIRE(intercept);
            CHECK_THAT(*intercept, WithinAbs(fullIntercept->alpha, 1e-12));
            const auto slope = calibrationSlopeEstimate(points, fullSlope->intercept + offset, fullSlope->slope - offset / 4);
            REQUIRE(slope);
            CHECK_THAT(slope->intercept, WithinAbs(fullSlope->intercept, 1e-12));
            CHECK_THAT(slope->slope, WithinAbs(fullSlope->slope, 1e-12));
        }
    }
}

TEST_CASE("Fits with rows left out by a byte equal those with weights of 0 and 1", "[calibration]")
{
    // Gen-1000 with every seventh patient left out: the same rows, the same doubles, the same sums.
    const auto gen = gen1000();
    const std::vector<double> lp = clampedLogits(gen.p);
    std::vector<double> weights(gen.y.size(), 1.0);
    std::vector<std::uint8_t> included(gen.y.size(), 1);
    for (std::size_t i = 0; i < gen.y.size(); i += 7) {
        weights[i] = 0.0;
        included[i] = 0;
    }
    const auto a = fitCalibrationIntercept(gen.y, lp, weights), b = fitCalibrationIntercept(gen.y, lp, included);
    const auto c = fitCalibrationSlope(gen.y, lp, weights), d = fitCalibrationSlope(gen.y, lp, included);
    REQUIRE((a && b && c && d));
    CHECK(a->alpha == b->alpha);
    CHECK(a->se == b->se);
    CHECK(a->logLikelihood == b->logLikelihood);
    CHECK(c->intercept == d->intercept);
    CHECK(c->slope == d->slope);
    CHECK(c->slopeSe == d->slopeSe);
    CHECK(c->logLikelihood == d->logLikelihood);
    CHECK(logLikelihoodOfLogits(gen.y, lp, weights) == logLikelihoodOfLogits(gen.y, lp, included));
    // Leaving rows out changes the fit: the bytes are read.
    CHECK(fitCalibrationIntercept(gen.y, lp)->alpha != b->alpha);
}
