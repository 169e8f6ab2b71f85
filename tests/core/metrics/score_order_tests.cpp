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

TEST_CASE("Sorted on two threads, the order is the one thread's, ties in row order", "[order][two threads]")
{
    // Large enough for the two-thread sort; risks with many ties and both signs of zero, so
    // that the halves' rows of one digit must be placed in row order.
    std::vector<double> score(300001);
    std::uint64_t state = 7;
    for (double& s : score) {
        state = state * 6364136223846793005ULL + 1442695040888963407ULL;
        s = double((state >> 33) % 5000) / 4999.0 - 0.1;
    }
    score[17] = -0.0;
    score[299999] = 0.0;
    const ScoreOrder one = ascendingOrder(score, 1);
    REQUIRE(bool(ascendingOrder(score, 2) == one));
    bool ascending = true;
    for (std::size_t k = 1; k < one.size(); ++k)
        ascending = ascending && (score[one[k - 1]] < score[one[k]] || (score[one[k - 1]] == score[one[k]] && one[k - 1] < one[k]));
    CHECK(ascending);
}
