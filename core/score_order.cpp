#include "score_order.hpp"

#include <algorithm>
#include <utility>

namespace plumbline {

ScoreOrder ascendingOrder(std::span<const double> score)
{
    // Sorting (value, index) pairs in contiguous memory is several times faster than sorting
    // indices with an indirect comparison on a million rows.
    std::vector<std::pair<double, std::uint32_t>> keyed(score.size());
    for (std::size_t i = 0; i < score.size(); ++i)
        keyed[i] = {score[i], static_cast<std::uint32_t>(i)};
    std::sort(keyed.begin(), keyed.end());
    ScoreOrder order(score.size());
    for (std::size_t i = 0; i < keyed.size(); ++i)
        order[i] = keyed[i].second;
    return order;
}

} // namespace plumbline
