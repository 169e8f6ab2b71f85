#pragma once

#include <span>
#include <utility>
#include <vector>

namespace plumbline {

// R's type-7 quantile (numpy's default) of a multiset given as values with counts, by weighted
// selection in expected linear time. Counts are whole numbers; values are reordered.
double weightedQuantileType7(std::vector<std::pair<double, double>>& valueCounts, double probability);

// The same quantiles, several at once, of non-negative finite values (every entry finite) with
// whole-number counts (entries with a zero count are not in the multiset), without moving the
// values: one pass
// spreads the counts over equal-width buckets of [0, max], only the few buckets holding a wanted
// rank are then sorted. Each value at a rank is unique, so the result equals the selection
// above exactly. `total` is the sum of the counts; `out` gets one value per probability;
// `largest`, the largest value with a count, is found here unless the caller knows it.
void weightedQuantilesType7(std::span<const double> values, std::span<const double> counts, double total,
                            std::span<const double> probabilities, std::span<double> out, double largest = -1.0);

} // namespace plumbline
