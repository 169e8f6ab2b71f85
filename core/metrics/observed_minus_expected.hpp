#pragma once

#include <cstdint>
#include <functional>
#include <vector>

namespace plumbline {

// The cumulative expected-minus-observed count over patients in sequence (the variable
// life-adjusted display, Lovegrove et al. 1997, Lancet 350:1128): after patient t the value is
// Σ_{i≤t} (p_i − y_i). Above zero: fewer events than the model predicted so far ("lives saved"
// sign); a steady downward slope means more events than predicted.
std::vector<double> cumulativeExpectedMinusObserved(const std::vector<double>& risks, const std::vector<std::uint8_t>& outcomes);
// The same, each value handed to `sink` as it is reached (a long path is never held whole);
// returns the last value (0 without patients).
double cumulativeExpectedMinusObserved(const std::vector<double>& risks, const std::vector<std::uint8_t>& outcomes,
                                       const std::function<void(double)>& sink);

} // namespace plumbline
