#include "metrics/observed_minus_expected.hpp"

#include <cstddef>

namespace plumbline {

double cumulativeExpectedMinusObserved(const std::vector<double>& risks, const std::vector<std::uint8_t>& outcomes,
                                       const std::function<void(double)>& sink)
{
    // A running sum in long double: a million patients' rounding stays far below what a chart shows.
    long double sum = 0.0L;
    for (std::size_t i = 0; i < risks.size(); ++i) {
        sum += static_cast<long double>(risks[i]) - (outcomes[i] != 0 ? 1.0L : 0.0L);
        sink(static_cast<double>(sum));
    }
    return static_cast<double>(sum);
}

std::vector<double> cumulativeExpectedMinusObserved(const std::vector<double>& risks, const std::vector<std::uint8_t>& outcomes)
{
    std::vector<double> path;
    path.reserve(risks.size());
    cumulativeExpectedMinusObserved(risks, outcomes, [&](double v) { path.push_back(v); });
    return path;
}

} // namespace plumbline
