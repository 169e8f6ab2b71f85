#pragma once

#include <cstdint>
#include <span>
#include <vector>

namespace plumbline {

// Row indices ordered by ascending score (ties by row index, so the order is deterministic).
// Computed once per model and shared by every metric: the C statistic and DeLong placements,
// the ROC and precision–recall curves, threshold counts, risk groups and the loess curve all
// sweep this order instead of sorting again.
using ScoreOrder = std::vector<std::uint32_t>;

ScoreOrder ascendingOrder(std::span<const double> score);

} // namespace plumbline
