#include "support/check_datasets.hpp"
#include "metrics/logistic_recalibration.hpp"
#include "analyses/model_updating.hpp"
#include "resampling/random_stream.hpp"

#include <catch2/catch.hpp>

#include <cmath>

using namespace plumbline;
using namespace plumbline::test;
using Catch::Matchers::WithinAbs;

namespace {

double expit(double x)
{
    return 1.0 / (1.0 + std::exp(-x));
}

std::optional<UpdateFit> fitRows(const CheckData& d, UpdateMethod method)
{
    std::vector<double> events(d.y.size()), trials(d.y.size(), 1.0);
    for (std::size_t i = 0; i < d.y.size(); ++i)
        events[i] = d.y[i];
    return fitUpdate(d.p, events, trials, method, 0.05);
}

// A cohort whose truth is known: lp ~ Normal(−1.5, 1), y from lp, the model reports
// expit(shift + scale·lp).
CheckData simulate(std::size_t n, double shift, double scale, RandomStream& random)
{
    CheckData d;
    for (std::size_t i = 0; i < n; ++i) {
        const double lp = -1.5 + random.normal();
        d.y.push_back(random.uniform() < expit(lp) ? 1 : 0);
        d.p.push_back(expit(shift + scale * lp));
    }
    return d;
}

} // namespace

TEST_CASE("Updated Toy-20 risks match the check values of the methods reference", "[updating]")
{
    // Computed with numpy and statsmodels 0.13.5 (docs/methods.md §19): intercept update
    // p = 0.30 → 0.3573319; logistic recalibration (a = −0.0550359, b = 0.5024740): 0.30 → 0.3820677,
    // 0.90 → 0.7405852, 0.05 → 0.1773304.
    const auto intercept = fitRows(toy20A(), UpdateMethod::Intercept);
    REQUIRE(intercept);
    CHECK_THAT(intercept->updatedRisk(0.30), WithinAbs(0.3573319, 1e-7));
    const auto logistic = fitRows(toy20A(), UpdateMethod::Logistic);
    REQUIRE(logistic);
    CHECK_THAT(logistic->intercept, WithinAbs(-0.0550359, 1e-7));
    CHECK_THAT(logistic->slope, WithinAbs(0.5024740, 1e-7));
    CHECK_THAT(logistic->updatedRisk(0.30), WithinAbs(0.3820677, 1e-7));
    CHECK_THAT(logistic->updatedRisk(0.90), WithinAbs(0.7405852, 1e-7));
    CHECK_THAT(logistic->updatedRisk(0.05), WithinAbs(0.1773304, 1e-7));
    CHECK(logistic->formula() == "logit(p_updated) = -0.0550 + 0.5025 x logit(p)");
}

TEST_CASE("The closed test keeps a calibrated model and updates a miscalibrated one as needed", "[updating]")
{
    RandomStream random(4242);
    // Calibrated: nothing to update (Toy-20's LR tests are also far from significance).
    CHECK(fitRows(toy20A(), UpdateMethod::ClosedTest)->choice == UpdateChoice::None);
    CHECK(fitRows(simulate(4000, 0.0, 1.0, random), UpdateMethod::ClosedTest)->choice == UpdateChoice::None);
    // Shifted only: the intercept update suffices.
    CHECK(fitRows(simulate(4000, 0.6, 1.0, random), UpdateMethod::ClosedTest)->choice == UpdateChoice::Intercept);
    // Too extreme: logistic recalibration.
    CHECK(fitRows(simulate(4000, 0.6, 1.6, random), UpdateMethod::ClosedTest)->choice == UpdateChoice::Logistic);
}

TEST_CASE("Optimism-corrected calibration slopes are closer to the truth than apparent ones", "[updating]")
{
    // Each small development cohort (300 patients, about 60 events) gets a logistic
    // recalibration; its true slope is measured on 200,000 new patients from the same
    // population. The apparent slope is 1 by construction; the corrected one should sit nearer
    // the truth on average. (The truth b/b̂ is skewed above 1 for a noisy b̂, so the optimism here
    // is negative on average: the correction moves the slope up, towards the truth.)
    RandomStream random(777);
    const CheckData validation = simulate(200000, 0.5, 1.6, random);
    double apparentError = 0.0, correctedError = 0.0;
    const int cohorts = 60;
    for (int k = 0; k < cohorts; ++k) {
        const CheckData development = simulate(300, 0.5, 1.6, random);
        UpdateSettings settings;
        settings.method = UpdateMethod::Logistic;
        settings.optimismReplicates = 200;
        settings.seed = 100 + k;
        const auto update = updateModel(development.y, development.p, "m", settings);
        REQUIRE(update);
        std::vector<double> updated(validation.p.size());
        for (std::size_t i = 0; i < updated.size(); ++i)
            updated[i] = update->fit.updatedRisk(validation.p[i]);
        const double truth = fitCalibrationSlope(validation.y, clampedLogits(updated))->slope;
        const OptimismRow& slope = update->optimism[2];
        REQUIRE(slope.key == "calibration_slope");
        CHECK_THAT(slope.apparent, WithinAbs(1.0, 1e-8));
        apparentError += std::abs(slope.apparent - truth);
        correctedError += std::abs(slope.corrected - truth);
    }
    INFO("mean |apparent - truth| " << apparentError / cohorts << ", mean |corrected - truth| " << correctedError / cohorts);
    CHECK(correctedError < apparentError);
}

TEST_CASE("Updating never changes the C statistic and the calibration-in-the-large becomes 0", "[updating]")
{
    RandomStream random(99);
    const CheckData d = simulate(3000, 0.6, 1.6, random);
    UpdateSettings settings;
    settings.method = UpdateMethod::Logistic;
    settings.optimismReplicates = 50;
    const auto update = updateModel(d.y, d.p, "m", settings);
    REQUIRE(update);
    // C: the ranking never changes, so C on a bootstrap sample and on the original data estimate
    // the same number; their mean difference over 50 samples is near 0 (SD about 0.002 here).
    CHECK_THAT(update->optimism[0].optimism, WithinAbs(0.0, 0.01));
    CHECK_THAT(update->optimism[0].apparent, WithinAbs(update->optimism[0].corrected + update->optimism[0].optimism, 1e-12));
    CHECK_THAT(update->optimism[1].apparent, WithinAbs(0.0, 1e-8));  // CITL after recalibration
    CHECK(update->updatedGroups.size() == 10);
}
