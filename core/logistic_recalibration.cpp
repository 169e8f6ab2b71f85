#include "logistic_recalibration.hpp"

#include <algorithm>
#include <cmath>

namespace plumbline {

namespace {

constexpr double riskFloor = 1e-12;
constexpr int maxIterations = 100;

double weightAt(std::span<const double> weights, std::size_t i)
{
    return weights.empty() ? 1.0 : weights[i];
}

double expit(double x)
{
    return 1.0 / (1.0 + std::exp(-x));
}

// log(expit(x)) and log(1 − expit(x)) without cancellation for large |x|.
double logExpit(double x)
{
    return x >= 0 ? -std::log1p(std::exp(-x)) : x - std::log1p(std::exp(x));
}

double bernoulliLogLikelihood(std::span<const std::uint8_t> y, std::span<const double> eta, std::span<const double> w,
                              double a, double b)
{
    double ll = 0.0;
    for (std::size_t i = 0; i < y.size(); ++i) {
        const double linear = a + b * eta[i];
        ll += weightAt(w, i) * (y[i] ? logExpit(linear) : logExpit(-linear));
    }
    return ll;
}

} // namespace

std::vector<double> clampedLogits(std::span<const double> risk, std::size_t* clampedCount)
{
    std::vector<double> lp(risk.size());
    std::size_t clamped = 0;
    for (std::size_t i = 0; i < risk.size(); ++i) {
        double p = risk[i];
        if (p < riskFloor || p > 1.0 - riskFloor) {
            p = std::clamp(p, riskFloor, 1.0 - riskFloor);
            ++clamped;
        }
        lp[i] = std::log(p / (1.0 - p));
    }
    if (clampedCount)
        *clampedCount = clamped;
    return lp;
}

double logLikelihoodOfLogits(std::span<const std::uint8_t> outcome, std::span<const double> lp,
                             std::span<const double> weights)
{
    return bernoulliLogLikelihood(outcome, lp, weights, 0.0, 1.0);
}

std::optional<InterceptFit> fitCalibrationIntercept(std::span<const std::uint8_t> outcome, std::span<const double> lp,
                                                    std::span<const double> weights)
{
    double alpha = 0.0;
    for (int iteration = 0; iteration < maxIterations; ++iteration) {
        double score = 0.0;
        double information = 0.0;
        for (std::size_t i = 0; i < outcome.size(); ++i) {
            const double pi = expit(alpha + lp[i]);
            const double w = weightAt(weights, i);
            score += w * (outcome[i] - pi);
            information += w * pi * (1.0 - pi);
        }
        if (!(information > 0.0))
            return std::nullopt;
        const double step = score / information;
        alpha += step;
        if (!std::isfinite(alpha) || std::abs(alpha) > 50.0)
            return std::nullopt;
        if (std::abs(step) < 1e-10) {
            double finalInformation = 0.0;
            for (std::size_t i = 0; i < outcome.size(); ++i) {
                const double pi = expit(alpha + lp[i]);
                finalInformation += weightAt(weights, i) * pi * (1.0 - pi);
            }
            return InterceptFit{alpha, 1.0 / std::sqrt(finalInformation),
                                bernoulliLogLikelihood(outcome, lp, weights, alpha, 1.0)};
        }
    }
    return std::nullopt;
}

std::optional<SlopeFit> fitCalibrationSlope(std::span<const std::uint8_t> outcome, std::span<const double> lp,
                                            std::span<const double> weights, double startIntercept, double startSlope)
{
    double a = startIntercept;
    double b = startSlope;
    for (int iteration = 0; iteration < maxIterations; ++iteration) {
        double g0 = 0.0, g1 = 0.0, h00 = 0.0, h01 = 0.0, h11 = 0.0;
        for (std::size_t i = 0; i < outcome.size(); ++i) {
            const double pi = expit(a + b * lp[i]);
            const double w = weightAt(weights, i);
            const double r = w * (outcome[i] - pi);
            const double v = w * pi * (1.0 - pi);
            g0 += r;
            g1 += r * lp[i];
            h00 += v;
            h01 += v * lp[i];
            h11 += v * lp[i] * lp[i];
        }
        const double det = h00 * h11 - h01 * h01;
        if (!(det > 1e-12 * std::max(1.0, h00 * h11)))
            return std::nullopt; // constant lp or a degenerate fit
        const double da = (h11 * g0 - h01 * g1) / det;
        const double db = (h00 * g1 - h01 * g0) / det;
        a += da;
        b += db;
        if (!std::isfinite(a) || !std::isfinite(b) || std::abs(b) > 1e3)
            return std::nullopt; // diverging: (quasi-)separation
        if (std::abs(da) < 1e-10 && std::abs(db) < 1e-10) {
            // Wald SEs from the information at the solution.
            double k00 = 0.0, k01 = 0.0, k11 = 0.0;
            for (std::size_t i = 0; i < outcome.size(); ++i) {
                const double pi = expit(a + b * lp[i]);
                const double v = weightAt(weights, i) * pi * (1.0 - pi);
                k00 += v;
                k01 += v * lp[i];
                k11 += v * lp[i] * lp[i];
            }
            const double d = k00 * k11 - k01 * k01;
            return SlopeFit{a, b, std::sqrt(k11 / d), std::sqrt(k00 / d),
                            bernoulliLogLikelihood(outcome, lp, weights, a, b)};
        }
    }
    return std::nullopt;
}

} // namespace plumbline
