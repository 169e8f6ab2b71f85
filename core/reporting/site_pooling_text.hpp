#pragma once

#include "analyses/site_pooling.hpp"

#include <cstddef>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace plumbline {

// "1 site", "4 sites": the words the text output, the window and the report use alike.
std::string siteCountText(std::size_t sites);

// Why a pooled measure has no prediction interval (fewer than 3 sites: the t quantile has k − 2
// degrees of freedom, docs/methods.md §25), or nothing when it has one or is not pooled at all.
std::optional<std::string> noPredictionIntervalReason(const PooledMeasure& measure);

// The site cautions that apply: the one on few sites only when some measure pools fewer than 5.
std::vector<std::string_view> siteCautionsFor(const SitePooling& pooling);

} // namespace plumbline
