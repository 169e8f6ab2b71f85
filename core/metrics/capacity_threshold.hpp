#pragma once

#include "metrics/score_order.hpp"

#include <cstddef>
#include <optional>
#include <span>

namespace plumbline {

// The threshold that flags at most a given number of patients, highest risk first, with "flagged"
// meaning risk ≥ threshold as everywhere in the panel: a capacity is a ceiling. Without ties it is
// the requested-th highest risk. When risks are tied across that boundary no threshold flags
// exactly the number; the threshold is then the next risk up (the highest count not above the
// capacity), and the counts say how many are tied at the next risk down and how many that lower
// threshold would flag (docs/methods.md, "Operating by capacity").
struct CapacityThreshold {
    std::size_t requested = 0;         // patients the team can take
    std::optional<double> threshold;   // empty when nobody is flagged (nobody requested, no patients, or the
                                       // highest risk alone is shared by more than the capacity)
    std::size_t flagged = 0;           // patients with risk ≥ threshold, never more than requested
    std::size_t tiedAtThreshold = 0;   // patients whose risk equals the threshold
    std::size_t flaggedAboveTies = 0;  // patients with risk > threshold: the next threshold up flags these
    // Ties across the capacity: the patients sharing the next risk down (the requested-th highest
    // risk) and how many a threshold there would flag (more than requested); both 0 when no tie
    // crosses the capacity.
    std::optional<double> nextRiskDown;
    std::size_t tiedAtNextRiskDown = 0;
    std::size_t flaggedAtNextRiskDown = 0;
    bool exact() const { return flagged == requested; }
    bool tiesCrossCapacity() const { return tiedAtNextRiskDown > 0; }
};

// `order` holds the rows to consider in ascending risk (a model's ascendingOrder, or that order
// filtered to some rows); `requested` larger than the rows is taken as all of them.
CapacityThreshold capacityThreshold(std::span<const double> risk, std::span<const std::uint32_t> order, std::size_t requested);

// How many of the rows in `order` (ascending risk) have risk ≥ threshold: a binary search.
std::size_t flaggedAtOrAbove(std::span<const double> risk, std::span<const std::uint32_t> order, double threshold);

} // namespace plumbline
