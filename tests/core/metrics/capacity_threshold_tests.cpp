#include "metrics/capacity_threshold.hpp"

#include "resampling/random_stream.hpp"

#include <catch2/catch.hpp>

#include <algorithm>
#include <functional>
#include <optional>
#include <vector>

using namespace plumbline;

namespace {
// Flagged means risk ≥ threshold: counted row by row, without the order.
std::size_t countAtOrAbove(const std::vector<double>& risk, double t)
{
    return std::size_t(std::count_if(risk.begin(), risk.end(), [&](double p) { return p >= t; }));
}
} // namespace

TEST_CASE("Without ties the capacity threshold flags exactly the requested number", "[capacity]")
{
    RandomStream random(11);
    std::vector<double> risk;
    for (int i = 0; i < 997; ++i)
        risk.push_back(random.uniform()); // continuous: no two equal (checked below)
    std::vector<double> sorted = risk;
    std::sort(sorted.begin(), sorted.end(), std::greater<>());
    REQUIRE(std::adjacent_find(sorted.begin(), sorted.end()) == sorted.end());
    const ScoreOrder order = ascendingOrder(risk);
    for (std::size_t k : {1, 2, 10, 99, 500, 996, 997}) {
        const CapacityThreshold c = capacityThreshold(risk, order, k);
        REQUIRE(c.threshold);
        CHECK(*c.threshold == sorted[k - 1]); // the k-th highest risk
        CHECK(countAtOrAbove(risk, *c.threshold) == k);
        CHECK(c.flagged == k);
        CHECK(c.exact());
        CHECK(c.tiedAtThreshold == 1);
        CHECK(c.flaggedAboveTies == k - 1);
        CHECK(flaggedAtOrAbove(risk, order, *c.threshold) == k);
    }
    const CapacityThreshold none = capacityThreshold(risk, order, 0);
    CHECK(!none.threshold);
    CHECK(none.flagged == 0);
    CHECK(none.exact());
    const CapacityThreshold more = capacityThreshold(risk, order, 5000); // more than there are: everybody
    CHECK(more.flagged == risk.size());
    CHECK(!more.exact());
}

TEST_CASE("With ties at the boundary the threshold flags at most the capacity and reports the tie below", "[capacity]")
{
    // Risks on a grid of twenty values, so each is shared by about fifty patients.
    RandomStream random(12);
    std::vector<double> risk;
    for (int i = 0; i < 1000; ++i)
        risk.push_back(double(1 + random.below(20)) / 25.0);
    const ScoreOrder order = ascendingOrder(risk);
    std::vector<double> distinct = risk;
    std::sort(distinct.begin(), distinct.end(), std::greater<>());
    const std::vector<double> sorted = distinct;
    distinct.erase(std::unique(distinct.begin(), distinct.end()), distinct.end());
    std::size_t exactSeen = 0, tiedSeen = 0;
    for (std::size_t k = 1; k <= risk.size(); k += 7) {
        const CapacityThreshold c = capacityThreshold(risk, order, k);
        // By brute force over every distinct risk: the lowest threshold flagging at most k.
        std::optional<double> best;
        for (double t : distinct)
            if (countAtOrAbove(risk, t) <= k)
                best = t;
        REQUIRE(c.threshold.has_value() == best.has_value());
        if (best) {
            CHECK(*c.threshold == *best);
            CHECK(c.flagged == countAtOrAbove(risk, *best));
            CHECK(c.tiedAtThreshold == std::size_t(std::count(risk.begin(), risk.end(), *best)));
        }
        CHECK(c.flagged <= k); // a capacity is a ceiling
        const double kth = sorted[k - 1];
        const std::size_t atOrAboveKth = countAtOrAbove(risk, kth);
        CHECK(c.exact() == (atOrAboveKth == k));
        if (c.exact()) {
            CHECK(!c.tiesCrossCapacity());
            ++exactSeen;
        } else {
            // The tie crossing the capacity is at the k-th highest risk, the next one down.
            REQUIRE(c.nextRiskDown);
            CHECK(*c.nextRiskDown == kth);
            CHECK(c.tiedAtNextRiskDown == std::size_t(std::count(risk.begin(), risk.end(), kth)));
            CHECK(c.flaggedAtNextRiskDown == atOrAboveKth);
            CHECK(c.flaggedAtNextRiskDown > k);
            ++tiedSeen;
        }
    }
    CHECK(tiedSeen > 0);
    CHECK(exactSeen > 0);
    // A capacity that ends exactly where a risk's patients end is met exactly.
    const std::size_t topValue = countAtOrAbove(risk, sorted.front());
    CHECK(capacityThreshold(risk, order, topValue).exact());
    // Fewer places than the top risk's patients: nobody can be flagged without going over.
    const CapacityThreshold none = capacityThreshold(risk, order, topValue - 1);
    CHECK(!none.threshold);
    CHECK(none.flagged == 0);
    CHECK(none.tiedAtNextRiskDown == topValue);
    CHECK(exactSeen + tiedSeen == (risk.size() - 1) / 7 + 1);
}
