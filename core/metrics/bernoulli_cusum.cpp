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
    std::vector<double> values;
    values.reserve(risks.size());
    CusumRun run = runCusum(risks, outcomes, oddsRatio, limit, [&](double v) { values.push_back(v); });
    run.values = std::move(values);
    return run;
}

CusumRun runCusum(const std::vector<double>& risks, const std::vector<std::uint8_t>& outcomes, double oddsRatio, double limit,
                  const std::function<void(double)>& sink)
{
    CusumRun run;
    double s = 0.0;
    std::size_t since = 0;
    for (std::size_t i = 0; i < risks.size(); ++i) {
        s = std::max(0.0, s + cusumWeight(risks[i], outcomes[i] != 0, oddsRatio));
        ++since;
        sink(s);
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
