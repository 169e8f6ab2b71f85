#pragma once

#include "resampling/bootstrap_interval.hpp"
#include "intake/cohort.hpp"
#include "resampling/metric_bootstrap.hpp"
#include "analyses/paired_bootstrap.hpp"
#include "metrics/panel_keys.hpp"
#include "analyses/validation.hpp"

#include <array>
#include <cstdint>
#include <functional>
#include <optional>
#include <stop_token>
#include <string>
#include <vector>

namespace plumbline {

struct BootstrapSettings {
    std::size_t replicates = 1000;
    std::uint64_t seed = 20240101;
    unsigned threads = 2;
    BootstrapCi method = BootstrapCi::Bca;
    bool stratified = false;     // resample events and non-events separately (n1, n0 fixed)
    bool smoothedCurve = true;   // ICI, E50, E90, Emax and the calibration-curve band
    std::size_t rocBandPoints = 101; // false-positive rates 0, 0.01, ..., 1
};

struct ModelBootstrap {
    std::array<std::optional<MetricBootstrap>, PanelMetricCount> metrics;
    CurveBand calibrationBand; // at the full-sample smoothed curve's predicted risks
    CurveBand rocBand;         // sensitivity at fixed false-positive rates
    CurveBand decisionBand;    // net benefit over the decision curve's thresholds
};

struct BootstrapResult {
    BootstrapSettings settings;
    double confidence = 0.95;
    std::size_t redrawn = 0; // draws replaced because they lacked events or non-events
    std::size_t events = 0, nonEvents = 0; // of the cohort resampled
    std::vector<ModelBootstrap> models;
    std::vector<PairBootstrap> pairs; // in the order of ValidationResult::comparisons
    std::vector<std::string> warnings;
};

// Called at every whole percent of the replicates, in order and never concurrently, from one of
// the bootstrap's worker threads (a GUI must forward it to its own thread).
using BootstrapProgress = std::function<void(std::size_t done, std::size_t total)>;

// Nonparametric bootstrap of the whole panel (docs/methods.md §15). Replicate r draws its
// multinomial counts from RandomStream(seed, r + 1), so the result does not depend on the number
// of threads. A replicate is a count vector over the original rows; every metric is a weighted
// sweep over each model's scores sorted once; the fits start from the full-sample estimates.
// Returns nullopt when cancelled through the stop token (checked between replicates; a
// replicate of a million rows takes a few tens of milliseconds).
std::optional<BootstrapResult> runBootstrap(const Cohort& cohort, const ValidationResult& full,
                                            const BootstrapSettings& settings, const BootstrapProgress& progress,
                                            std::stop_token stop);

// Makes the bootstrap interval (settings.method) each metric's reported interval; the analytic
// one is kept beside it. Readings follow the new intervals. Adds the bootstrap's warnings.
void applyBootstrap(ValidationResult& result, const BootstrapResult& bootstrap);

} // namespace plumbline
