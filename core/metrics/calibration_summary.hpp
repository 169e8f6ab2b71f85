#pragma once

#include "metrics/estimate.hpp"

#include <cstdint>
#include <optional>
#include <span>

namespace plumbline {

// Observed/expected ratio O/E = Σy/Σp with a CI from SE(ln O/E) = sqrt(1/O − 1/N) (binomial,
// delta method; Debray et al. 2017, BMJ 356:i6460, from memory; docs/methods.md §8), or the
// exact Poisson interval with E fixed when O < 10 (limits from memory; O = 0 gives
// [0, χ²_{1−α/2}(2)/(2E)]).
// The estimate's `se` is SE(ln O/E), on the log scale; it is empty for the exact interval.
// The interval is chosen by `method` (LogNormal or ExactPoisson); with nullopt the exact interval
// is used when O < 10 [common practice] and the log-normal one otherwise.
Estimate observedExpectedRatio(std::span<const std::uint8_t> outcome, std::span<const double> risk, double confidence,
                               std::optional<CiMethod> method = std::nullopt);

// Spiegelhalter's z (Spiegelhalter 1986, Stat Med 5:421; formula from memory, docs/methods.md §9)
// and its two-sided normal p-value.
struct SpiegelhalterTest {
    double z;
    double pValue;
};
std::optional<SpiegelhalterTest> spiegelhalterTest(std::span<const std::uint8_t> outcome, std::span<const double> risk);

} // namespace plumbline
