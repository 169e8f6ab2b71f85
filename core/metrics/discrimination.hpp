#pragma once

#include "metrics/estimate.hpp"
#include "metrics/score_order.hpp"

#include <cstddef>
#include <cstdint>
#include <optional>
#include <span>
#include <vector>

namespace plumbline {

// Where a C statistic's interval is built: on the logit scale (stays inside 0-1; default) or
// the plain scale (C ± z·SE).
enum class CStatisticScale { Logit, Plain };

// DeLong placement values (DeLong, DeLong & Clarke-Pearson 1988, Biometrics 44:837) computed by
// the O(n log n) mid-rank algorithm of Sun & Xu 2014 (IEEE Signal Process Lett 21:1389).
// eventPlacements[i] = V10 of the i-th event in data order, nonEventPlacements[j] = V01 likewise.
struct Placements {
    double c = 0.0;
    std::vector<double> eventPlacements;
    std::vector<double> nonEventPlacements;
};
// One sweep over the ascending order: mid-ranks among all, among events and among non-events
// come from the same tie blocks, so no further sort is needed.
Placements delongPlacements(std::span<const std::uint8_t> outcome, std::span<const double> score,
                            const ScoreOrder& order);
Placements delongPlacements(std::span<const std::uint8_t> outcome, std::span<const double> score);

// DeLong variance of one C from its placements (n−1 denominators, as in DeLong 1988; the S10/S01
// components from memory, docs/methods.md §4).
double delongVariance(const Placements& placements);
// DeLong covariance of two Cs on the same patients.
double delongCovariance(const Placements& a, const Placements& b);

// C statistic (Mann–Whitney with mid-ranks; Hanley & McNeil 1982) with the DeLong SE and a 95 %
// (or `confidence`) interval on the chosen scale. Undefined without both classes; no interval
// with fewer than two of either class or C at 0 or 1 on the logit scale.
Estimate cStatistic(const Placements& placements, CStatisticScale scale, double confidence);
Estimate cStatistic(std::span<const std::uint8_t> outcome, std::span<const double> score, CStatisticScale scale,
                    double confidence);
// The same C and interval read off the score order a tie block at a time: the patients of a block
// share their placement, so the variance is formed from each block's counts and nothing is held
// per patient (the placements, 12 bytes a patient, are needed only to pair two models). C is the
// same to the bit; the SE to within rounding, its sums running in score order instead of patient
// order.
Estimate cStatistic(std::span<const std::uint8_t> outcome, std::span<const double> score, const ScoreOrder& order,
                    CStatisticScale scale, double confidence);

// Empirical ROC curve at every distinct score (positive if score ≥ threshold), from the highest
// threshold down; the first point is (0,0) at threshold +inf, written as the top score + 1.
struct RocPoint {
    double threshold;
    double sensitivity;
    double specificity;
};
std::vector<RocPoint> rocCurve(std::span<const std::uint8_t> outcome, std::span<const double> score,
                               const ScoreOrder& order);
std::vector<RocPoint> rocCurve(std::span<const std::uint8_t> outcome, std::span<const double> score);

// Thins a ROC curve for output to at most maxPoints. Points on the straight line between their
// neighbours are dropped first (no change of area); if still too many, an even spread along the
// curve is kept with both ends, which changes the trapezoidal area by far less than 0.001 on
// dense curves (tested). Reported C statistics always come from the full data.
std::vector<RocPoint> thinRocCurve(const std::vector<RocPoint>& curve, std::size_t maxPoints);

// thinRocCurve(rocCurve(…), maxPoints) and averagePrecision of the same curve, without holding
// the curve (24 bytes per distinct score). averagePrecision is empty when a class is empty.
struct RocSummary {
    std::vector<RocPoint> thinned;
    std::optional<double> averagePrecision;
};
RocSummary rocSummary(std::span<const std::uint8_t> outcome, std::span<const double> score, const ScoreOrder& order,
                      std::size_t maxPoints);

// Area under the precision–recall curve as average precision, step-wise: Σ (R_k − R_{k−1}) P_k
// over distinct thresholds (the definition of scikit-learn's average_precision_score).
std::optional<double> averagePrecision(const std::vector<RocPoint>& curve, std::size_t events, std::size_t nonEvents);
std::optional<double> averagePrecision(std::span<const std::uint8_t> outcome, std::span<const double> score);

// Discrimination slope: mean risk among events minus among non-events (Yates 1982).
std::optional<double> discriminationSlope(std::span<const std::uint8_t> outcome, std::span<const double> risk);

} // namespace plumbline
