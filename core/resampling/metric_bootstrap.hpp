#pragma once

#include <cstddef>
#include <optional>
#include <string_view>
#include <string>
#include <utility>
#include <vector>

namespace plumbline {

// What the bootstrap says about one scalar metric.
struct MetricBootstrap {
    std::size_t replicatesUsed = 0;   // replicates in which the metric was defined
    double se = 0.0;                  // standard deviation of the replicates
    std::pair<double, double> percentile;
    std::optional<std::pair<double, double>> bca; // empty when every replicate fell on one side
    std::optional<double> z0;
    double acceleration = 0.0;
    std::string_view accelerationMethod;
};

// A pointwise band: at each x, the percentile interval of the replicates' curves.
struct CurveBand {
    std::vector<double> x;
    std::vector<double> lower;
    std::vector<double> upper;
};

// How the bootstrap was run, for the result file and the report.
struct BootstrapSummary {
    std::size_t replicates = 0;
    unsigned long long seed = 0;
    std::string ciMethod;
    bool stratified = false;
    std::size_t redrawn = 0;
};

} // namespace plumbline
