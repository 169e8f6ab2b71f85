#include "reporting/site_pooling_text.hpp"

#include "reporting/cautions.hpp"

#include <algorithm>

namespace plumbline {

std::string siteCountText(std::size_t sites)
{
    return std::to_string(sites) + (sites == 1 ? " site" : " sites");
}

std::optional<std::string> noPredictionIntervalReason(const PooledMeasure& measure)
{
    if (!measure.pool || measure.predictionLower)
        return std::nullopt;
    return "no prediction interval for a new site: it needs at least 3 sites, " + siteCountText(measure.sites.size()) + " pooled";
}

std::vector<std::string_view> siteCautionsFor(const SitePooling& pooling)
{
    // siteCautions[1] is the caution on few sites; the fewest sites any measure pooled decides it.
    std::size_t fewest = pooling.sites;
    for (const auto& model : pooling.models)
        for (const auto& measure : model.measures)
            if (measure.pool)
                fewest = std::min(fewest, measure.sites.size());
    std::vector<std::string_view> out{siteCautions[0]};
    if (fewest < fewestSitesForTau2)
        out.push_back(siteCautions[1]);
    return out;
}

} // namespace plumbline
