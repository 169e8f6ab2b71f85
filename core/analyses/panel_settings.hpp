#pragma once

#include "intake/acceptable_criteria.hpp"
#include "metrics/discrimination.hpp"
#include "metrics/estimate.hpp"
#include "analyses/period_analysis.hpp"
#include "analyses/capacity_spec.hpp"
#include "analyses/monitoring_settings.hpp"

#include <cstddef>
#include <cstdint>
#include <optional>
#include <vector>

namespace plumbline {

// The options of the metric panel (the analysis file records them).
struct PanelSettings {
    double confidence = 0.95;
    std::size_t riskGroups = 10;
    std::vector<double> thresholds{0.1, 0.2, 0.3}; // each in (0, 1); "positive" means p ≥ t
    CStatisticScale cStatisticScale = CStatisticScale::Logit;
    CiMethod binomialInterval = CiMethod::Wilson; // or ClopperPearson
    std::size_t rocPoints = 1000;                  // ROC points written out (C uses all data)
    std::size_t calibrationCurvePoints = 200;      // smoothed-curve points written out
    double decisionThreshold = 0.2;                // the threshold the care team will act on: marked on charts
    std::vector<double> nriCutPoints;              // risk categories for the NRI; empty: the thresholds
    double decisionFrom = 0.05, decisionTo = 0.50, decisionStep = 0.01; // the decision curve's thresholds
    std::size_t minimumCell = 11;                  // subgroup levels below this are flagged too small
    PeriodUnit periodUnit = PeriodUnit::Month;
    std::optional<DateFormat> dateFormat;          // nullopt: ISO dates only; ambiguous ones refused
    std::optional<CapacitySpec> capacity;          // --capacity: the threshold that flags that many (capacity_analysis)
    AcceptableCriteria acceptable;                 // --acceptable: performance acceptable in a new site
    std::uint64_t simulationSeed = 20240101;       // the bootstrap's seed (BootstrapSettings::seed), copied by each entry point
    MonitoringSettings monitoring;                 // CUSUM and case-mix options over time (with a period column)

    const std::vector<double>& cutPoints() const { return nriCutPoints.empty() ? thresholds : nriCutPoints; }
};

} // namespace plumbline
