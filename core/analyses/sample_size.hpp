#pragma once

#include <optional>
#include <string>
#include <vector>

namespace plumbline {

// Minimum sample size for an external validation with a binary outcome (Riley et al. 2021,
// Stat Med 40:4230, doi 10.1002/sim.9025), each criterion as re-derived in docs/methods.md §22
// (formulas from memory): precise O/E, calibration slope, C statistic and net benefit. The linear
// predictor is taken as Normal(μ, σ²) with μ, σ solved so that the mean risk is the prevalence and
// the C statistic the anticipated one; calibration is assumed perfect.
struct SampleSizeTargets {
    double oeWidth = 0.2;      // CI width of O/E (around 1)
    double slopeWidth = 0.2;   // CI width of the calibration slope
    double cWidth = 0.1;       // CI width of the C statistic
    double netBenefitWidth = 0.2; // CI width of the standardised net benefit
    std::vector<double> thresholds{0.1}; // net-benefit criterion at each
    double confidence = 0.95;
};

struct SampleSizeCriterion {
    std::string name;       // "O/E", "calibration slope", "C statistic", "net benefit at 0.10"
    double targetSe = 0.0;
    std::size_t patients = 0;
    double events = 0.0;
};

struct SampleSizePlan {
    double mu = 0.0, sigma = 0.0;   // the linear predictor's distribution
    std::vector<SampleSizeCriterion> criteria;
    std::size_t minimum = 0;        // the largest criterion
    std::string driver;             // its name
};

// nullopt when the inputs are outside (0, 1) or C is not in (0.5, 1).
std::optional<SampleSizePlan> planSampleSize(double prevalence, double cStatistic, const SampleSizeTargets& targets = {});

// The plan as the text the command line prints and the window shows: assumptions, one row per
// criterion, the minimum and the criterion that drives it, and the targets used.
std::string describePlan(const SampleSizePlan& plan, double prevalence, double cStatistic, const SampleSizeTargets& targets);

} // namespace plumbline
