#pragma once

#include "metrics/score_order.hpp"

#include <cstddef>
#include <cstdint>
#include <span>
#include <vector>

namespace plumbline {

// Patients whose score is at or above a threshold, by outcome class.
struct ThresholdCounts {
    std::size_t events = 0;
    std::size_t nonEvents = 0;
};

// The counts at or above each threshold, found by binary search in the shared ascending order
// and one sweep of the outcomes below the highest of them, so no per-class copy of the scores
// (a double per patient) is made. A threshold's position is the first score not below it, as
// std::lower_bound finds it in a sorted copy.
std::vector<ThresholdCounts> countsAtOrAbove(std::span<const std::uint8_t> outcome, std::span<const double> score,
                                             const ScoreOrder& order, std::span<const double> thresholds);

} // namespace plumbline
