#include "metrics/threshold_counts.hpp"

#include <algorithm>
#include <numeric>

namespace plumbline {

std::vector<ThresholdCounts> countsAtOrAbove(std::span<const std::uint8_t> outcome, std::span<const double> score,
                                             const ScoreOrder& order, std::span<const double> thresholds)
{
    const std::size_t n = order.size();
    std::vector<std::size_t> position(thresholds.size());
    for (std::size_t j = 0; j < thresholds.size(); ++j) {
        const double t = thresholds[j];
        position[j] = std::size_t(std::partition_point(order.begin(), order.end(),
                                                       [&](std::uint32_t row) { return score[row] < t; })
                                  - order.begin());
    }
    // Thresholds by position, then one sweep counting the events below each.
    std::vector<std::size_t> byPosition(thresholds.size());
    std::iota(byPosition.begin(), byPosition.end(), std::size_t{0});
    std::sort(byPosition.begin(), byPosition.end(), [&](std::size_t a, std::size_t b) { return position[a] < position[b]; });
    std::vector<std::size_t> eventsBelow(thresholds.size());
    std::size_t k = 0, events = 0;
    for (const std::size_t j : byPosition) {
        for (; k < position[j]; ++k) {
            prefetchInOrder(order, k, outcome.data());
            events += outcome[order[k]];
        }
        eventsBelow[j] = events;
    }
    for (; k < n; ++k) {
        prefetchInOrder(order, k, outcome.data());
        events += outcome[order[k]];
    }
    std::vector<ThresholdCounts> out(thresholds.size());
    for (std::size_t j = 0; j < thresholds.size(); ++j) {
        out[j].events = events - eventsBelow[j];
        out[j].nonEvents = n - position[j] - out[j].events;
    }
    return out;
}

} // namespace plumbline
