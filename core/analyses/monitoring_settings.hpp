#pragma once

#include <cstddef>
#include <cstdint>

namespace plumbline {

// The options of monitoring over time (with a period column; the analysis file records them).
struct MonitoringSettings {
    double worseOdds = 2.0;          // the CUSUM watching for more events than predicted (R > 1)
    double betterOdds = 0.5;         // the CUSUM watching for fewer events than predicted (R < 1)
    double targetYears = 5.0;        // in-control average run length, in years of this cohort's volume
    std::size_t simulatedRuns = 200; // in-control runs simulated to choose each control limit
    std::size_t chartPoints = 2000;  // at most about this many points per chart path (thinned for drawing)
    double codingShiftRise = 0.10;   // relative rise in mean predicted risk the coding-shift question needs
    std::uint64_t seed = 20240101;   // the run's bootstrap seed (BootstrapSettings::seed), set by the caller
};

} // namespace plumbline
