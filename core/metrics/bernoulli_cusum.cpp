#include "metrics/bernoulli_cusum.hpp"

#include <algorithm>
#include <cmath>

namespace plumbline {

double cusumWeight(double risk, bool event, double oddsRatio)
{
    return (event ? std::log(oddsRatio) : 0.0) - std::log1p((oddsRatio - 1.0) * risk);
}

CusumRun runCusum(const std::vector<double>& risks, const std::vector<std::uint8_t>& outcomes, double oddsRatio, double limit)
{
    CusumRun run;
    run.values.resize(risks.size());
    double s = 0.0;
    std::size_t since = 0;
    for (std::size_t i = 0; i < risks.size(); ++i) {
        s = std::max(0.0, s + cusumWeight(risks[i], outcomes[i] != 0, oddsRatio));
        ++since;
        run.values[i] = s;
        if (s >= limit) {
            run.signals.push_back(i);
            run.sinceReset.push_back(since);
            s = 0.0;
            since = 0;
        }
    }
    return run;
}

} // namespace plumbline
