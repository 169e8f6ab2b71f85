#pragma once

#include <cstddef>
#include <cstdint>
#include <functional>
#include <vector>

namespace plumbline {

// The risk-adjusted Bernoulli CUSUM of Steiner, Cook, Farewell & Treasure (2000, Biostatistics
// 1:441). For an odds-ratio shift R the log-likelihood-ratio weight of a patient with risk p and
// outcome y is W = y·log(R) − log(1 − p + R·p); the chart is S_t = max(0, S_{t−1} + W_t) and
// signals when S_t ≥ h, after which it restarts at 0. R > 1 watches for worse outcomes than
// predicted, R < 1 (the same formula) for better ones.
double cusumWeight(double risk, bool event, double oddsRatio);

struct CusumRun {
    std::vector<double> values;          // S_t after each patient (0 after a signal's restart: the value
                                         // at the signal itself is kept, the restart applies to the next)
    std::vector<std::size_t> signals;    // 0-based positions of the patients at which the chart signalled
    std::vector<std::size_t> sinceReset; // for each signal, patients since the last restart (or the start), the signalling one included
};

CusumRun runCusum(const std::vector<double>& risks, const std::vector<std::uint8_t>& outcomes, double oddsRatio, double limit);
// The same with each S_t handed to `sink` instead of kept (`values` stays empty).
CusumRun runCusum(const std::vector<double>& risks, const std::vector<std::uint8_t>& outcomes, double oddsRatio, double limit,
                  const std::function<void(double)>& sink);

} // namespace plumbline
