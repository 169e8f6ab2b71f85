#pragma once

#include "resampling/weighted_panel.hpp"

#include <array>
#include <optional>
#include <span>
#include <string_view>

namespace plumbline {

// The BCa acceleration of each panel metric, from jackknife-type values in O(n) total — never
// n refits (docs/methods.md §16):
// - closed-form jackknife: the exact leave-one-out values of C,
//   Brier, scaled Brier, log loss, Nagelkerke R², O/E and the discrimination slope, one value per
//   support point and outcome class;
// - influence function: average precision and the three calibration fits (M-estimation:
//   I⁻¹ψ), whose leave-one-out values are the influence values up to a positive factor;
// - grouped jackknife: ICI, E50, E90, Emax, refitted with each of 20 groups of rows left out.
struct Acceleration {
    double value = 0.0;
    std::string_view method;
};
using PanelAccelerations = std::array<std::optional<Acceleration>, PanelMetricCount>;

struct FullSampleFits {
    FitStart start;            // the fitted intercept, recalibration intercept and slope
    double slopeInformation[3]; // Fisher information of the slope fit: I_aa, I_ab, I_bb
    bool hasSlope = false;
};

PanelAccelerations panelAccelerations(const ModelSupport& support, const SupportCounts& counts,
                                      const PanelValues& full, const FullSampleFits& fits,
                                      std::span<const std::uint8_t> outcome, const LoessOptions* loess);

} // namespace plumbline
