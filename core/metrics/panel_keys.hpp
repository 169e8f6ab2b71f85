#pragma once

#include <array>
#include <cstddef>
#include <string_view>

namespace plumbline {

// The scalar metrics of the panel, in display order, by their interface keys. Analytic results,
// bootstrap replicates and the JSON all index metrics by this list.
enum PanelMetric : std::size_t {
    CStatistic, Auprc, DiscriminationSlope, CalibrationIntercept, CalibrationSlope, RecalibrationIntercept,
    OeRatio, Ici, E50, E90, Emax, Brier, ScaledBrier, LogLoss, NagelkerkeR2, PanelMetricCount
};

inline constexpr std::array<std::string_view, PanelMetricCount> panelKeys{
    "c_statistic", "auprc", "discrimination_slope", "calibration_intercept", "calibration_slope",
    "recalibration_intercept", "oe_ratio", "ici", "e50", "e90", "emax", "brier", "scaled_brier", "log_loss",
    "nagelkerke_r2"};

} // namespace plumbline
