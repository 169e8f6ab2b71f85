#pragma once

#include "metrics/binomial_interval.hpp"
#include "metrics/score_order.hpp"

#include <cstddef>
#include <cstdint>
#include <optional>
#include <span>
#include <vector>

namespace plumbline {

// Classification at a decision threshold t; "positive" means p ≥ t (stated in every output).
// Net benefit NB = TP/N − FP/N · t/(1−t) (Vickers & Elkin 2006, Med Decis Making 26:565);
// treat-all NB = φ − (1−φ)·t/(1−t); number needed to evaluate = 1/PPV (Romero-Brufau et al. 2015).
// Proportions carry Wilson (or Clopper–Pearson) intervals; an undefined proportion is nullopt.
struct ProportionWithCi {
    std::optional<double> value;
    std::optional<Interval> ci;
};

struct ThresholdMetrics {
    double threshold;
    std::size_t tp = 0, fp = 0, tn = 0, fn = 0;
    ProportionWithCi sensitivity, specificity, ppv, npv, flagRate;
    std::optional<double> numberNeededToEvaluate;
    double netBenefit = 0.0;
    double netBenefitTreatAll = 0.0;
};

// thresholds must lie in (0, 1).
std::vector<ThresholdMetrics> thresholdMetrics(std::span<const std::uint8_t> outcome, std::span<const double> risk,
                                               const ScoreOrder& order, std::span<const double> thresholds,
                                               double confidence, CiMethod method);
std::vector<ThresholdMetrics> thresholdMetrics(std::span<const std::uint8_t> outcome, std::span<const double> risk,
                                               std::span<const double> thresholds, double confidence, CiMethod method);

} // namespace plumbline
