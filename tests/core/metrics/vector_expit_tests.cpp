#include "metrics/vector_expit.hpp"

#include "metrics/logistic_recalibration.hpp"

#include "resampling/random_stream.hpp"

#include <Eigen/Core>
#include <catch2/catch.hpp>

#include <bit>
#include <cmath>
#include <cstdint>
#include <vector>

using namespace plumbline;

namespace {

// The expression the fits' passes computed before the lanes were written out by hand (Eigen 3.4,
// Debian 12's libeigen3-dev): the reference every lane must equal to the bit.
std::vector<double> eigenExpit(const std::vector<double>& lp, double a, double b)
{
    std::vector<double> out(lp.size());
    const Eigen::Map<const Eigen::ArrayXd> x(lp.data(), Eigen::Index(lp.size()));
    Eigen::Map<Eigen::ArrayXd> pi(out.data(), Eigen::Index(out.size()));
    pi = (1.0 + (-(a + b * x)).exp()).inverse();
    return out;
}

} // namespace

TEST_CASE("Vector expit equals Eigen's vectorised expression to the bit", "[logistic]")
{
    // Logits across the clamped range (±27.6) and beyond, where exp under- and overflows and the
    // clamp at ±709.784 and the split scaling by 2^n are exercised; coefficients from a fit's range.
    RandomStream random(11);
    std::vector<double> lp;
    for (int i = 0; i < 20000; ++i)
        lp.push_back((random.uniform() - 0.5) * 60.0);
    for (double v : {0.0, -0.0, 1e-300, -1e-300, 27.631021115928547, -27.631021115928547, 700.0, -700.0, 709.9, -709.9,
                     745.2, -745.2, 1e4, -1e4})
        lp.push_back(v);
    if (lp.size() % 2)
        lp.push_back(0.25); // Eigen computes an odd count's last element with the scalar exp
    const std::pair<double, double> coefficients[] = {{0.0, 1.0}, {-0.137, 0.91}, {2.5, 1.7}, {-40.0, 30.0}, {0.3, 999.0}};
    for (const auto& [a, b] : coefficients) {
        const auto expected = eigenExpit(lp, a, b);
        std::vector<double> got(lp.size());
        vectorExpit(lp.data(), lp.size(), a, b, got.data());
        std::size_t differing = 0;
        for (std::size_t k = 0; k < lp.size(); ++k)
            differing += std::bit_cast<std::uint64_t>(got[k]) != std::bit_cast<std::uint64_t>(expected[k]);
        INFO("a = " << a << ", b = " << b);
        CHECK(differing == 0);
    }
}

TEST_CASE("Vector expit fills a count that is not a multiple of the lanes", "[logistic]")
{
    const std::vector<double> lp{-2.0, -1.0, 0.0, 1.0, 2.0, 3.0, 4.0};
    for (std::size_t n = 0; n <= lp.size(); ++n) {
        std::vector<double> out(lp.size() + 1, -1.0);
        vectorExpit(lp.data(), n, 0.5, 1.0, out.data());
        for (std::size_t k = 0; k < n; ++k)
            CHECK(out[k] == Approx(1.0 / (1.0 + std::exp(-(0.5 + lp[k])))).epsilon(1e-15));
        for (std::size_t k = n; k < out.size(); ++k)
            CHECK(out[k] == -1.0); // nothing written past the count
    }
}

TEST_CASE("Predicted risks of an odd count equal Eigen's expression to the bit, the last one included", "[logistic]")
{
    // Eigen computes an odd count's last element with the scalar exp; the fits' passes keep that,
    // so their results did not move when the lanes replaced Eigen. Counts across the 256-risk
    // blocks the passes use.
    RandomStream random(12);
    for (const std::size_t count : {1u, 3u, 255u, 257u, 511u, 1001u}) {
        std::vector<double> lp(count);
        for (double& x : lp)
            x = (random.uniform() - 0.5) * 20.0;
        const auto expected = eigenExpit(lp, -0.3, 1.1);
        std::vector<double> got;
        predictedRisksInto(lp, -0.3, 1.1, got);
        REQUIRE(got.size() == count);
        std::size_t differing = 0;
        for (std::size_t k = 0; k < count; ++k)
            differing += std::bit_cast<std::uint64_t>(got[k]) != std::bit_cast<std::uint64_t>(expected[k]);
        INFO("count " << count);
        CHECK(differing == 0);
    }
}
