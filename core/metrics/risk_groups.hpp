#pragma once

#include "metrics/estimate.hpp"
#include "metrics/score_order.hpp"

#include <cstddef>
#include <cstdint>
#include <optional>
#include <span>
#include <vector>

namespace plumbline {

// One row of the risk-group (decile) table.
struct RiskGroup {
    std::size_t group;  // 1-based
    std::size_t n;
    std::size_t events;
    double expected;    // Σ p
    double meanPredicted;
    double observedRate;
    double ciLower;     // binomial CI of the observed rate
    double ciUpper;
    double riskMin;
    double riskMax;
};

// Groups of about N/g patients by ascending risk; a block of equal risks is never split across
// groups, and a last group smaller than half the target is merged into the previous one
// (tie-aware grouping as documented for general-purpose packages; docs/methods.md §10).
std::vector<RiskGroup> riskGroups(std::span<const std::uint8_t> outcome, std::span<const double> risk,
                                  const ScoreOrder& order, std::size_t groups, double confidence, CiMethod method);
std::vector<RiskGroup> riskGroups(std::span<const std::uint8_t> outcome, std::span<const double> risk,
                                  std::size_t groups, double confidence, CiMethod method);

// Hosmer–Lemeshow Ĉ over those groups (Hosmer & Lemeshow 1980) with df = number of groups
// formed (external validation: no parameter was estimated on these data; Hosmer, Lemeshow &
// Sturdivant 2013, from memory; docs/methods.md §10). nullopt when a
// group's mean risk is 0 or 1 or fewer than two groups could be formed.
struct HosmerLemeshowTest {
    double statistic;
    std::size_t df;
    std::size_t groups;
    double pValue;
};
std::optional<HosmerLemeshowTest> hosmerLemeshow(const std::vector<RiskGroup>& groups);

} // namespace plumbline
