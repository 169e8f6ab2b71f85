#include "metrics/observed_minus_expected.hpp"

#include <cstddef>

namespace plumbline {

std::vector<double> cumulativeExpectedMinusObserved(const std::vector<double>& risks, const std::vector<std::uint8_t>& outcomes)
{
    std::vector<double> path(risks.size());
    // A running sum in long double: a million patients' rounding stays far below what a chart shows.
    long double sum = 0.0L;
    for (std::size_t i = 0; i < risks.size(); ++i) {
        sum += static_cast<long double>(risks[i]) - (outcomes[i] != 0 ? 1.0L : 0.0L);
        path[i] = static_cast<double>(sum);
    }
    return path;
}

} // namespace plumbline
