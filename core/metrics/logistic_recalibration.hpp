#pragma once

#include <cstdint>
#include <optional>
#include <span>
#include <vector>

namespace plumbline {

// Risks within this margin of 0 or 1 are held at it in a regression on logits (logit ±27.6).
inline constexpr double certaintyMargin = 1e-12;

// Linear predictors logit(p), with p clamped to [1e-12, 1 − 1e-12] so that a risk of exactly
// 0 or 1 stays usable in a regression (the caller warns when clamping happened).
std::vector<double> clampedLogits(std::span<const double> risk, std::size_t* clampedCount = nullptr);

// A patient whose outcome contradicts a risk at the margin: an event at a risk of 1e-12 or
// less, or a non-event at 1 − 1e-12 or more. Such a patient would drive a calibration fit by an
// amount set by the clamp alone (1e-12, 1e-9 or 1e-15 give different slopes), so the fits leave
// them out and say how many. A patient whose outcome agrees with such a risk is kept: clamped,
// it changes the fits by a negligible amount.
inline bool contradictsOutcome(double risk, bool event)
{
    return event ? risk <= certaintyMargin : risk >= 1.0 - certaintyMargin;
}

// Grouped (binomial) data: at point k, events[k] of trials[k] patients share the linear
// predictor lp[k]. Frequency-weighted patients and bootstrap replicates are grouped data too;
// a point with no trials contributes nothing.
struct BinomialPoints {
    std::span<const double> lp;
    std::span<const double> events;
    std::span<const double> trials;
};

// Calibration-in-the-large: logit P(y=1) = α + lp with lp as offset, α by Newton's method
// with Chebyshev's second-order correction near the root (within about 1e-15 of it)
// (Van Calster et al. 2016, J Clin Epidemiol 74:167). nullopt when the fit does not converge.
struct InterceptFit {
    double alpha;
    double se;
    double logLikelihood;
};
std::optional<InterceptFit> fitCalibrationIntercept(const BinomialPoints& points, double start = 0.0);
// The same estimate for a bootstrap replicate, which reads nothing else: no standard error, no
// log-likelihood, and the predicted risks of each Newton pass computed in vector form.
// The sums of a Newton pass of the intercept fit at the predicted risk p of each point; `add`
// is the one place they are formed, so a caller that gathers them at the start (the bootstrap,
// from risks fixed over its replicates) forms the same numbers as the fit's own pass.
struct InterceptSums {
    double score = 0.0, information = 0.0, skew = 0.0;
    void add(double events, double trials, double p)
    {
        const double v = trials * p * (1.0 - p);
        score += events - trials * p;
        information += v;
        skew += v * (1.0 - 2.0 * p);
    }
};
// `atStart`, when given, holds the sums at `start` over these points: the first pass is skipped.
std::optional<double> calibrationInterceptEstimate(const BinomialPoints& points, double start,
                                                   const InterceptSums* atStart = nullptr);
std::optional<InterceptFit> fitCalibrationIntercept(std::span<const std::uint8_t> outcome, std::span<const double> lp,
                                                    std::span<const double> weights = {});
// The same with each row in the fit (1) or left out (0): a byte a row instead of a double.
// Without `withLogLikelihood` the fit's logLikelihood is 0 (a caller that reads only α and its
// standard error saves a log1p a patient).
std::optional<InterceptFit> fitCalibrationIntercept(std::span<const std::uint8_t> outcome, std::span<const double> lp,
                                                    std::span<const std::uint8_t> included, bool withLogLikelihood = true);

// Logistic recalibration: logit P(y=1) = a + b·lp by Newton–Raphson with Chebyshev's correction
// near the root (Cox 1958); a, b with Wald SEs. nullopt on separation or when lp is constant (the slope is then not identifiable).
// A warm start (the full-sample fit) saves iterations in bootstrap replicates.
struct SlopeFit {
    double intercept;
    double slope;
    double interceptSe;
    double slopeSe;
    double logLikelihood;
    double information[3]; // Fisher information at the solution: I_aa, I_ab, I_bb
};
std::optional<SlopeFit> fitCalibrationSlope(const BinomialPoints& points, double startIntercept = 0.0,
                                            double startSlope = 1.0);
// The intercept and slope alone, for a bootstrap replicate (as calibrationInterceptEstimate).
struct SlopeEstimate {
    double intercept;
    double slope;
};
// The sums of a Newton pass of the recalibration fit (score, information and the third-derivative
// moments of its second-order correction) at a point with linear predictor x and predicted risk p.
struct SlopeSums {
    double g0 = 0.0, g1 = 0.0, h00 = 0.0, h01 = 0.0, h11 = 0.0, t0 = 0.0, t1 = 0.0, t2 = 0.0, t3 = 0.0;
    void add(double x, double events, double trials, double p)
    {
        const double v = trials * p * (1.0 - p);
        const double r = events - trials * p;
        const double w = v * (1.0 - 2.0 * p);
        h00 += v;
        h01 += v * x;
        h11 += v * x * x;
        g0 += r;
        g1 += r * x;
        t0 += w;
        t1 += w * x;
        t2 += w * x * x;
        t3 += w * x * x * x;
    }
};
// `atStart`, when given, holds the sums at the start over these points: the first pass is skipped.
std::optional<SlopeEstimate> calibrationSlopeEstimate(const BinomialPoints& points, double startIntercept, double startSlope,
                                                      const SlopeSums* atStart = nullptr);
// The predicted risks expit(a + b·lp) the fits' passes use, in the same vector form (so risks
// computed once ahead give the very numbers a pass would).
void predictedRisksInto(std::span<const double> lp, double a, double b, std::vector<double>& out);
std::optional<SlopeFit> fitCalibrationSlope(std::span<const std::uint8_t> outcome, std::span<const double> lp,
                                            std::span<const double> weights = {}, double startIntercept = 0.0,
                                            double startSlope = 1.0);
std::optional<SlopeFit> fitCalibrationSlope(std::span<const std::uint8_t> outcome, std::span<const double> lp,
                                            std::span<const std::uint8_t> included);

// Log-likelihood of the unmodified risks, Σ y ln p + (1−y) ln(1−p), from clamped logits.
double logLikelihoodOfLogits(const BinomialPoints& points);
double logLikelihoodOfLogits(std::span<const std::uint8_t> outcome, std::span<const double> lp,
                             std::span<const double> weights = {});
double logLikelihoodOfLogits(std::span<const std::uint8_t> outcome, std::span<const double> lp,
                             std::span<const std::uint8_t> included);

} // namespace plumbline
