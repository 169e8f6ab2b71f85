#pragma once

#include "metrics/loess_calibration.hpp"
#include "metrics/panel_keys.hpp"
#include "metrics/score_order.hpp"

#include <array>
#include <cstdint>
#include <optional>
#include <span>
#include <vector>

namespace plumbline {

// One model's scores collapsed to their distinct values, prepared once: every bootstrap replicate
// is then a pair of count vectors over these points, and every metric one sweep over them in
// ascending order (no sorting, no copying of rows). docs/methods.md §15.
struct ModelSupport {
    std::vector<double> x;                 // distinct scores, ascending
    std::vector<double> lp;                // clamped logits of x (risks only)
    std::vector<double> logRisk;           // ln x and ln(1 − x) (risks only): fixed, so computed once
    std::vector<double> logComplement;     // rather than in every replicate
    std::vector<std::uint32_t> rowSupport; // support point of each row
    ScoreOrder rowsInOrder;                // the rows by ascending score: counting walks them so
                                           // that its writes go in order (empty: file order)
    bool risks = true;                     // false for a points score: discrimination only
};
ModelSupport buildModelSupport(std::span<const double> score, const ScoreOrder& order, bool risks);
// The logits and logs of a support built by hand (its x filled), as buildModelSupport adds them.
void addRiskTerms(ModelSupport& support);

// Patients at each support point in one (re)sample, by outcome class; whole numbers.
struct SupportCounts {
    std::vector<double> events;
    std::vector<double> nonEvents;
};
// Adds each row's count (1 for the sample itself, the multinomial count in a replicate). Counts
// are 16-bit: a row drawn 65,536 times in one replicate has probability of order 1/65536!.
void countRows(const ModelSupport& support, std::span<const std::uint8_t> outcome,
               std::span<const std::uint16_t> rowCounts, SupportCounts& counts);
SupportCounts sampleCounts(const ModelSupport& support, std::span<const std::uint8_t> outcome);

// Starting values for the replicate fits (the full-sample estimates).
struct FitStart {
    double calibrationIntercept = 0.0;
    double recalibrationIntercept = 0.0;
    double slope = 1.0;
};

// Every scalar metric of the panel on weighted support points, each undefined value empty.
// The smoothed-curve metrics (ICI, E50, E90, Emax) are computed only when `loess` is given; the
// fitted curve at the support points `curve->at` is then left in `curve->values` (empty when the
// curve cannot be fitted).
using PanelValues = std::array<std::optional<double>, PanelMetricCount>;
// Only the smoothed-calibration metrics (ICI, E50, E90, Emax) of weightedPanel, the same values:
// for the grouped jackknife, which needs nothing else.
PanelValues smoothedCalibrationValues(const ModelSupport& support, const SupportCounts& counts, const LoessOptions& loess);

struct CurveSample {
    std::span<const std::size_t> at; // support indices
    std::vector<double> values;
};
PanelValues weightedPanel(const ModelSupport& support, const SupportCounts& counts, const FitStart& start,
                          const LoessOptions* loess, CurveSample* curve = nullptr);

// Sensitivity at fixed false-positive rates (linear interpolation along the weighted ROC curve).
std::vector<double> sensitivityAtFalsePositiveRates(const ModelSupport& support, const SupportCounts& counts,
                                                    std::span<const double> falsePositiveRates);

} // namespace plumbline
