#include "analyses/capacity_lookup.hpp"

#include "resampling/random_stream.hpp"

#include <catch2/catch.hpp>

#include <algorithm>
#include <cmath>
#include <cstdio>

using namespace plumbline;

namespace {

// 800 patients over 2025-03-01 to 2025-03-28 (28 days, both ends present), risks on a grid of
// 40 values so that many share a grid threshold's neighbourhood.
Cohort cohortOverFourWeeks()
{
    RandomStream random(21);
    Cohort cohort;
    cohort.models.push_back({"score", {}});
    DateColumn dates;
    dates.name = "day";
    char text[16];
    for (int d = 1; d <= 28; ++d) {
        std::snprintf(text, sizeof text, "2025-03-%02d", d);
        dates.levels.push_back(text);
        dates.written.push_back(readWrittenDate(text));
    }
    for (std::size_t i = 0; i < 800; ++i) {
        const double p = double(1 + random.below(40)) / 41.0;
        cohort.models[0].values.push_back(p);
        cohort.outcome.push_back(random.uniform() < p ? 1 : 0);
        cohort.sourceLines.push_back(std::uint32_t(i + 2));
        dates.codes.push_back(i == 0 ? 0u : i == 1 ? 27u : std::uint32_t(random.below(28)));
    }
    cohort.period = dates;
    return cohort;
}

std::size_t countAtOrAbove(const Cohort& cohort, double t)
{
    const auto& risk = cohort.models[0].values;
    return std::size_t(std::count_if(risk.begin(), risk.end(), [&](double p) { return p >= t; }));
}

} // namespace

TEST_CASE("The capacity box's look-up counts the flagged patients along the slider's grid", "[capacity]")
{
    const Cohort cohort = cohortOverFourWeeks();
    const ValidationResult result = runValidation(cohort, PanelSettings{});
    const CapacityLookup lookup = capacityLookup(result, cohort, std::nullopt);
    REQUIRE(lookup.models == std::vector<std::string>{"score"});
    REQUIRE(lookup.thresholds.size() == 201);
    REQUIRE(lookup.spanDays);
    CHECK(*lookup.spanDays == 28.0);
    for (int s = 0; s <= 200; ++s) {
        const double t = double(s) / 200.0;
        CHECK(lookup.flaggedAt(0, t) == countAtOrAbove(cohort, t));
    }
    // 50 per week over four weeks allow 200 patients; 12.5 % of 800 allow 100.
    CHECK(*lookup.patientsAllowed(*parseCapacity("50/week", "x")) == 200);
    CHECK(*lookup.patientsAllowed(*parseCapacity("12.5%", "x")) == 100);
    CHECK(*lookup.patientsAllowed(*parseCapacity("1000/day", "x")) == 800); // never more than the patients
    for (std::size_t allowed : {0, 1, 50, 100, 200, 799, 800}) {
        const double t = lookup.thresholdFor(0, allowed);
        CHECK(countAtOrAbove(cohort, t) <= allowed);
        const int s = int(std::lround(t * 200.0));
        if (s > 0)
            CHECK(countAtOrAbove(cohort, double(s - 1) / 200.0) > allowed); // the lowest that fits
    }
    // What the box shows: patients per week over the span, one decimal.
    const double perWeek = std::round(double(countAtOrAbove(cohort, 0.5)) * 7.0 / 28.0 * 10.0) / 10.0;
    CHECK(lookup.capacityAt(0, 0.5) == CapacitySpec{CapacitySpec::Kind::Rate, perWeek, CapacitySpec::Unit::Week});
    Cohort undated = cohort;
    undated.period.reset();
    const CapacityLookup shares = capacityLookup(result, undated, std::nullopt);
    CHECK(!shares.spanDays);
    CHECK(!shares.patientsAllowed(*parseCapacity("50/week", "x")));
    const double share = std::round(1000.0 * double(countAtOrAbove(cohort, 0.5)) / 800.0) / 10.0;
    CHECK(shares.capacityAt(0, 0.5) == CapacitySpec{CapacitySpec::Kind::Share, share});
}
