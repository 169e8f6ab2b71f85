#pragma once

#include "score_order.hpp"

#include <cstddef>
#include <cstdint>
#include <optional>
#include <span>
#include <vector>

namespace plumbline {

// Smoothed calibration curve: loess of y on p (span 0.75, local quadratic, tricube weights, no
// robustness iterations; Cleveland, Grosse & Shyu 1992), evaluated at every patient's own risk,
// and the summaries of |curve − p| of Austin & Steyerberg 2019 (Stat Med 38:4051): ICI (mean),
// E50 (median), E90 (0.9 quantile, R type 7), Emax.
//
// Computation: tied risks are collapsed into one weighted point, which reproduces loess on the
// expanded data exactly (neighbourhood counted in patients; methods reference §3.9). When more
// than `maxSupportPoints` distinct risks remain (and n > 5,000), risks are pooled into that many
// equal-width bins, fitted at each bin's mean risk and interpolated linearly: the "binned"
// approximation, whose ICI stays within 0.001 of the exact one (tested).
struct LoessCalibration {
    std::vector<double> fitted;   // per patient, raw (may leave [0,1]); ICI is computed on it
    double ici = 0.0, e50 = 0.0, e90 = 0.0, emax = 0.0;
    bool binned = false;
    std::size_t supportPoints = 0;
};

struct LoessOptions {
    double span = 0.75;
    std::size_t maxSupportPoints = 2000;
    std::size_t exactUpTo = 5000;   // always exact (no binning) up to this many patients
};

// nullopt when the curve cannot be fitted: fewer than 10 distinct risks (e.g. a points score),
// or a neighbourhood too small for a local quadratic.
std::optional<LoessCalibration> loessCalibration(std::span<const std::uint8_t> outcome, std::span<const double> risk,
                                                 const ScoreOrder& order, const LoessOptions& options = {});
std::optional<LoessCalibration> loessCalibration(std::span<const std::uint8_t> outcome, std::span<const double> risk,
                                                 const LoessOptions& options = {});

} // namespace plumbline
