#include "resampling/bootstrap_interval.hpp"

#include "metrics/distributions.hpp"

#include <algorithm>
#include <cmath>

namespace plumbline {

std::string_view bootstrapCiName(BootstrapCi method)
{
    return method == BootstrapCi::Bca ? "bca" : "percentile";
}

double sortedQuantile(std::span<const double> sorted, double probability)
{
    const double position = probability * double(sorted.size() - 1);
    const auto below = static_cast<std::size_t>(std::floor(position));
    const std::size_t above = std::min(below + 1, sorted.size() - 1);
    return sorted[below] + (position - double(below)) * (sorted[above] - sorted[below]);
}

std::pair<double, double> percentileInterval(std::span<const double> sorted, double confidence)
{
    const double alpha = 1.0 - confidence;
    return {sortedQuantile(sorted, alpha / 2.0), sortedQuantile(sorted, 1.0 - alpha / 2.0)};
}

double accelerationFromJackknife(std::span<const double> values, std::span<const double> counts)
{
    double total = 0.0, sum = 0.0;
    for (std::size_t i = 0; i < values.size(); ++i) {
        const double c = counts.empty() ? 1.0 : counts[i];
        total += c;
        sum += c * values[i];
    }
    if (total <= 0.0)
        return 0.0;
    const double mean = sum / total;
    double squares = 0.0, cubes = 0.0;
    for (std::size_t i = 0; i < values.size(); ++i) {
        const double c = counts.empty() ? 1.0 : counts[i];
        const double u = mean - values[i];
        squares += c * u * u;
        cubes += c * u * u * u;
    }
    if (!(squares > 0.0))
        return 0.0;
    return cubes / (6.0 * std::pow(squares, 1.5));
}

std::optional<BcaLevels> bcaLevels(std::span<const double> sorted, double estimate, double acceleration,
                                   double confidence)
{
    // Replicates within rounding of the estimate count as ties: an estimate of -1.4e-16 that is
    // 0 in exact arithmetic must not put every replicate of 0 "above" it.
    const double slack = 1e-12 * std::max(1.0, std::abs(estimate));
    const auto below = std::lower_bound(sorted.begin(), sorted.end(), estimate - slack) - sorted.begin();
    const auto notAbove = std::upper_bound(sorted.begin(), sorted.end(), estimate + slack) - sorted.begin();
    const double share = (double(below) + 0.5 * double(notAbove - below)) / double(sorted.size());
    if (share <= 0.0 || share >= 1.0)
        return std::nullopt;
    const double z0 = normalQuantile(share);
    const double alpha = 1.0 - confidence;
    auto level = [&](double zAlpha) {
        const double shifted = z0 + zAlpha;
        return normalCdf(z0 + shifted / (1.0 - acceleration * shifted));
    };
    return BcaLevels{z0, level(normalQuantile(alpha / 2.0)), level(normalQuantile(1.0 - alpha / 2.0))};
}

double replicateStandardDeviation(std::span<const double> replicates)
{
    if (replicates.size() < 2)
        return 0.0;
    double mean = 0.0, squares = 0.0;
    for (double v : replicates)
        mean += v;
    mean /= double(replicates.size());
    for (double v : replicates)
        squares += (v - mean) * (v - mean);
    return std::sqrt(squares / double(replicates.size() - 1));
}

} // namespace plumbline
