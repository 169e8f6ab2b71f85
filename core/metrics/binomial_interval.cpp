#include "metrics/binomial_interval.hpp"

#include "metrics/distributions.hpp"

#include <algorithm>
#include <cmath>

namespace plumbline {

Interval wilsonInterval(std::size_t x, std::size_t n, double confidence)
{
    const double z = zForConfidence(confidence);
    const double N = double(n);
    const double X = double(x);
    const double centre = (X + z * z / 2.0) / (N + z * z);
    const double half = z / (N + z * z) * std::sqrt(X * (N - X) / N + z * z / 4.0);
    return {std::max(0.0, centre - half), std::min(1.0, centre + half)};
}

Interval clopperPearsonInterval(std::size_t x, std::size_t n, double confidence)
{
    const double alpha = 1.0 - confidence;
    const double lower = x == 0 ? 0.0 : betaQuantile(double(x), double(n - x + 1), alpha / 2.0);
    const double upper = x == n ? 1.0 : betaQuantile(double(x + 1), double(n - x), 1.0 - alpha / 2.0);
    return {lower, upper};
}

Interval binomialInterval(std::size_t x, std::size_t n, double confidence, CiMethod method)
{
    return method == CiMethod::ClopperPearson ? clopperPearsonInterval(x, n, confidence) : wilsonInterval(x, n, confidence);
}

} // namespace plumbline
