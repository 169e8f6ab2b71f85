#include "metrics/population_stability.hpp"

#include <algorithm>
#include <array>
#include <cmath>
#include <cstddef>

namespace plumbline {

namespace {

std::array<double, 10> binShares(const std::vector<double>& edges, const std::vector<double>& scores)
{
    std::array<double, 10> counts{};
    for (const double x : scores)
        counts[std::size_t(std::lower_bound(edges.begin(), edges.end(), x) - edges.begin())] += 1.0;
    for (double& c : counts)
        c = std::max(psiShareFloor, scores.empty() ? 0.0 : c / double(scores.size()));
    return counts;
}

} // namespace

std::vector<double> decileEdges(std::vector<double> reference)
{
    std::vector<double> edges;
    if (reference.empty())
        return edges;
    std::sort(reference.begin(), reference.end());
    const double last = double(reference.size() - 1);
    for (int k = 1; k <= 9; ++k) {
        const double position = last * k / 10.0;
        const auto below = std::size_t(std::floor(position));
        const std::size_t above = std::min(below + 1, reference.size() - 1);
        const double fraction = position - double(below);
        edges.push_back(reference[below] + fraction * (reference[above] - reference[below]));
    }
    return edges;
}

double populationStabilityIndex(const std::vector<double>& edges, const std::vector<double>& reference,
                                const std::vector<double>& compared)
{
    const auto e = binShares(edges, reference);
    const auto a = binShares(edges, compared);
    double psi = 0.0;
    for (std::size_t b = 0; b < 10; ++b)
        psi += (a[b] - e[b]) * std::log(a[b] / e[b]);
    return psi;
}

const char* psiBand(double psi)
{
    return psi < 0.1 ? "little" : psi < 0.25 ? "moderate" : "large";
}

} // namespace plumbline
