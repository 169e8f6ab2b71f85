#pragma once

#include "analyses/site_pooling.hpp"

#include <cstddef>

namespace plumbline {

// The small-cell rule on pooling across sites, for reports: a site with fewer than `minimumCell`
// patients, events or non-events keeps no estimate of its own (it is taken off each measure's
// sites, with a note); the pooled values, which combine every site, stay. Reports print no
// site's counts, so nothing else is withheld.
void withholdSmallSites(SitePooling& pooling, std::size_t minimumCell);

// Whether a site is below the rule.
bool siteBelowMinimumCell(const SiteEstimate& site, std::size_t minimumCell);

} // namespace plumbline
