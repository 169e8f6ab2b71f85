#include "metrics/calibration_lr_tests.hpp"

#include "metrics/distributions.hpp"

#include <algorithm>

namespace plumbline {

namespace {
LikelihoodRatioTest lrTest(double reduced, double full, int df)
{
    // A tiny negative 2ΔLL can only come from rounding at convergence: clamp it to zero.
    const double statistic = std::max(0.0, 2.0 * (full - reduced));
    return {statistic, df, chiSquaredUpperTail(statistic, df)};
}
} // namespace

CalibrationLikelihoodRatioTests calibrationLikelihoodRatioTests(double original, const InterceptFit& intercept,
                                                                const SlopeFit* slope)
{
    CalibrationLikelihoodRatioTests out{std::nullopt, lrTest(original, intercept.logLikelihood, 1), std::nullopt};
    if (slope) {
        out.joint = lrTest(original, slope->logLikelihood, 2);
        out.slopeGivenIntercept = lrTest(intercept.logLikelihood, slope->logLikelihood, 1);
    }
    return out;
}

std::optional<CalibrationLikelihoodRatioTests> calibrationLikelihoodRatioTests(std::span<const std::uint8_t> outcome,
                                                                               std::span<const double> lp)
{
    const auto intercept = fitCalibrationIntercept(outcome, lp);
    const auto slope = fitCalibrationSlope(outcome, lp);
    if (!intercept || !slope)
        return std::nullopt;
    return calibrationLikelihoodRatioTests(logLikelihoodOfLogits(outcome, lp), *intercept, &*slope);
}

} // namespace plumbline
