#pragma once

#include <cstddef>
#include <vector>

namespace plumbline {

// One point of a chart drawn over patients: its position in the sequence (1 = the first
// patient) and the chart's value after that patient.
struct PathPoint {
    std::size_t patient = 0;
    double value = 0.0;
};

// At most about `maxPoints` points of a path of values (one per patient) for drawing. The
// patients are cut into maxPoints / 2 consecutive blocks and each block keeps its lowest and its
// highest value (in patient order), with the first and last patients always kept: a peak or a
// trough of a single patient survives thinning, so a thinned chart never looks calmer than the
// full one. A path of at most maxPoints values is kept whole.
std::vector<PathPoint> thinPath(const std::vector<double>& values, std::size_t maxPoints);

} // namespace plumbline
