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
// The same order, sorted on `threads` threads (two at most) for a large cohort.
ScoreOrder ascendingOrder(std::span<const double> score, unsigned threads);

// A walk in score order reads each row's values at random places in arrays far larger than the
// cache (ten million rows). Asking for the values of the row a few places on, before they are
// needed, lets those misses overlap instead of each waiting for the last. Changes no result.
template <typename... Values>
inline void prefetchInOrder(const ScoreOrder& order, std::size_t k, const Values*... arrays)
{
    constexpr std::size_t ahead = 16;
    if (k + ahead < order.size()) {
        const std::uint32_t row = order[k + ahead];
        (__builtin_prefetch(arrays + row), ...);
    }
}

} // namespace plumbline
