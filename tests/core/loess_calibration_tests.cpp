#include "check_datasets.hpp"
#include "loess_calibration.hpp"
#include "random_stream.hpp"

#include <catch2/catch.hpp>

using namespace plumbline;
using namespace plumbline::test;
using Catch::Matchers::WithinAbs;

// Check values: shared/methods.md §3.9, R 4.2.2 loess(y ~ p, control = loess.control(surface =
// "direct")), which the pack reproduced to 1e-6 [C].
TEST_CASE("Direct loess reproduces the Toy-20 fitted curve and ICI E50 E90 Emax", "[loess]")
{
    const auto a = toy20A();
    const auto fit = loessCalibration(a.y, a.p);
    REQUIRE(fit);
    const double expected[20] = {0.107319, 0.161376, 0.192824, 0.192824, 0.221033, 0.257221, 0.301008,
                                 0.301008, 0.328571, 0.369033, 0.369033, 0.407647, 0.437001, 0.465187,
                                 0.535888, 0.632026, 0.727799, 0.746904, 0.608144, 0.299646};
    for (std::size_t i = 0; i < 20; ++i)
        CHECK_THAT(fit->fitted[i], WithinAbs(expected[i], 1e-6));
    CHECK_THAT(fit->ici, WithinAbs(0.1072957, 1e-6));
    CHECK_THAT(fit->e50, WithinAbs(0.0817012, 1e-6));
    CHECK_THAT(fit->e90, WithinAbs(0.1342048, 1e-6));
    CHECK_THAT(fit->emax, WithinAbs(0.6003545, 1e-6));
    CHECK_FALSE(fit->binned);
}

TEST_CASE("Direct loess reproduces the Gen-1000 ICI E50 E90 Emax", "[loess]")
{
    const auto gen = gen1000();
    const auto fit = loessCalibration(gen.y, gen.p);
    REQUIRE(fit);
    CHECK_THAT(fit->ici, WithinAbs(0.035817, 1e-6));
    CHECK_THAT(fit->e50, WithinAbs(0.026915, 1e-6));
    CHECK_THAT(fit->e90, WithinAbs(0.079262, 1e-6));
    CHECK_THAT(fit->emax, WithinAbs(0.087841, 1e-6));
}

TEST_CASE("The binned approximation keeps ICI within 0.001 of the exact value on 50000 rows", "[loess][slow]")
{
    // Continuous risks (all distinct) so the binning really approximates.
    RandomStream random(50000);
    const std::size_t n = 50000;
    std::vector<std::uint8_t> y(n);
    std::vector<double> p(n);
    for (std::size_t i = 0; i < n; ++i) {
        const double lp = -1.8 + 0.9 * random.normal();
        p[i] = 1.0 / (1.0 + std::exp(-(0.3 + 1.3 * lp)));
        y[i] = random.uniform() < 1.0 / (1.0 + std::exp(-lp)) ? 1 : 0;
    }
    LoessOptions exactOptions;
    exactOptions.exactUpTo = n;
    const auto exact = loessCalibration(y, p, exactOptions);
    LoessOptions binnedOptions;
    binnedOptions.maxSupportPoints = 2000;
    const auto binned = loessCalibration(y, p, binnedOptions);
    REQUIRE(exact);
    REQUIRE(binned);
    CHECK_FALSE(exact->binned);
    CHECK(binned->binned);
    CHECK_THAT(binned->ici, WithinAbs(exact->ici, 0.001));
}

TEST_CASE("Tied risks give the same curve as the expanded data and too few distinct risks give none", "[loess]")
{
    const std::vector<std::uint8_t> y{0, 1, 0, 0, 1, 0, 1, 1, 0, 0, 1, 0};
    const std::vector<double> points{1, 2, 3, 4, 5, 6, 7, 8, 9, 1, 2, 3};
    CHECK_FALSE(loessCalibration(y, points)); // 9 distinct values: a points score
}
