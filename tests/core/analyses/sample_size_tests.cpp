#include "analyses/sample_size.hpp"

#include <catch2/catch.hpp>

using namespace plumbline;
using Catch::Matchers::WithinAbs;

// Check values: docs/methods.md §22, computed with numpy and scipy 1.10 for φ = 0.15, C = 0.70
// after the criteria of Riley et al. 2021 (Stat Med, doi 10.1002/sim.9025; formulas and the
// Newcombe 2006 SE of C from memory): LP ~ Normal(−1.928135, 0.770000); N = 2185 (O/E),
// 6413 (slope), 815 (C), 1074 (sNB at 0.15); slope-driven minimum 6413.
TEST_CASE("The sample-size planner reproduces the worked example of the methods reference", "[plan]")
{
    SampleSizeTargets targets;
    targets.thresholds = {0.10, 0.15, 0.20};
    const auto plan = planSampleSize(0.15, 0.70, targets);
    REQUIRE(plan);
    CHECK_THAT(plan->mu, WithinAbs(-1.928135, 2e-4));
    CHECK_THAT(plan->sigma, WithinAbs(0.770000, 2e-4));
    REQUIRE(plan->criteria.size() == 6);
    CHECK_THAT(plan->criteria[0].targetSe, WithinAbs(0.0509367, 1e-7));
    CHECK(plan->criteria[0].patients == 2185);
    CHECK_THAT(double(plan->criteria[1].patients), WithinAbs(6413, 3));
    CHECK(plan->criteria[2].patients == 815);
    CHECK_THAT(double(plan->criteria[3].patients), WithinAbs(817, 2));
    CHECK_THAT(double(plan->criteria[4].patients), WithinAbs(1074, 2));
    CHECK_THAT(double(plan->criteria[5].patients), WithinAbs(1029, 2));
    CHECK(plan->driver == "calibration slope");
    CHECK_THAT(double(plan->minimum), WithinAbs(6413, 3));
}

TEST_CASE("Impossible planner inputs are refused", "[plan]")
{
    CHECK_FALSE(planSampleSize(0.0, 0.7));
    CHECK_FALSE(planSampleSize(0.2, 0.5));
    CHECK_FALSE(planSampleSize(0.2, 1.0));
}
