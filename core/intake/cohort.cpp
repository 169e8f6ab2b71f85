#include "intake/cohort.hpp"

#include <numeric>

namespace plumbline {

std::size_t Cohort::events() const
{
    return std::accumulate(outcome.begin(), outcome.end(), std::size_t{0});
}

} // namespace plumbline
