#pragma once

#include "resampling/bootstrap_interval.hpp"
#include "metrics/estimate.hpp"
#include "resampling/metric_bootstrap.hpp"

#include <cstddef>
#include <string>

namespace plumbline {

// Which interval a metric reports once the bootstrap has run, and why. The bootstrap is not
// trusted where it is known to mislead: with few patients of one class its intervals come out
// too narrow (40 patients with one event: O/E BCa 0.08–0.28 against exact Poisson 0.0025–0.55),
// and a lopsided replicate distribution can put the estimate outside its own interval. The rule
// (a choice of this project, from common practice; README "Which interval is reported";
// docs/methods.md §17):
//   1. fewer than 20 events or 20 non-events, or more than 1 % of draws redrawn for lack of one
//      class: the analytic or exact interval where the metric has one;
//   2. otherwise the bootstrap interval asked for (BCa or percentile), unless BCa's bias
//      correction is extreme (|z0| > 1: more than 84 % of replicates on one side) or the
//      interval misses the estimate: then the percentile interval if it holds the estimate, else
//      the analytic interval, else none;
//   3. an interval of zero width is no interval.
// The bootstrap intervals always stay in the result beside the reported one.
struct IntervalRule {
    static constexpr std::size_t minimumClass = 20;
    static constexpr double maximumRedrawnShare = 0.01;
    static constexpr double maximumBiasCorrection = 1.0;
};

// What the bootstrap had to work with.
struct BootstrapEvidence {
    std::size_t events = 0, nonEvents = 0;
    std::size_t redrawn = 0, replicates = 0;
    bool sparse() const;
};

// The reported estimate (the analytic one's value and SE, with the chosen interval) and a note
// saying why when the choice is not the bootstrap interval asked for (empty otherwise).
struct ChosenInterval {
    Estimate estimate;
    std::string note;
};
ChosenInterval chooseInterval(const Estimate& analytic, const MetricBootstrap& bootstrap, BootstrapCi asked,
                              const BootstrapEvidence& evidence);

// The same for a paired difference (percentile bootstrap intervals only).
ChosenInterval chooseDifferenceInterval(const Estimate& analytic, const MetricBootstrap& bootstrap, const BootstrapEvidence& evidence);

// The rule above in one sentence, for the result file and the report.
std::string intervalRuleText();

// An interval of zero width says nothing about uncertainty (a constant score's C of 0.5 "from
// 0.5 to 0.5"): removes it and returns a note, or returns empty when the interval is sound.
std::string withoutDegenerateInterval(Estimate& estimate);

} // namespace plumbline
