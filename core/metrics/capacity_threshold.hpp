#pragma once

#include "metrics/score_order.hpp"

#include <cstddef>
#include <optional>
#include <span>

namespace plumbline {

// The threshold that flags a given number of patients, highest risk first, with "flagged" meaning
// risk ≥ threshold as everywhere in the panel: the requested-th highest risk. When risks are tied
// at that boundary no threshold flags exactly the number; the threshold then flags every tied
// patient (more than requested), and the counts say so exactly (docs/methods.md, "Operating by
// capacity").
struct CapacityThreshold {
    std::size_t requested = 0;         // patients the team can take
    std::optional<double> threshold;   // empty when nobody is requested (or there are no patients)
    std::size_t flagged = 0;           // patients with risk ≥ threshold
    std::size_t tiedAtThreshold = 0;   // patients whose risk equals the threshold
    std::size_t flaggedAboveTies = 0;  // patients with risk > threshold: the next threshold up flags these
    bool exact() const { return flagged == requested; }
};

// `order` holds the rows to consider in ascending risk (a model's ascendingOrder, or that order
// filtered to some rows); `requested` larger than the rows is taken as all of them.
CapacityThreshold capacityThreshold(std::span<const double> risk, std::span<const std::uint32_t> order, std::size_t requested);

// How many of the rows in `order` (ascending risk) have risk ≥ threshold: a binary search.
std::size_t flaggedAtOrAbove(std::span<const double> risk, std::span<const std::uint32_t> order, double threshold);

} // namespace plumbline
