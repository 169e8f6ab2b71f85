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
    for (int trial = 0; trial < 200; ++trial) {
        const std::size_t n = 1 + random.below(trial < 100 ? 40 : 3000);
        std::vector<double> values(n), counts(n);
        const int shape = trial % 4; // spread, heavy ties, one huge outlier, many zero counts
        for (std::size_t k = 0; k < n; ++k) {
            values[k] = shape == 1 ? double(random.below(5)) * 0.25 : double(random.below(1'000'000)) * 1e-7;
            counts[k] = shape == 3 && random.below(3) == 0 ? 0.0 : double(1 + random.below(4));
        }
        if (shape == 2)
            values[random.below(n)] = 1e6; // everything else lands in the first bucket
        counts[random.below(n)] = 2.0;     // at least one patient
        double total = 0.0;
        for (double c : counts)
            total += c;
        double out[6], given[6], largest = 0.0;
        weightedQuantilesType7(values, counts, total, probabilities, out);
        for (std::size_t k = 0; k < n; ++k)
            if (counts[k] > 0.0)
                largest = std::max(largest, values[k]);
        weightedQuantilesType7(values, counts, total, probabilities, given, largest); // as the loess passes it
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
