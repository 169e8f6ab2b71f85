#pragma once

#include "intake/cohort.hpp"
#include "metrics/estimate.hpp"
#include "metrics/score_order.hpp"
#include "resampling/metric_bootstrap.hpp"
#include "analyses/panel_settings.hpp"

#include <optional>
#include <string>
#include <vector>

namespace plumbline {

// One difference between two models on the same patients, always model_b − model_a (model_a is
// the reference, e.g. the supplier's score; model_b the alternative, e.g. the local refit).
struct DifferenceEstimate {
    std::string key;
    Estimate estimate;
    std::optional<double> pValue;
    std::optional<MetricBootstrap> bootstrap; // paired: both models on the same resample
    std::optional<Estimate> analytic;         // kept when the bootstrap interval is reported
    std::string intervalNote;                 // why the reported interval is not the usual one
    bool truncated = false;                   // the Wald interval was cut at the quantity's range
};

// Reclassification at the cut-points: patients by category under model_a (rows) and model_b
// (columns), separately for events and non-events. Category k holds risks in [cut_{k-1}, cut_k).
struct ReclassificationTable {
    std::vector<double> cutPoints;
    std::vector<std::vector<std::size_t>> events;
    std::vector<std::vector<std::size_t>> nonEvents;
};

struct ModelComparison {
    std::string modelA;
    std::string modelB;
    std::vector<DifferenceEstimate> differences;             // c_statistic_difference, brier_difference, ...
    std::vector<DifferenceEstimate> netBenefitDifferences;   // key "net_benefit_difference", one per threshold
    std::vector<double> netBenefitThresholds;
    ReclassificationTable reclassification;

    const DifferenceEstimate* difference(const std::string& key) const;
};

// Every pair of models (a before b in the cohort's order), with analytic intervals where they
// exist: ΔC with the paired DeLong test (DeLong et al. 1988); ΔBrier with the paired normal SE of
// the per-patient differences; NRI at the cut-points and category-free, with their event and
// non-event components (Pencina et al. 2008; p from SE0, interval from SE1, both from memory —
// docs/methods.md §18); IDI with its SE (Pencina et al. 2008, from memory); Δ calibration slope,
// ΔICI and ΔNB as point estimates (their intervals come from the paired bootstrap).
// `orders`, when given, holds each model's ascendingOrder (sorted once by the caller). With two
// `threads` a pair's two models are ranked at once.
std::vector<ModelComparison> compareModels(const Cohort& cohort, const struct ValidationResult& result,
                                           const PanelSettings& settings, const std::vector<double>& cutPoints,
                                           const std::vector<ScoreOrder>* orders = nullptr, unsigned threads = 1);

// What a reader must keep in mind about these comparisons (docs/methods.md §18).
std::vector<std::string> comparisonCautions();

// Category of a risk among the cut-points: the number of cut-points ≤ risk.
std::size_t riskCategory(double risk, const std::vector<double>& cutPoints);

} // namespace plumbline
