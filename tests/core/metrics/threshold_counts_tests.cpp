#include "metrics/threshold_counts.hpp"

#include "resampling/random_stream.hpp"

#include <catch2/catch.hpp>

#include <vector>

using namespace plumbline;

TEST_CASE("Counts at or above a threshold match counting every patient", "[thresholds]")
{
    // Risks on a coarse grid so that thresholds fall on tied scores, between them and beyond both ends.
    RandomStream random(7);
    std::vector<std::uint8_t> y;
    std::vector<double> p;
    for (int i = 0; i < 2000; ++i) {
        p.push_back(double(random.below(40)) / 50.0 + 0.1);
        y.push_back(random.uniform() < p.back() ? 1 : 0);
    }
    const std::vector<double> thresholds{0.5, 0.1, 0.0, 0.9, 0.34, 0.36, 0.86, 0.88, 0.25};
    const auto counts = countsAtOrAbove(y, p, ascendingOrder(p), thresholds);
    REQUIRE(counts.size() == thresholds.size());
    for (std::size_t j = 0; j < thresholds.size(); ++j) {
        std::size_t events = 0, nonEvents = 0;
        for (std::size_t i = 0; i < p.size(); ++i)
            if (p[i] >= thresholds[j])
                (y[i] ? events : nonEvents) += 1;
        CHECK(counts[j].events == events);
        CHECK(counts[j].nonEvents == nonEvents);
    }
    CHECK(counts[2].events + counts[2].nonEvents == p.size()); // at 0: everyone
    CHECK(counts[3].events + counts[3].nonEvents == 0);        // above the highest risk: no one
}

TEST_CASE("Counts at or above thresholds of an empty sample are zero", "[thresholds]")
{
    const std::vector<double> thresholds{0.2};
    const auto counts = countsAtOrAbove({}, {}, ScoreOrder{}, thresholds);
    REQUIRE(counts.size() == 1);
    CHECK(counts[0].events == 0);
    CHECK(counts[0].nonEvents == 0);
}
