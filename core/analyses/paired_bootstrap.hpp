#pragma once

#include "resampling/metric_bootstrap.hpp"
#include "resampling/weighted_panel.hpp"

#include <cstdint>
#include <span>
#include <string>
#include <utility>
#include <vector>

namespace plumbline {

// The per-patient facts a pair of models needs in every replicate: whether model_b moves the
// patient up or down against model_a, across the NRI cut-points and at all (category-free).
struct PairMoves {
    std::size_t modelA = 0;
    std::size_t modelB = 0;
    std::vector<std::int8_t> categorical;
    std::vector<std::int8_t> continuous;
};
PairMoves pairMoves(std::span<const double> riskA, std::span<const double> riskB, std::size_t a, std::size_t b,
                    const std::vector<double>& cutPoints);

// NRI components of one replicate from its row counts: events up − down, non-events down − up,
// for the categorical and the category-free NRI.
struct PairReplicate {
    double nriEvents, nriNonEvents, nriContinuousEvents, nriContinuousNonEvents;
};
PairReplicate pairReplicate(const PairMoves& moves, std::span<const std::uint8_t> outcome,
                            std::span<const std::uint16_t> rowCounts);

// Net benefit of one model at each threshold (positive if risk ≥ t) on weighted support points.
std::vector<double> netBenefitAt(const ModelSupport& support, const SupportCounts& counts,
                                 std::span<const double> thresholds);

// What the paired bootstrap says about one pair, difference = model_b − model_a, percentile
// intervals (the same resample for both models).
struct PairBootstrap {
    std::vector<std::pair<std::string, MetricBootstrap>> differences;
    std::vector<MetricBootstrap> netBenefitDifferences; // one per threshold
};

// Summary of paired replicate values: SE and percentile interval of the finite ones.
MetricBootstrap pairedSummary(const std::vector<double>& replicates, double confidence);

} // namespace plumbline
