#pragma once

#include <vector>

namespace plumbline {

// The population stability index of scores against a reference set of scores:
// PSI = Σ_b (a_b − e_b)·ln(a_b / e_b) over 10 bins whose edges are the reference's deciles, where
// e_b and a_b are the shares of the reference and of the compared scores in bin b. Deciles are
// the linear-interpolation quantiles (position q·(n − 1) in the sorted reference, numpy's default);
// a score goes to the first bin whose upper edge is at or above it (bins (−∞, d1], (d1, d2], …,
// (d9, ∞)). An empty bin's share is raised to a floor of 0.0001 (both sides) so that the
// logarithm stays finite; a bin empty on both sides then adds nothing. Tied deciles (many equal
// scores) leave bins empty in both sets, which the floor handles the same way.
constexpr double psiShareFloor = 1e-4;

std::vector<double> decileEdges(std::vector<double> reference);               // 9 edges
double populationStabilityIndex(const std::vector<double>& edges, const std::vector<double>& reference,
                                const std::vector<double>& compared);
// Bands read as common practice: below 0.1 little shift, 0.1 to 0.25 moderate, 0.25 or more large.
const char* psiBand(double psi);

} // namespace plumbline
