#include "metrics/capacity_threshold.hpp"

#include <algorithm>

namespace plumbline {

std::size_t flaggedAtOrAbove(std::span<const double> risk, std::span<const std::uint32_t> order, double threshold)
{
    // The rows below the threshold come first in ascending order.
    const auto first = std::partition_point(order.begin(), order.end(), [&](std::uint32_t row) { return risk[row] < threshold; });
    return std::size_t(order.end() - first);
}

CapacityThreshold capacityThreshold(std::span<const double> risk, std::span<const std::uint32_t> order, std::size_t requested)
{
    CapacityThreshold out;
    out.requested = requested;
    const std::size_t n = order.size();
    const std::size_t take = std::min(requested, n);
    if (take == 0)
        return out;
    const double t = risk[order[n - take]];
    out.threshold = t;
    const auto below = std::partition_point(order.begin(), order.end(), [&](std::uint32_t row) { return risk[row] < t; });
    const auto above = std::partition_point(below, order.end(), [&](std::uint32_t row) { return risk[row] <= t; });
    out.flagged = std::size_t(order.end() - below);
    out.tiedAtThreshold = std::size_t(above - below);
    out.flaggedAboveTies = std::size_t(order.end() - above);
    return out;
}

} // namespace plumbline
