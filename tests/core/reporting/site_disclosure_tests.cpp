// The small-cell rule on pooling across sites (docs/methods.md §25; the rule itself: common
// practice in public reporting, §23).
#include "reporting/site_disclosure.hpp"

#include <catch2/catch.hpp>

using namespace plumbline;

TEST_CASE("A site below the small-cell rule keeps no estimate of its own in reports and the pooled value stays", "[pooling][disclosure]")
{
    PooledMeasure measure;
    measure.measure = "c_statistic";
    measure.sites = {{"A", 500, 60, 0.7, 0.65, 0.75, 0.85, 0.1},
                     {"B", 40, 5, 0.8, 0.6, 0.9, 1.4, 0.4},     // 5 events < 11
                     {"C", 30, 25, 0.6, 0.4, 0.8, 0.4, 0.4},    // 5 non-events < 11
                     {"D", 11, 0, 0.0, 0.0, 0.0, 0.0, 0.0}};
    measure.pooled = 0.71;
    SitePooling pooling;
    pooling.models.push_back({"m", {measure}, {}});
    withholdSmallSites(pooling, 11);
    const PooledMeasure& shown = pooling.models[0].measures[0];
    REQUIRE(shown.sites.size() == 1);
    CHECK(shown.sites[0].site == "A");
    REQUIRE(shown.leftOut.size() == 3);
    CHECK(shown.leftOut[0].rfind("B: estimate withheld in reports (fewer than 11", 0) == 0);
    CHECK(shown.pooled == std::optional<double>(0.71));
    CHECK(siteBelowMinimumCell(measure.sites[2], 11));
    CHECK_FALSE(siteBelowMinimumCell(measure.sites[0], 11));
}

TEST_CASE("A site with fewer patients than the small-cell number is counted in reports, never named", "[pooling][disclosure]")
{
    PooledMeasure measure;
    measure.measure = "c_statistic";
    measure.sites = {{"A", 500, 60, 0.7, 0.65, 0.75, 0.85, 0.1}, {"KB0000001", 4, 2, 0.5, 0.1, 0.9, 0.0, 1.0}, {"KB0000002", 3, 1, 0.5, 0.1, 0.9, 0.0, 1.0}};
    SitePooling pooling;
    pooling.models.push_back({"m", {measure}, {}});
    withholdSmallSites(pooling, 11);
    const PooledMeasure& shown = pooling.models[0].measures[0];
    REQUIRE(shown.leftOut.size() == 1);
    CHECK(shown.leftOut[0].rfind("2 sites with fewer than 11 patients: estimate withheld in reports and not named", 0) == 0);
}
