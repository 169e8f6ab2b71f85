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
    auto below = std::partition_point(order.begin(), order.end(), [&](std::uint32_t row) { return risk[row] < t; });
    auto above = std::partition_point(below, order.end(), [&](std::uint32_t row) { return risk[row] <= t; });
    if (std::size_t(order.end() - below) > take) {
        // The tie at t crosses the capacity: t would flag too many, so the threshold moves up to
        // the next risk (if any), and t is reported as the next risk down.
        out.nextRiskDown = t;
        out.tiedAtNextRiskDown = std::size_t(above - below);
        out.flaggedAtNextRiskDown = std::size_t(order.end() - below);
        if (above == order.end())
            return out;
        const double up = risk[*above];
        below = above;
        above = std::partition_point(below, order.end(), [&](std::uint32_t row) { return risk[row] <= up; });
        out.threshold = up;
    } else
        out.threshold = t;
    out.flagged = std::size_t(order.end() - below);
    out.tiedAtThreshold = std::size_t(above - below);
    out.flaggedAboveTies = std::size_t(order.end() - above);
    return out;
}

} // namespace plumbline
