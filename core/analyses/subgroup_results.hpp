#pragma once

#include "analyses/model_validation.hpp"

#include <cstddef>
#include <string>
#include <vector>

namespace plumbline {

// What the subgroup analysis finds, apart from the function that finds it: ValidationResult
// holds these, and analyseSubgroups runs a validation on each level, so validation.hpp includes
// this header and subgroup_analysis.cpp includes validation.hpp, with no cycle between them.

// The metric panel within each level of each subgroup column (analytic intervals), flagged when
// a level is too small to estimate well; never hidden.
struct SubgroupResult {
    std::string column;
    std::string level;
    std::string model;
    std::size_t n = 0;
    std::size_t events = 0;
    bool tooSmall = false;      // fewer than the small-cell number of patients, events or non-events
    ModelValidation panel;
};

// Cochran's Q for equal values across levels (inverse-variance weights; χ² with k−1 df): on the
// calibration-in-the-large, the calibration slope (Wald SEs), and the C statistic's logit.
struct HeterogeneityTest {
    std::string column;
    std::string model;
    std::string metric;         // "calibration_intercept", "calibration_slope" or "c_statistic"
    double q = 0.0;
    int df = 0;
    double pValue = 1.0;
    std::size_t levels = 0;
};

// A funnel plot of O/E against expected events for each level of a column (Spiegelhalter 2005,
// Stat Med 24:1185): exact Poisson control limits around 1 at 95 % and 99.8 %, interpolated.
struct FunnelPoint {
    std::string column;
    std::string level;
    std::string model;
    double observed = 0.0;
    double expected = 0.0;
    double oe = 0.0;
    double lower95 = 0.0, upper95 = 0.0, lower998 = 0.0, upper998 = 0.0;
};

// The control limits as curves over expected events, for drawing the funnel of one column.
struct FunnelLimits {
    std::string column;
    std::vector<double> expected, lower95, upper95, lower998, upper998;
};

struct SubgroupAnalysis {
    std::vector<SubgroupResult> results;
    std::vector<HeterogeneityTest> heterogeneity;
    std::vector<FunnelPoint> funnel;
    std::vector<FunnelLimits> funnelLimits;
};

} // namespace plumbline
