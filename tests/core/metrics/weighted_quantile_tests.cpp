#include "resampling/random_stream.hpp"
#include "metrics/weighted_quantile.hpp"

#include <catch2/catch.hpp>

#include <algorithm>
#include <cmath>
#include <vector>

using namespace plumbline;

namespace {

// The definition itself: expand the multiset, sort it and interpolate between the two order
// statistics around p·(n − 1) (Hyndman & Fan 1996, definition 7; numpy's default "linear").
double expandedType7(const std::vector<double>& values, const std::vector<double>& counts, double p)
{
    std::vector<double> expanded;
    for (std::size_t k = 0; k < values.size(); ++k)
        expanded.insert(expanded.end(), std::size_t(counts[k]), values[k]);
    std::sort(expanded.begin(), expanded.end());
    const double position = p * double(expanded.size() - 1);
    const auto below = std::size_t(std::floor(position));
    if (below + 1 >= expanded.size())
        return expanded[below];
    return expanded[below] + (position - double(below)) * (expanded[below + 1] - expanded[below]);
}

} // namespace

// numpy.quantile([1..10], 0.5) = 5.5 and 0.9 → 9.1 (linear interpolation, type 7; worked by hand).
TEST_CASE("Bucketed weighted quantiles give numpy's type 7 on a small multiset", "[quantile]")
{
    const std::vector<double> values{10, 3, 7, 1, 5, 2, 9, 4, 8, 6};
    const std::vector<double> counts(10, 1.0);
    const double probabilities[] = {0.5, 0.9};
    double out[2];
    weightedQuantilesType7(values, counts, 10.0, probabilities, out);
    CHECK(out[0] == 5.5);
    CHECK_THAT(out[1], Catch::Matchers::WithinAbs(9.1, 1e-15));
}

TEST_CASE("Bucketed weighted quantiles equal the expanded definition and the partition selection exactly", "[quantile]")
{
    RandomStream random(11, 3);
    const double probabilities[] = {0.0, 0.1, 0.5, 0.9, 0.975, 1.0};
    for (int trial = 0; trial < 240; ++trial) {
        const std::size_t n = 1 + random.below(trial < 120 ? 40 : 3000);
        std::vector<double> values(n), counts(n);
        // spread, heavy ties, one huge outlier, many zero counts, values across many powers of two
        // (and below and above the buckets' range), negative values
        const int shape = trial % 6;
        for (std::size_t k = 0; k < n; ++k) {
            values[k] = shape == 1 ? double(random.below(5)) * 0.25 : double(random.below(1'000'000)) * 1e-7;
            if (shape == 4)
                values[k] = std::ldexp(1.0 + double(random.below(1000)) / 1000.0, int(random.below(60)) - 40);
            if (shape == 5)
                values[k] -= 0.05;
            counts[k] = shape == 3 && random.below(3) == 0 ? 0.0 : double(1 + random.below(4));
        }
        if (shape == 2)
            values[random.below(n)] = 1e6; // everything else lands in the first bucket
        counts[random.below(n)] = 2.0;     // at least one patient
        double total = 0.0;
        for (double c : counts)
            total += c;
        double out[6], given[6];
        weightedQuantilesType7(values, counts, total, probabilities, out);
        QuantileBuckets gathered; // as the loess gathers them, while it makes the values
        QuantileBuckets::Filler filler(gathered);
        for (std::size_t k = 0; k < n; ++k)
            filler.add(values[k], counts[k]);
        filler.finish();
        weightedQuantilesType7(values, counts, total, probabilities, given, &gathered);
        for (std::size_t q = 0; q < 6; ++q) {
            INFO("trial " << trial << " p " << probabilities[q]);
            CHECK(out[q] == expandedType7(values, counts, probabilities[q]));
            CHECK(given[q] == out[q]);
            std::vector<std::pair<double, double>> pairs;
            for (std::size_t k = 0; k < n; ++k)
                if (counts[k] > 0.0)
                    pairs.emplace_back(values[k], counts[k]);
            CHECK(out[q] == weightedQuantileType7(pairs, probabilities[q]));
        }
    }
}

TEST_CASE("Quantile buckets are ordered: a larger value never has a smaller bucket", "[quantile]")
{
    // The selection relies on it. Across the whole range, its ends and beyond.
    double previousValue = -1.0;
    std::size_t previous = QuantileBuckets::of(previousValue);
    CHECK(previous == 0);
    for (double v = 0.0; v < 1e6; v = v == 0.0 ? 1e-12 : v * 1.0007) {
        const std::size_t b = QuantileBuckets::of(v);
        INFO(previousValue << " then " << v);
        REQUIRE(b >= previous);
        REQUIRE(b < QuantileBuckets::size);
        previous = b;
        previousValue = v;
    }
    CHECK(QuantileBuckets::of(INFINITY) == QuantileBuckets::size - 1);
    CHECK(QuantileBuckets::of(0.5) != QuantileBuckets::of(0.5 + 0.5 / 256.0)); // 256 buckets per power of two
    CHECK(QuantileBuckets::of(0.5) == QuantileBuckets::of(0.5 + 0.4 / 256.0));
}
