#pragma once

#include "metrics/threshold_counts.hpp"
#include "resampling/weighted_panel.hpp"

#include <optional>
#include <span>
#include <vector>

namespace plumbline {

// The decision curve of one model (Vickers & Elkin 2006, Med Decis Making 26:565): net benefit
// NB(t) = TP/N − FP/N · t/(1−t) over a range of thresholds, beside treating everyone
// (φ − (1−φ)·t/(1−t)) and no one (0); standardised NB = NB/φ (Kerr et al. 2016); the net
// reduction in interventions per 100 patients against treat-all = (NB − NB_all)/(t/(1−t))·100
// (Vickers et al. 2008). Bootstrap bands are filled in by the engine.
struct DecisionCurvePoint {
    double threshold = 0.0;
    double netBenefit = 0.0;
    double treatAll = 0.0;
    double standardized = 0.0;
    double netReductionPer100 = 0.0;
    std::optional<double> lower, upper; // pointwise bootstrap band of the net benefit
};

// Thresholds from `from` to `to` in steps of `step` (each in (0, 1)).
std::vector<double> decisionGrid(double from, double to, double step);

std::vector<DecisionCurvePoint> decisionCurve(const ModelSupport& support, const SupportCounts& counts,
                                              std::span<const double> thresholds);
// The same from the patients at or above each threshold (countsAtOrAbove) and the sample's
// events and size: for the full sample, which then needs no support points.
std::vector<DecisionCurvePoint> decisionCurve(std::span<const ThresholdCounts> above, std::size_t events, std::size_t n,
                                              std::span<const double> thresholds);

} // namespace plumbline
