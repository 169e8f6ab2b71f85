#include "metrics/calibration_summary.hpp"

#include "metrics/distributions.hpp"

#include <algorithm>
#include <cmath>

namespace plumbline {

Estimate observedExpectedRatio(std::span<const std::uint8_t> outcome, std::span<const double> risk, double confidence,
                               std::optional<CiMethod> method)
{
    double observed = 0.0;
    double expected = 0.0;
    for (std::size_t i = 0; i < outcome.size(); ++i) {
        observed += outcome[i];
        expected += risk[i];
    }
    if (!(expected > 0.0))
        return Estimate::undefined();
    const double n = double(outcome.size());
    Estimate out = Estimate::point(observed / expected);
    const double alpha = 1.0 - confidence;
    constexpr double smallCount = 10.0; // below this the log-normal interval is poor [common practice]
    const bool exact = method ? *method == CiMethod::ExactPoisson : observed < smallCount;
    if (exact) {
        out.lower = observed > 0.0 ? chiSquaredQuantile(alpha / 2.0, 2.0 * observed) / (2.0 * expected) : 0.0;
        out.upper = chiSquaredQuantile(1.0 - alpha / 2.0, 2.0 * observed + 2.0) / (2.0 * expected);
        out.ciMethod = CiMethod::ExactPoisson;
        return out;
    }
    const double se = std::sqrt(std::max(0.0, 1.0 / observed - 1.0 / n));
    const double z = zForConfidence(confidence);
    out.seLog = se;
    out.se = *out.value * se; // delta method: SE(O/E) = O/E · SE(log O/E)
    out.lower = *out.value * std::exp(-z * se);
    out.upper = *out.value * std::exp(z * se);
    out.ciMethod = CiMethod::LogNormal;
    return out;
}

std::optional<SpiegelhalterTest> spiegelhalterTest(std::span<const std::uint8_t> outcome, std::span<const double> risk)
{
    double numerator = 0.0;
    double variance = 0.0;
    for (std::size_t i = 0; i < outcome.size(); ++i) {
        const double p = std::clamp(risk[i], 1e-12, 1.0 - 1e-12);
        numerator += (outcome[i] - p) * (1.0 - 2.0 * p);
        variance += (1.0 - 2.0 * p) * (1.0 - 2.0 * p) * p * (1.0 - p);
    }
    if (!(variance > 0.0))
        return std::nullopt; // every p = 0.5 (or 0/1): the test is undefined
    const double z = numerator / std::sqrt(variance);
    return SpiegelhalterTest{z, twoSidedNormalP(z)};
}

} // namespace plumbline
