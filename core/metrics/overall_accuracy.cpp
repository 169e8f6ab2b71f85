#include "metrics/overall_accuracy.hpp"

#include <cmath>

namespace plumbline {

OverallAccuracy overallAccuracy(std::span<const std::uint8_t> outcome, std::span<const double> risk)
{
    OverallAccuracy out;
    const std::size_t n = outcome.size();
    if (n == 0)
        return out;
    double squared = 0.0;
    double logLikelihood = 0.0;
    double events = 0.0;
    for (std::size_t i = 0; i < n; ++i) {
        const double p = risk[i];
        const double y = outcome[i];
        squared += (p - y) * (p - y);
        events += y;
        const double likelihood = outcome[i] ? p : 1.0 - p;
        if (likelihood <= 0.0)
            ++out.contradictedCertainties;
        else
            logLikelihood += std::log(likelihood);
    }
    const double N = double(n);
    out.brier = squared / N;
    const double rate = events / N;
    const bool bothClasses = events > 0.0 && events < N;
    if (bothClasses)
        out.scaledBrier = 1.0 - *out.brier / (rate * (1.0 - rate));
    if (out.contradictedCertainties > 0)
        return out; // log loss is infinite: reported as undefined with the count, never clipped
    out.logLoss = -logLikelihood / N;
    if (bothClasses) {
        const double nullLogLikelihood = events * std::log(rate) + (N - events) * std::log(1.0 - rate);
        const double coxSnell = 1.0 - std::exp(2.0 * (nullLogLikelihood - logLikelihood) / N);
        const double maximum = 1.0 - std::exp(2.0 * nullLogLikelihood / N);
        out.nagelkerkeR2 = coxSnell / maximum;
    }
    return out;
}

} // namespace plumbline
