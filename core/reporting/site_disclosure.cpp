#include "reporting/site_disclosure.hpp"

#include <algorithm>
#include <string>

namespace plumbline {

bool siteBelowMinimumCell(const SiteEstimate& site, std::size_t minimumCell)
{
    return site.n < minimumCell || site.events < minimumCell || site.n - site.events < minimumCell;
}

void withholdSmallSites(SitePooling& pooling, std::size_t minimumCell)
{
    for (auto& model : pooling.models)
        for (auto& measure : model.measures) {
            std::vector<SiteEstimate> kept;
            std::size_t unnamed = 0;
            for (const auto& site : measure.sites) {
                if (!siteBelowMinimumCell(site, minimumCell)) {
                    kept.push_back(site);
                    continue;
                }
                if (site.n < minimumCell) { // too small to be named at all: counted below
                    ++unnamed;
                    continue;
                }
                measure.leftOut.push_back(site.site + ": estimate withheld in reports (fewer than " + std::to_string(minimumCell)
                                          + " patients, events or non-events); it is part of the pooled value.");
            }
            if (unnamed > 0)
                measure.leftOut.push_back(std::to_string(unnamed) + (unnamed == 1 ? " site" : " sites") + " with fewer than "
                                          + std::to_string(minimumCell)
                                          + " patients: estimate withheld in reports and not named (small-cell rule); part of the pooled value.");
            measure.sites = std::move(kept);
        }
}

} // namespace plumbline
