#pragma once

#include <cstddef>
#include <cstdint>
#include <vector>

namespace plumbline {

// The control limit h of a risk-adjusted Bernoulli CUSUM (metrics/bernoulli_cusum) chosen by
// simulation so that the in-control average run length (patients to a false signal) reaches a
// target. In control each simulated patient's risk is drawn with replacement from the observed
// risks and the outcome is Bernoulli(risk). Run r uses RandomStream(seed, r + 1).
//
// Each run's chart before its first signal does not depend on h, so a run is simulated once and
// its record highs kept (the patient at which S first reached each new maximum); the run length
// for any h is then the patient at which the record first reaches h. The runs are extended
// (upper bound on h raised in steps) until the mean run length at the upper bound reaches the
// target, then h is the smallest limit, found by bisection on these same runs, whose mean run
// length is at least the target. A run is stopped at `runCap` patients (counted as censored:
// its run length for a higher h is taken as the cap, which understates the average).
struct ControlLimitSettings {
    double oddsRatio = 2.0;
    double targetRunLength = 1000.0; // patients
    std::size_t runs = 200;
    std::uint64_t seed = 20240101;
    double capMultiple = 20.0;        // runCap = capMultiple × target
};

struct ControlLimit {
    double limit = 0.0;               // h
    double averageRunLength = 0.0;    // achieved in-control ARL at h, over the runs
    double standardError = 0.0;       // its Monte Carlo standard error (sd of run lengths / √runs)
    std::size_t runs = 0;
    std::size_t censoredRuns = 0;     // runs that reached the cap before a signal at h
    std::size_t runCap = 0;
    bool reached = true;              // false when even the cap could not give the target (e.g. no risk above 0)
};

ControlLimit chooseControlLimit(const std::vector<double>& risks, const ControlLimitSettings& settings);

} // namespace plumbline
