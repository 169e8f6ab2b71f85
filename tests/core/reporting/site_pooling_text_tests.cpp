// The words shared by the text output, the window and the report on pooling across sites.
#include "reporting/site_pooling_text.hpp"

#include "reporting/cautions.hpp"

#include <catch2/catch.hpp>

using namespace plumbline;

namespace {

PooledMeasure pooledOver(std::size_t k, bool withPrediction)
{
    PooledMeasure m;
    m.measure = "c_statistic";
    for (std::size_t i = 0; i < k; ++i)
        m.sites.push_back({"site " + std::to_string(i), 100, 20, 0.7, 0.6, 0.8, 0.85, 0.1});
    if (k >= 2)
        m.pool = RandomEffectsPool{};
    if (withPrediction) {
        m.predictionLower = 0.6;
        m.predictionUpper = 0.8;
    }
    return m;
}

} // namespace

TEST_CASE("One site is '1 site', not '1 sites'", "[pooling][text]")
{
    CHECK(siteCountText(1) == "1 site");
    CHECK(siteCountText(0) == "0 sites");
    CHECK(siteCountText(4) == "4 sites");
}

TEST_CASE("Two pooled sites say why there is no prediction interval", "[pooling][text]")
{
    const auto reason = noPredictionIntervalReason(pooledOver(2, false));
    REQUIRE(reason);
    CHECK(*reason == "no prediction interval for a new site: it needs at least 3 sites, 2 sites pooled");
    CHECK_FALSE(noPredictionIntervalReason(pooledOver(6, true)));
    CHECK_FALSE(noPredictionIntervalReason(pooledOver(1, false))); // not pooled at all: said elsewhere
}

TEST_CASE("The caution on few sites shows only when a measure pools fewer than 5 sites", "[pooling][text]")
{
    SitePooling many;
    many.sites = 8;
    many.models.push_back({"m", {pooledOver(8, true)}, {}});
    CHECK(siteCautionsFor(many).size() == 1);
    CHECK(siteCautionsFor(many)[0] == siteCautions[0]);
    SitePooling few = many;
    few.models[0].measures.push_back(pooledOver(4, true));
    REQUIRE(siteCautionsFor(few).size() == 2);
    CHECK(siteCautionsFor(few)[1] == siteCautions[1]);
}
