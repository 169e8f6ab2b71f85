#include "resampling/random_stream.hpp"
#include "metrics/score_order.hpp"

#include <catch2/catch.hpp>

#include <algorithm>
#include <numeric>

using namespace plumbline;

TEST_CASE("The radix order equals a stable comparison sort with ties kept in row order", "[order]")
{
    RandomStream random(404);
    for (int trial = 0; trial < 30; ++trial) {
        const std::size_t n = random.below(3000);
        std::vector<double> score(n);
        for (auto& s : score) {
            switch (random.below(4)) {
            case 0: s = double(random.below(20)) / 20.0; break;          // heavy ties
            case 1: s = random.uniform(); break;                         // continuous risks
            case 2: s = -50.0 + 100.0 * random.uniform(); break;        // negative values (logits, points)
            default: s = random.below(2) ? 0.0 : -0.0; break;            // signed zeros compare equal
            }
        }
        std::vector<std::uint32_t> expected(n);
        std::iota(expected.begin(), expected.end(), 0u);
        std::stable_sort(expected.begin(), expected.end(), [&](auto a, auto b) { return score[a] < score[b]; });
        REQUIRE(ascendingOrder(score) == expected);
    }
}
