#include "resampling/bootstrap_interval.hpp"
#include "support/check_datasets.hpp"
#include "metrics/discrimination.hpp"

#include <catch2/catch.hpp>

using namespace plumbline;
using namespace plumbline::test;
using Catch::Matchers::WithinAbs;

// Check values: docs/methods.md §16, computed with numpy and scipy 1.10: the BCa of Efron 1987
// (from memory) as scipy.stats.bootstrap (scipy 1.10) implements it: jackknife acceleration and
// mid-tie z0.
TEST_CASE("Toy-20 leave-one-out C values give the acceleration of the check values", "[bootstrap]")
{
    const auto a = toy20A();
    const double expected[20] = {0.6761364, 0.6761364, 0.6818182, 0.7738095, 0.6875000, 0.6875000, 0.6931818,
                                 0.7380952, 0.6988636, 0.7045455, 0.7142857, 0.7102273, 0.6964286, 0.7215909,
                                 0.6845238, 0.7329545, 0.6726190, 0.6726190, 0.6726190, 0.7670455};
    std::vector<double> jackknife;
    for (std::size_t i = 0; i < 20; ++i) {
        auto y = a.y;
        auto p = a.p;
        y.erase(y.begin() + static_cast<long>(i));
        p.erase(p.begin() + static_cast<long>(i));
        jackknife.push_back(*cStatistic(y, p, CStatisticScale::Logit, 0.95).value);
        CHECK_THAT(jackknife.back(), WithinAbs(expected[i], 1e-7));
    }
    CHECK_THAT(accelerationFromJackknife(jackknife), WithinAbs(-0.0393253, 1e-7));
}

TEST_CASE("BCa z0 and adjusted levels match the check values", "[bootstrap]")
{
    // 46 of 100 replicates below the estimate, none equal: z0 = Φ⁻¹(0.46) = −0.1004337.
    std::vector<double> replicates;
    for (int i = 0; i < 46; ++i)
        replicates.push_back(0.6 + 0.001 * i);
    for (int i = 0; i < 54; ++i)
        replicates.push_back(0.71 + 0.001 * i);
    const auto levels = bcaLevels(replicates, 0.703125, -0.0393253, 0.95);
    REQUIRE(levels);
    CHECK_THAT(levels->z0, WithinAbs(-0.1004337, 1e-7));
    CHECK_THAT(levels->alpha1, WithinAbs(0.0095776, 1e-7));
    CHECK_THAT(levels->alpha2, WithinAbs(0.9487005, 1e-7));
}

TEST_CASE("Replicates equal to the estimate count half and one-sided replicates give no BCa", "[bootstrap]")
{
    const std::vector<double> tied{0.4, 0.5, 0.5, 0.6};
    CHECK_THAT(bcaLevels(tied, 0.5, 0.0, 0.95)->z0, WithinAbs(0.0, 1e-15));
    const std::vector<double> above{0.6, 0.7};
    CHECK_FALSE(bcaLevels(above, 0.5, 0.0, 0.95));
    CHECK(accelerationFromJackknife(std::vector<double>(5, 0.3)) == 0.0);
}

TEST_CASE("Grouped acceleration equals the one on the expanded values", "[bootstrap]")
{
    const std::vector<double> values{0.1, 0.4, 0.9};
    const std::vector<double> counts{2, 1, 3};
    const std::vector<double> expanded{0.1, 0.1, 0.4, 0.9, 0.9, 0.9};
    CHECK_THAT(accelerationFromJackknife(values, counts), WithinAbs(accelerationFromJackknife(expanded), 1e-15));
}

TEST_CASE("Percentile intervals use numpy's default linear quantile", "[bootstrap]")
{
    // numpy.quantile([1..10], [0.025, 0.975]) = [1.225, 9.775] (linear interpolation, type 7).
    const std::vector<double> sorted{1, 2, 3, 4, 5, 6, 7, 8, 9, 10};
    const auto [lower, upper] = percentileInterval(sorted, 0.95);
    CHECK_THAT(lower, WithinAbs(1.225, 1e-12));
    CHECK_THAT(upper, WithinAbs(9.775, 1e-12));
}
