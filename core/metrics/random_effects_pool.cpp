#include "metrics/random_effects_pool.hpp"

#include "metrics/distributions.hpp"

#include <algorithm>
#include <cmath>

namespace plumbline {

namespace {

struct Sums {
    double w = 0.0, w2 = 0.0, wy = 0.0;
};

Sums sumsFor(std::span<const double> y, std::span<const double> v, double tau2)
{
    Sums s;
    for (std::size_t i = 0; i < y.size(); ++i) {
        const double w = 1.0 / (v[i] + tau2);
        s.w += w;
        s.w2 += w * w;
        s.wy += w * y[i];
    }
    return s;
}

// Cochran's Q about the fixed-effect (τ² = 0) mean.
double cochranQ(std::span<const double> y, std::span<const double> v)
{
    const Sums s = sumsFor(y, v, 0.0);
    const double mean = s.wy / s.w;
    double q = 0.0;
    for (std::size_t i = 0; i < y.size(); ++i)
        q += (y[i] - mean) * (y[i] - mean) / v[i];
    return q;
}

} // namespace

double derSimonianLairdTau2(std::span<const double> y, std::span<const double> v)
{
    if (y.size() < 2)
        return 0.0;
    const Sums s = sumsFor(y, v, 0.0);
    const double q = cochranQ(y, v);
    const double denominator = s.w - s.w2 / s.w;
    return denominator > 0.0 ? std::max(0.0, (q - double(y.size() - 1)) / denominator) : 0.0;
}

RemlFit remlTau2(std::span<const double> y, std::span<const double> v)
{
    RemlFit fit;
    if (y.size() < 2)
        return fit;
    double tau2 = derSimonianLairdTau2(y, v);
    constexpr int mostIterations = 1000;
    for (int iteration = 1; iteration <= mostIterations; ++iteration) {
        const Sums s = sumsFor(y, v, tau2);
        const double mean = s.wy / s.w;
        double numerator = 0.0;
        for (std::size_t i = 0; i < y.size(); ++i) {
            const double w = 1.0 / (v[i] + tau2);
            numerator += w * w * ((y[i] - mean) * (y[i] - mean) - v[i]);
        }
        const double next = std::max(0.0, numerator / s.w2 + 1.0 / s.w);
        fit.iterations = iteration;
        // Converged when the step is below 1e-10 of the within-site variances' scale.
        const bool small = std::abs(next - tau2) <= 1e-10 * std::max(1e-300, std::max(tau2, *std::min_element(v.begin(), v.end())));
        tau2 = next;
        if (small) {
            fit.converged = true;
            break;
        }
    }
    fit.tau2 = tau2;
    return fit;
}

PooledMean pooledMean(std::span<const double> y, std::span<const double> v, double tau2, double confidence)
{
    PooledMean out;
    const Sums s = sumsFor(y, v, tau2);
    out.mean = s.wy / s.w;
    out.se = std::sqrt(1.0 / s.w);
    const std::size_t k = y.size();
    if (k < 2)
        return out;
    double spread = 0.0;
    for (std::size_t i = 0; i < k; ++i)
        spread += (y[i] - out.mean) * (y[i] - out.mean) / (v[i] + tau2);
    out.hksjSe = std::sqrt(spread / (double(k - 1) * s.w));
    const double t = studentTQuantile(0.5 + confidence / 2.0, double(k - 1));
    out.hksjLower = out.mean - t * out.hksjSe;
    out.hksjUpper = out.mean + t * out.hksjSe;
    return out;
}

RandomEffectsPool poolRandomEffects(std::span<const double> y, std::span<const double> v, double confidence)
{
    RandomEffectsPool out;
    out.sites = y.size();
    out.confidence = confidence;
    if (y.empty())
        return out;
    out.tau2DerSimonianLaird = derSimonianLairdTau2(y, v);
    const RemlFit reml = remlTau2(y, v);
    out.tau2Reml = reml.tau2;
    out.remlIterations = reml.iterations;
    out.remlConverged = reml.converged || y.size() < 2;
    const PooledMean mean = pooledMean(y, v, out.tau2Reml, confidence);
    out.pooled = mean.mean;
    out.se = mean.se;
    out.hksjSe = mean.hksjSe;
    out.hksjUnmodifiedLower = mean.hksjLower;
    out.hksjUnmodifiedUpper = mean.hksjUpper;
    out.hksjLower = mean.hksjLower;
    out.hksjUpper = mean.hksjUpper;
    if (y.size() >= 2 && mean.hksjSe < mean.se) { // q < 1: widen to the plain random-effects SE
        const double t = studentTQuantile(0.5 + confidence / 2.0, double(y.size() - 1));
        out.hksjLower = mean.mean - t * mean.se;
        out.hksjUpper = mean.mean + t * mean.se;
    }
    const std::size_t k = y.size();
    out.df = int(k) - 1;
    out.q = k >= 2 ? cochranQ(y, v) : 0.0;
    out.i2 = out.q > 0.0 && k >= 2 ? std::max(0.0, (out.q - double(out.df)) / out.q) : 0.0;
    if (k >= fewestSitesForPrediction) {
        const double t = studentTQuantile(0.5 + confidence / 2.0, double(k - 2));
        const double half = t * std::sqrt(out.tau2Reml + out.se * out.se);
        out.predictionLower = out.pooled - half;
        out.predictionUpper = out.pooled + half;
    } else {
        out.warnings.push_back("no prediction interval with " + std::to_string(k)
                               + " sites: it needs at least 3 (a t distribution with k − 2 degrees of freedom).");
    }
    if (k < 2)
        out.warnings.push_back("one site only: nothing is pooled, and the between-site variance cannot be estimated.");
    else if (k < fewestSitesForTau2)
        out.warnings.push_back("only " + std::to_string(k)
                               + " sites: the between-site variance τ² is poorly estimated below 5 sites, so the intervals are uncertain.");
    if (!out.remlConverged)
        out.warnings.push_back("the REML estimate of τ² did not converge in 1000 iterations; the last value is used.");
    return out;
}

} // namespace plumbline
