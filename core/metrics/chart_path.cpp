#include "metrics/chart_path.hpp"

#include <algorithm>

namespace plumbline {

std::vector<PathPoint> thinPath(const std::vector<double>& values, std::size_t maxPoints)
{
    std::vector<PathPoint> out;
    const std::size_t n = values.size();
    if (n <= std::max<std::size_t>(maxPoints, 4)) {
        for (std::size_t i = 0; i < n; ++i)
            out.push_back({i + 1, values[i]});
        return out;
    }
    const std::size_t blocks = std::max<std::size_t>(1, (maxPoints - 2) / 2);
    out.push_back({1, values.front()});
    for (std::size_t b = 0; b < blocks; ++b) {
        // Block b holds patients [from, to) of the ones between the first and the last.
        const std::size_t from = 1 + b * (n - 2) / blocks, to = 1 + (b + 1) * (n - 2) / blocks;
        if (from >= to)
            continue;
        std::size_t low = from, high = from;
        for (std::size_t i = from; i < to; ++i) {
            if (values[i] < values[low])
                low = i;
            if (values[i] > values[high])
                high = i;
        }
        const std::size_t first = std::min(low, high), second = std::max(low, high);
        out.push_back({first + 1, values[first]});
        if (second != first)
            out.push_back({second + 1, values[second]});
    }
    out.push_back({n, values.back()});
    return out;
}

} // namespace plumbline
