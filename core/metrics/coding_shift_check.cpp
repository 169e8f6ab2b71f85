#include "metrics/coding_shift_check.hpp"

#include "metrics/binomial_interval.hpp"
#include "metrics/distributions.hpp"

#include <cmath>

namespace plumbline {

RiskAndRate riskAndRate(const std::vector<double>& risks, const std::vector<std::uint8_t>& outcomes, double confidence)
{
    RiskAndRate out;
    out.n = risks.size();
    if (out.n == 0)
        return out;
    long double sum = 0.0L;
    for (std::size_t i = 0; i < risks.size(); ++i) {
        sum += risks[i];
        out.events += outcomes[i] != 0 ? 1 : 0;
    }
    const double mean = double(sum / static_cast<long double>(out.n));
    long double squares = 0.0L;
    for (const double p : risks)
        squares += (p - mean) * (p - mean);
    const double sd = out.n > 1 ? std::sqrt(double(squares / static_cast<long double>(out.n - 1))) : 0.0;
    const double z = zForConfidence(confidence);
    out.meanPredicted = mean;
    out.meanLower = mean - z * sd / std::sqrt(double(out.n));
    out.meanUpper = mean + z * sd / std::sqrt(double(out.n));
    out.observedRate = double(out.events) / double(out.n);
    const Interval rate = wilsonInterval(out.events, out.n, confidence);
    out.rateLower = rate.lower;
    out.rateUpper = rate.upper;
    return out;
}

CodingShiftCheck checkCodingShift(const RiskAndRate& firstYear, const RiskAndRate& latestYear, double rise)
{
    CodingShiftCheck out{firstYear, latestYear, 0.0, false, false, false};
    if (firstYear.n == 0 || latestYear.n == 0 || firstYear.meanPredicted <= 0.0)
        return out;
    out.predictedRatio = latestYear.meanPredicted / firstYear.meanPredicted;
    out.predictedRose = out.predictedRatio >= 1.0 + rise && latestYear.meanLower > firstYear.meanUpper;
    out.observedRose = latestYear.rateLower > firstYear.rateUpper;
    out.flagged = out.predictedRose && !out.observedRose;
    return out;
}

} // namespace plumbline
