#pragma once

#include <cstddef>
#include <cstdint>
#include <optional>
#include <span>

namespace plumbline {

// Overall accuracy of fixed risks (no refit). Sources: Brier 1950 (Mon Weather Rev 78:1);
// scaled Brier = 1 − B/(ȳ(1−ȳ)) (Steyerberg et al. 2010, Epidemiology 21:128); Nagelkerke R²
// (Nagelkerke 1991, Biometrika 78:691) from the Cox–Snell R² of the fixed risks.
struct OverallAccuracy {
    std::optional<double> brier;
    std::optional<double> scaledBrier;   // undefined when ȳ is 0 or 1
    std::optional<double> logLoss;       // undefined (infinite) when a risk of 0 or 1 contradicts the outcome
    std::optional<double> nagelkerkeR2;  // undefined with one class or an infinite log-likelihood
    std::size_t contradictedCertainties = 0; // rows with p = 0 and y = 1, or p = 1 and y = 0
};

OverallAccuracy overallAccuracy(std::span<const std::uint8_t> outcome, std::span<const double> risk);

} // namespace plumbline
