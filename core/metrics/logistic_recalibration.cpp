#include "metrics/logistic_recalibration.hpp"

#include "metrics/vector_expit.hpp"

#include <algorithm>
#include <cmath>
#include <vector>

namespace plumbline {

namespace {

constexpr int maxIterations = 100;
// A Newton step below this ends a fit after one more order of correction: the error left is
// then of order 1e-15 (cubed), far inside the 1e-10 the fits are held to.
constexpr double converged = 1e-5;
// Steps smaller than this (in the linear predictor) get the second-order correction; a larger
// one, far from the root, is a plain Newton step.
constexpr double correctable = 0.1;

// The information (and, when asked, the log-likelihood) at a fit's solution, in one pass with
// one exp and one log1p a point: p and the log-risks all come from e = exp(−|a + b·lp|), so the
// standard errors and the likelihood-ratio tests cost one pass instead of an information pass
// plus a log-likelihood pass with an exp of its own.
struct AtSolution {
    double h00 = 0.0, h01 = 0.0, h11 = 0.0, logLikelihood = 0.0;
};

template <typename Points>
AtSolution atSolution(const Points& d, double a, double b, bool withLogLikelihood)
{
    AtSolution s;
    for (std::size_t k = 0; k < d.lp.size(); ++k) {
        const double trials = d.trials[k];
        if (trials <= 0.0)
            continue;
        const double x = d.lp[k];
        const double linear = a + b * x;
        const double e = std::exp(-std::abs(linear));
        const double p = linear >= 0.0 ? 1.0 / (1.0 + e) : e / (1.0 + e);
        const double v = trials * p * (1.0 - p);
        s.h00 += v;
        s.h01 += v * x;
        s.h11 += v * x * x;
        if (withLogLikelihood) {
            // log p and log(1 − p) without cancellation: −log1p(e) on the side of the sign,
            // −|linear| − log1p(e) on the other.
            const double tail = std::log1p(e);
            const double logP = linear >= 0.0 ? -tail : linear - tail;
            const double logQ = linear >= 0.0 ? -linear - tail : -tail;
            const double events = d.events[k];
            const double nonEvents = trials - events;
            s.logLikelihood += (events > 0.0 ? events * logP : 0.0) + (nonEvents > 0.0 ? nonEvents * logQ : 0.0);
        }
    }
    return s;
}

// Calls add(k, p) for every point in order, p = expit(a + b·lp[k]) computed in vector lanes a
// block at a time: the risks of a block stay in the cache between being computed and being
// summed (a million of them written out and read back cost more than computing them).
// An odd count's last risk is computed with the scalar exp, as Eigen's vectorised expression,
// which these passes used before, computed it (its vector loop takes pairs): every fit stays the
// same to the bit.
template <typename Add>
void forEachPredictedRisk(std::span<const double> lp, double a, double b, Add&& add)
{
    constexpr std::size_t block = 256;
    alignas(32) double risks[block];
    const std::size_t n = lp.size();
    const std::size_t paired = n - n % 2;
    for (std::size_t start = 0; start < n; start += block) {
        const std::size_t count = std::min(block, n - start);
        const std::size_t inLanes = std::min(count, paired - start);
        vectorExpit(lp.data() + start, inLanes, a, b, risks);
        for (std::size_t k = inLanes; k < count; ++k)
            risks[k] = 1.0 / (1.0 + std::exp(-(a + b * lp[start + k])));
        for (std::size_t k = 0; k < count; ++k)
            add(start + k, risks[k]);
    }
}

// Rows (0/1 outcome, optional frequency weights) read as grouped data, one point per row,
// without copying them into two more row-sized arrays: a row's trials and events are worked out
// where a sum reads them, as the same doubles a copy would hold, so every sum is unchanged.
// Weights: doubles (frequency weights), or bytes 1 and 0 (in the fit or left out), read as the
// doubles 1.0 and 0.0.
template <typename Weight>
struct RowTrials {
    std::span<const Weight> weights;
    double operator[](std::size_t i) const { return weights.empty() ? 1.0 : double(weights[i]); }
};
template <typename Weight>
struct RowEvents {
    std::span<const std::uint8_t> outcome;
    RowTrials<Weight> trials;
    double operator[](std::size_t i) const { return outcome[i] ? trials[i] : 0.0; }
};
template <typename Weight>
struct RowPoints {
    std::span<const double> lp;
    RowEvents<Weight> events;
    RowTrials<Weight> trials;
    RowPoints(std::span<const std::uint8_t> outcome, std::span<const double> logits, std::span<const Weight> weights)
        : lp(logits)
        , events{outcome, {weights}}
        , trials{weights}
    {
    }
};

} // namespace

void predictedRisksInto(std::span<const double> lp, double a, double b, std::vector<double>& out)
{
    out.resize(lp.size());
    forEachPredictedRisk(lp, a, b, [&](std::size_t k, double p) { out[k] = p; });
}

std::vector<double> clampedLogits(std::span<const double> risk, std::size_t* clampedCount)
{
    std::vector<double> lp(risk.size());
    std::size_t clamped = 0;
    for (std::size_t i = 0; i < risk.size(); ++i) {
        double p = risk[i];
        if (p < certaintyMargin || p > 1.0 - certaintyMargin) {
            p = std::clamp(p, certaintyMargin, 1.0 - certaintyMargin);
            ++clamped;
        }
        lp[i] = std::log(p / (1.0 - p));
    }
    if (clampedCount)
        *clampedCount = clamped;
    return lp;
}

double logLikelihoodOfLogits(const BinomialPoints& points)
{
    return atSolution(points, 0.0, 1.0, true).logLikelihood;
}

double logLikelihoodOfLogits(std::span<const std::uint8_t> outcome, std::span<const double> lp,
                             std::span<const double> weights)
{
    return atSolution(RowPoints<double>(outcome, lp, weights), 0.0, 1.0, true).logLikelihood;
}

double logLikelihoodOfLogits(std::span<const std::uint8_t> outcome, std::span<const double> lp,
                             std::span<const std::uint8_t> included)
{
    return atSolution(RowPoints<std::uint8_t>(outcome, lp, included), 0.0, 1.0, true).logLikelihood;
}

namespace {

// Chebyshev's method for the intercept: the Newton step s = S/I corrected by its second-order
// term, δ = s − ½(J/I)s² with J = Σ n·p(1−p)(1−2p), so each pass leaves an error of order s³
// instead of s². A pass whose Newton step is below `converged` ends the fit within about 1e-15
// of the root. Points: BinomialPoints, or RowPoints read in place.
template <typename Points>
std::optional<double> chebyshevIntercept(const Points& d, double start, const InterceptSums* atStart)
{
    double alpha = start;
    for (int iteration = 0; iteration < maxIterations; ++iteration) {
        InterceptSums sums;
        if (iteration == 0 && atStart) {
            sums = *atStart;
        } else {
            forEachPredictedRisk(d.lp, alpha, 1.0,
                                 [&](std::size_t k, double p) { sums.add(d.events[k], d.trials[k], p); });
        }
        const auto [score, information, skew] = sums;
        if (!(information > 0.0))
            return std::nullopt;
        const double newton = score / information;
        const bool close = std::abs(newton) < converged;
        const bool corrected = std::abs(newton) < correctable;
        alpha += corrected ? newton - 0.5 * skew / information * newton * newton : newton;
        if (!std::isfinite(alpha) || std::abs(alpha) > 50.0)
            return std::nullopt;
        if (close)
            return alpha;
    }
    return std::nullopt;
}

template <typename Points>
std::optional<InterceptFit> interceptFit(const Points& d, double start, bool withLogLikelihood)
{
    const auto alpha = chebyshevIntercept(d, start, nullptr);
    if (!alpha)
        return std::nullopt;
    const AtSolution s = atSolution(d, *alpha, 1.0, withLogLikelihood);
    if (!(s.h00 > 0.0))
        return std::nullopt;
    return InterceptFit{*alpha, 1.0 / std::sqrt(s.h00), s.logLikelihood};
}

// Chebyshev's method in two parameters: the Newton step s = H⁻¹g corrected by −½H⁻¹T[s,s], T the
// third derivative of the log-likelihood, whose contraction needs the moments
// Σ n·p(1−p)(1−2p)·lp^j, j = 0…3, gathered in the same pass.
template <typename Points>
std::optional<SlopeEstimate> chebyshevSlope(const Points& d, double startIntercept, double startSlope, const SlopeSums* atStart)
{
    double a = startIntercept, b = startSlope;
    double largestLp = 0.0;
    for (const double x : d.lp)
        largestLp = std::max(largestLp, std::abs(x));
    for (int iteration = 0; iteration < maxIterations; ++iteration) {
        SlopeSums sums;
        if (iteration == 0 && atStart) {
            sums = *atStart;
        } else {
            forEachPredictedRisk(d.lp, a, b,
                                 [&](std::size_t k, double p) { sums.add(d.lp[k], d.events[k], d.trials[k], p); });
        }
        const auto [g0, g1, h00, h01, h11, t0, t1, t2, t3] = sums;
        const double det = h00 * h11 - h01 * h01;
        if (!(det > 1e-12 * std::max(1.0, h00 * h11)))
            return std::nullopt; // constant lp or a degenerate fit
        const double da = (h11 * g0 - h01 * g1) / det;
        const double db = (h00 * g1 - h01 * g0) / det;
        // Converged when the step moves no patient's linear predictor by more than `converged`.
        const double move = std::abs(da) + std::abs(db) * largestLp;
        const bool close = move < converged;
        if (move < correctable) {
            const double c0 = da * da * t0 + 2.0 * da * db * t1 + db * db * t2;
            const double c1 = da * da * t1 + 2.0 * da * db * t2 + db * db * t3;
            a += da - 0.5 * (h11 * c0 - h01 * c1) / det;
            b += db - 0.5 * (h00 * c1 - h01 * c0) / det;
        } else {
            a += da;
            b += db;
        }
        if (!std::isfinite(a) || !std::isfinite(b) || std::abs(b) > 1e3)
            return std::nullopt; // diverging: (quasi-)separation
        if (close)
            return SlopeEstimate{a, b};
    }
    return std::nullopt;
}

template <typename Points>
std::optional<SlopeFit> slopeFit(const Points& d, double startIntercept, double startSlope)
{
    const auto estimate = chebyshevSlope(d, startIntercept, startSlope, nullptr);
    if (!estimate)
        return std::nullopt;
    const AtSolution s = atSolution(d, estimate->intercept, estimate->slope, true);
    const double det = s.h00 * s.h11 - s.h01 * s.h01;
    if (!(det > 0.0))
        return std::nullopt;
    return SlopeFit{estimate->intercept, estimate->slope, std::sqrt(s.h11 / det), std::sqrt(s.h00 / det), s.logLikelihood,
                    {s.h00, s.h01, s.h11}};
}

} // namespace

std::optional<InterceptFit> fitCalibrationIntercept(const BinomialPoints& d, double start)
{
    return interceptFit(d, start, true);
}

std::optional<double> calibrationInterceptEstimate(const BinomialPoints& d, double start, const InterceptSums* atStart)
{
    return chebyshevIntercept(d, start, atStart);
}

std::optional<InterceptFit> fitCalibrationIntercept(std::span<const std::uint8_t> outcome, std::span<const double> lp,
                                                    std::span<const double> weights)
{
    return interceptFit(RowPoints<double>(outcome, lp, weights), 0.0, true);
}

std::optional<InterceptFit> fitCalibrationIntercept(std::span<const std::uint8_t> outcome, std::span<const double> lp,
                                                    std::span<const std::uint8_t> included, bool withLogLikelihood)
{
    return interceptFit(RowPoints<std::uint8_t>(outcome, lp, included), 0.0, withLogLikelihood);
}

std::optional<SlopeFit> fitCalibrationSlope(const BinomialPoints& d, double startIntercept, double startSlope)
{
    return slopeFit(d, startIntercept, startSlope);
}

std::optional<SlopeEstimate> calibrationSlopeEstimate(const BinomialPoints& d, double startIntercept, double startSlope,
                                                      const SlopeSums* atStart)
{
    return chebyshevSlope(d, startIntercept, startSlope, atStart);
}

std::optional<SlopeFit> fitCalibrationSlope(std::span<const std::uint8_t> outcome, std::span<const double> lp,
                                            std::span<const double> weights, double startIntercept, double startSlope)
{
    return slopeFit(RowPoints<double>(outcome, lp, weights), startIntercept, startSlope);
}

std::optional<SlopeFit> fitCalibrationSlope(std::span<const std::uint8_t> outcome, std::span<const double> lp,
                                            std::span<const std::uint8_t> included)
{
    return slopeFit(RowPoints<std::uint8_t>(outcome, lp, included), 0.0, 1.0);
}

} // namespace plumbline
