#pragma once

#include "metrics/logistic_recalibration.hpp"

#include <cstdint>
#include <optional>
#include <span>

namespace plumbline {

// The three likelihood-ratio tests of the calibration framework (docs/methods.md §7;
// Cox 1958, Miller, Hui & Tierney 1991): joint a = 0, b = 1 (2 df); calibration-in-the-large
// (1 df); slope given calibration-in-the-large (1 df). Statistics are 2·ΔLL, p from χ².
struct LikelihoodRatioTest {
    double statistic;
    int df;
    double pValue;
};

// Calibration-in-the-large needs only the intercept fit; the other two need the slope fit too,
// and are empty when it cannot be made (separation, constant risks).
struct CalibrationLikelihoodRatioTests {
    std::optional<LikelihoodRatioTest> joint;
    LikelihoodRatioTest interceptOnly;
    std::optional<LikelihoodRatioTest> slopeGivenIntercept;
};

// From fits already made (no refitting): the log-likelihoods of the unmodified risks, of the
// intercept-only and (when there is one) of the intercept-and-slope recalibration.
CalibrationLikelihoodRatioTests calibrationLikelihoodRatioTests(double logLikelihoodOriginal, const InterceptFit& intercept,
                                                                const SlopeFit* slope);

// Fits both models first; nullopt when either is not estimable (one class, separation,
// constant risks).
std::optional<CalibrationLikelihoodRatioTests> calibrationLikelihoodRatioTests(std::span<const std::uint8_t> outcome,
                                                                               std::span<const double> lp);

} // namespace plumbline
