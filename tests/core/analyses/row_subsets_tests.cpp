#include "analyses/row_subsets.hpp"

#include "resampling/random_stream.hpp"

#include <catch2/catch.hpp>

#include <vector>

using namespace plumbline;

TEST_CASE("Each subset's order read off the cohort's equals sorting the subset itself", "[subsets]")
{
    // Scores on a coarse grid (ties, and both zeros) over rows coded into five levels, three of
    // which map to subsets (two levels share one) and two to none.
    RandomStream random(3);
    std::vector<double> score;
    std::vector<std::uint32_t> codes;
    for (int i = 0; i < 5000; ++i) {
        const auto step = random.below(30);
        score.push_back(step == 0 ? (random.below(2) ? -0.0 : 0.0) : double(step) / 30.0);
        codes.push_back(static_cast<std::uint32_t>(random.below(5)));
    }
    const std::vector<std::uint32_t> subsetOfCode{1, RowSubsets::none, 0, 1, RowSubsets::none};
    const RowSubsets subsets(codes, subsetOfCode, 3);
    REQUIRE(subsets.size() == 3);
    CHECK(subsets.rows(2).empty());
    const auto orders = subsets.orders(ascendingOrder(score));
    REQUIRE(orders.size() == 3);
    for (std::size_t s = 0; s < 3; ++s) {
        std::vector<double> own;
        for (std::size_t i = 0; i < codes.size(); ++i)
            if (subsetOfCode[codes[i]] == s) {
                REQUIRE(subsets.rows(s)[own.size()] == i); // rows in data order
                own.push_back(score[i]);
            }
        CHECK(subsets.rows(s).size() == own.size());
        CHECK(orders[s] == ascendingOrder(own));
    }
}
