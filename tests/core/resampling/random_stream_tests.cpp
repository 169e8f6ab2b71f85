#include "resampling/random_stream.hpp"

#include <catch2/catch.hpp>

#include <cmath>
#include <vector>

using plumbline::RandomStream;

TEST_CASE("The same seed and stream give the same numbers - other streams differ", "[random]")
{
    RandomStream a(42, 3);
    RandomStream b(42, 3);
    RandomStream c(42, 4);
    bool anyDifferent = false;
    for (int i = 0; i < 100; ++i) {
        const auto x = a.nextU64();
        CHECK(x == b.nextU64());
        anyDifferent = anyDifferent || x != c.nextU64();
    }
    CHECK(anyDifferent);
}

TEST_CASE("Bounded integers stay in range and are close to uniform", "[random]")
{
    // Pearson chi-square over 10 cells with 100,000 draws: the 0.999 quantile of chi-square(9)
    // is 27.88 (any statistical table, e.g. NIST/SEMATECH e-Handbook, Table 1.3.6.7.4).
    RandomStream random(2024);
    std::vector<int> counts(10, 0);
    const int draws = 100000;
    for (int i = 0; i < draws; ++i) {
        const auto k = random.below(10);
        REQUIRE(k < 10);
        ++counts[k];
    }
    double chiSquare = 0.0;
    for (int n : counts)
        chiSquare += (n - draws / 10.0) * (n - draws / 10.0) / (draws / 10.0);
    CHECK(chiSquare < 27.88);
    CHECK(random.below(1) == 0);
}

TEST_CASE("Normals have mean 0 and variance 1 within sampling error", "[random]")
{
    RandomStream random(99);
    const int n = 200000;
    double sum = 0.0;
    double sumSquares = 0.0;
    for (int i = 0; i < n; ++i) {
        const double z = random.normal();
        sum += z;
        sumSquares += z * z;
    }
    const double mean = sum / n;
    const double variance = sumSquares / n - mean * mean;
    // Standard errors: 1/sqrt(n) = 0.0022 for the mean, sqrt(2/n) = 0.0032 for the variance.
    CHECK(std::abs(mean) < 0.011);
    CHECK(std::abs(variance - 1.0) < 0.016);
}
