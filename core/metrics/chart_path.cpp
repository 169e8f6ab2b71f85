#include "metrics/chart_path.hpp"

#include <algorithm>

namespace plumbline {

PathThinner::PathThinner(std::size_t patients, std::size_t maxPoints)
    : m_patients(patients)
    , m_whole(patients <= std::max<std::size_t>(maxPoints, 4))
{
    if (!m_whole)
        m_blocks = std::max<std::size_t>(1, (maxPoints - 2) / 2);
}

void PathThinner::closeBlock()
{
    if (!m_open)
        return;
    if (m_low == m_high) {
        m_points.push_back({m_low + 1, m_lowValue});
    } else if (m_low < m_high) {
        m_points.push_back({m_low + 1, m_lowValue});
        m_points.push_back({m_high + 1, m_highValue});
    } else {
        m_points.push_back({m_high + 1, m_highValue});
        m_points.push_back({m_low + 1, m_lowValue});
    }
    m_open = false;
}

void PathThinner::add(double value)
{
    const std::size_t i = m_seen++;
    m_last = {i + 1, value};
    if (m_whole || i == 0) {
        m_points.push_back(m_last);
        return;
    }
    if (i == m_patients - 1) {
        closeBlock();
        m_points.push_back(m_last);
        return;
    }
    // Block b holds patients [1 + b(n−2)/blocks, 1 + (b+1)(n−2)/blocks) (0-based).
    while (i >= 1 + (m_block + 1) * (m_patients - 2) / m_blocks) {
        closeBlock();
        ++m_block;
    }
    if (!m_open) {
        m_open = true;
        m_low = m_high = i;
        m_lowValue = m_highValue = value;
        return;
    }
    if (value < m_lowValue) {
        m_low = i;
        m_lowValue = value;
    }
    if (value > m_highValue) {
        m_high = i;
        m_highValue = value;
    }
}

std::vector<PathPoint> PathThinner::points() const
{
    return m_points;
}

std::vector<PathPoint> thinPath(const std::vector<double>& values, std::size_t maxPoints)
{
    PathThinner thinner(values.size(), maxPoints);
    for (const double v : values)
        thinner.add(v);
    return thinner.points();
}

} // namespace plumbline
