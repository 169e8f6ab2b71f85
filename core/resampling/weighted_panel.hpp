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

// Starting values for the replicate fits (the full-sample estimates).
struct FitStart {
    double calibrationIntercept = 0.0;
    double recalibrationIntercept = 0.0;
    double slope = 1.0;
};

// The predicted risks of the two calibration fits at their start, at every support point:
// expit(α + lp) and expit(a + b·lp). Fixed over the replicates, so a replicate's first Newton
// pass reads them instead of computing them.
struct StartRisks {
    FitStart start;
    std::vector<double> intercept;
    std::vector<double> slope;
};

// One model's scores collapsed to their distinct values, prepared once: every bootstrap replicate
// is then a pair of count vectors over these points, and every metric one sweep over them in
// ascending order (no sorting, no copying of rows). docs/methods.md §15.
struct ModelSupport {
    std::vector<double> x;                 // distinct scores, ascending
    std::vector<double> lp;                // clamped logits of x (risks only)
    std::vector<double> logRisk;           // ln x and ln(1 − x) (risks only; 0 where infinite): fixed, so computed once
    std::vector<double> logComplement;     // rather than in every replicate
    std::vector<std::uint32_t> rowSupport; // support point of each row
    ScoreOrder rowsInOrder;                // the rows by ascending score: counting walks them so
                                           // that its writes go in order (empty: file order)
    bool risks = true;                     // false for a points score: discrimination only
    std::optional<StartRisks> startRisks;  // for fits that start where these did (addStartRisks)
    // The rows in score order packed with their outcome (bit 31) and whether each is the first
    // row of its point (bit 30), so that counting reads neither from row-sized arrays at random;
    // built by packRowsInOrder for one outcome vector and used only with that one.
    std::vector<std::uint32_t> packedRows;
    const std::uint8_t* packedOutcome = nullptr;
};
ModelSupport buildModelSupport(std::span<const double> score, const ScoreOrder& order, bool risks);
// The logits and logs of a support built by hand (its x filled), as buildModelSupport adds them.
void addRiskTerms(ModelSupport& support);
// Packs the rows in score order with `outcome` (kept alive by the caller for as long as the
// support counts with it). Nothing is packed for 2^30 rows or more: counting then looks them up.
void packRowsInOrder(ModelSupport& support, std::span<const std::uint8_t> outcome);
// The fits' predicted risks at `start` (a support of risks only), for replicates starting there.
void addStartRisks(ModelSupport& support, const FitStart& start);

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

// Every scalar metric of the panel on weighted support points, each undefined value empty.
// The smoothed-curve metrics (ICI, E50, E90, Emax) are computed only when `loess` is given; the
// fitted curve at the support points `curve->at` is then left in `curve->values` (empty when the
// curve cannot be fitted).
using PanelValues = std::array<std::optional<double>, PanelMetricCount>;
// Only the smoothed-calibration metrics (ICI, E50, E90, Emax) of weightedPanel, the same values:
// for the grouped jackknife, which needs nothing else.
PanelValues smoothedCalibrationValues(const ModelSupport& support, const SupportCounts& counts, const LoessOptions& loess);

// What a replicate reads from the top threshold down, gathered in the sweep that gives the
// average precision (one pass over the points instead of four): sensitivity at fixed
// false-positive rates (the ROC band) and net benefit at sets of thresholds (the report's
// thresholds and the decision curve's grid).
struct FromTheTop {
    std::span<const double> falsePositiveRates;         // ascending
    std::vector<std::span<const double>> thresholdSets; // each in any order
    std::vector<double> sensitivity;                    // out: one per rate
    std::vector<std::vector<double>> netBenefit;        // out: one per threshold, per set
};
// The sweep alone, with the totals of the counts.
void sweepFromTheTop(const ModelSupport& support, const SupportCounts& counts, double events, double nonEvents,
                     FromTheTop& request, double* averagePrecision = nullptr);

struct CurveSample {
    std::span<const std::size_t> at; // support indices
    std::vector<double> values;
};
// `fromTop`, when given, is filled in the same pass as the average precision.
PanelValues weightedPanel(const ModelSupport& support, const SupportCounts& counts, const FitStart& start,
                          const LoessOptions* loess, CurveSample* curve = nullptr, FromTheTop* fromTop = nullptr);

// Sensitivity at fixed false-positive rates (linear interpolation along the weighted ROC curve).
std::vector<double> sensitivityAtFalsePositiveRates(const ModelSupport& support, const SupportCounts& counts,
                                                    std::span<const double> falsePositiveRates);

} // namespace plumbline
