#pragma once

#include "metrics/score_order.hpp"

#include <cstddef>
#include <cstdint>
#include <optional>
#include <span>
#include <vector>

namespace plumbline {

// Counts at every threshold of a fixed grid (0, step, 2·step, …, 1; positive if risk ≥ t), so
// a view can follow a threshold slider by looking a row up instead of computing anything.
struct OperatingPoint {
    double threshold;
    std::size_t tp, fp, tn, fn;
};

std::vector<OperatingPoint> operatingPoints(std::span<const std::uint8_t> outcome, std::span<const double> risk,
                                            const ScoreOrder& order, double step);

// What a threshold means for the care team, from its counts (docs/methods.md §14): sensitivity,
// specificity, PPV, NPV, flag rate and net benefit beside treating everyone. Undefined → empty.
struct OperatingPointSummary {
    std::optional<double> sensitivity, specificity, ppv, npv;
    double flagRate = 0.0;
    double netBenefit = 0.0;
    double netBenefitTreatAll = 0.0; // empty meaning is impossible: defined for t in [0, 1)
};
OperatingPointSummary summarise(const OperatingPoint& point);

// The same patients with everyone flagged (the treat-all strategy), at the same threshold.
OperatingPoint treatAll(const OperatingPoint& point);

// Predicted risks of events and of non-events in equal-width bins over [0, 1] (the calibration
// plot's distribution strip).
struct RiskHistogram {
    std::vector<double> edges; // bins + 1
    std::vector<std::size_t> events;
    std::vector<std::size_t> nonEvents;
};
RiskHistogram riskHistogram(std::span<const std::uint8_t> outcome, std::span<const double> risk, std::size_t bins);

} // namespace plumbline
