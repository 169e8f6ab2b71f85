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
// patients between the first and the last are cut into (maxPoints − 2) / 2 consecutive blocks
// and each block keeps its lowest and its highest value (in patient order), with the first and
// last patients always kept: a peak or a trough of a single patient survives thinning, so a
// thinned chart never looks calmer than the full one. A path of at most maxPoints values is kept
// whole. The values arrive one at a time (`add`), so a chart of ten million patients is never
// held whole.
class PathThinner {
public:
    PathThinner(std::size_t patients, std::size_t maxPoints);
    void add(double value);
    std::vector<PathPoint> points() const; // once every patient was added

private:
    void closeBlock();

    std::size_t m_patients, m_blocks = 0, m_seen = 0, m_block = 0;
    bool m_whole = true;
    std::size_t m_low = 0, m_high = 0;
    double m_lowValue = 0.0, m_highValue = 0.0;
    bool m_open = false;
    std::vector<PathPoint> m_points;
    PathPoint m_last;
};

std::vector<PathPoint> thinPath(const std::vector<double>& values, std::size_t maxPoints);

} // namespace plumbline
