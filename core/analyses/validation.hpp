#pragma once

#include "intake/cohort.hpp"
#include "analyses/model_comparison.hpp"
#include "analyses/capacity_analysis.hpp"
#include "analyses/model_validation.hpp"
#include "analyses/subgroup_results.hpp"
#include "analyses/panel_settings.hpp"
#include "analyses/site_pooling.hpp"
#include "analyses/monitoring_analysis.hpp"
#include "metrics/score_order.hpp"

#include <optional>
#include <string>
#include <vector>

namespace plumbline {

// The metric panel for every model of a cohort: one immutable snapshot.
struct ValidationResult {
    PanelSettings settings;
    std::vector<ModelValidation> models;
    std::vector<ModelComparison> comparisons; // every pair, model_b − model_a
    std::vector<std::string> warnings; // cohort-level, then each model's
    std::optional<BootstrapSummary> bootstrap; // empty when intervals are analytic only
    std::optional<SubgroupAnalysis> subgroups; // when the cohort has group columns
    std::optional<PeriodAnalysis> periods;     // when the cohort has a period column
    std::optional<CapacityAnalysis> capacity;  // when settings.capacity is given
    std::optional<SitePooling> sites;          // when the cohort has a cluster (site) column
    std::optional<MonitoringAnalysis> monitoring; // with a period column whose dates read
    struct PrecisionRow {
        std::string model, metric;
        double width = 0.0, target = 0.0; // achieved interval width against a common target
    };
    std::vector<PrecisionRow> precision;

    const ModelValidation* model(const std::string& name) const;
};

// Runs the panel for each model, models in parallel on up to `threads` threads (the result does
// not depend on the thread count), and adds the cohort-level cautions on precision.
ValidationResult runValidation(const Cohort& cohort, const PanelSettings& settings, unsigned threads = 2);
// The same with each model's ascendingOrder already known (one per model, as ascendingOrder
// gives it): subgroup levels pass the whole cohort's order filtered to their rows, which is the
// level's own order, instead of sorting again.
ValidationResult runValidation(const Cohort& cohort, const PanelSettings& settings, unsigned threads,
                               std::vector<ScoreOrder> orders);

} // namespace plumbline
