#pragma once

#include "metrics/score_order.hpp"

#include <cstddef>
#include <cstdint>
#include <optional>
#include <stop_token>
#include <span>
#include <utility>
#include <vector>

namespace plumbline {

// Distinct risks in ascending order with how many patients (and events) sit at each, possibly
// frequency-weighted (a bootstrap replicate). A point may have a count of zero. Counts are whole
// numbers (patients, or a replicate's multinomial counts): their total is then exact in any order
// of addition, which the fits rely on.
// The same points, viewed: a bootstrap replicate passes its counts beside the fixed risks without
// copying either.
struct RiskPoints {
    std::span<const double> x;
    std::span<const double> count;
    std::span<const double> events;

    double patients() const;
    std::size_t occupied() const; // points with a positive count
};

struct RiskSupport {
    std::vector<double> x;
    std::vector<double> count;
    std::vector<double> events;

    double patients() const { return points().patients(); }
    std::size_t occupied() const { return points().occupied(); }
    RiskPoints points() const { return {x, count, events}; }
};

// Collapses patients with equal risks into one weighted point.
RiskSupport collapseRisks(std::span<const std::uint8_t> outcome, std::span<const double> risk, const ScoreOrder& order);

struct LoessOptions {
    double span = 0.75;
    std::size_t maxSupportPoints = 2000;
    std::size_t maxVertices = 500;  // binned: local fits at most here, interpolated between
    std::size_t exactUpTo = 5000;   // always exact (no binning) up to this many patients
    std::stop_token stop;           // a requested stop abandons the fit (no curve)
};

// Smoothed calibration curve: loess of y on p (span 0.75, local quadratic, tricube weights, no
// robustness iterations; Cleveland, Grosse & Shyu 1992), evaluated at every distinct risk, and
// the summaries of |curve − p| over patients of Austin & Steyerberg 2019 (Stat Med 38:4051):
// ICI (mean), E50 (median), E90 (0.9 quantile, R type 7), Emax.
//
// Tied risks form one weighted point, which reproduces loess on the expanded data exactly (the
// neighbourhood is counted in patients; docs/methods.md §12). Above `exactUpTo` patients with
// more than `maxSupportPoints` distinct risks, risks are pooled into that many equal-width bins
// (placed at their mean risk), the local fit is made at up to `maxVertices` of them and the
// curve interpolated linearly in between: the "binned" approximation, whose ICI stays within
// 0.001 of the exact one (tested).
struct LoessSummary {
    std::vector<double> fitted; // per support point, raw (may leave [0,1]); ICI is computed on it
    double ici = 0.0, e50 = 0.0, e90 = 0.0, emax = 0.0;
    bool binned = false;
};

// nullopt when the curve cannot be fitted: fewer than 10 distinct risks (e.g. a points score),
// or a neighbourhood too small or too tied for a local quadratic.
std::optional<LoessSummary> loessOnSupport(const RiskPoints& support, const LoessOptions& options = {});
// The same into `out`, whose buffers are reused (bootstrap replicates); false where the above is
// nullopt, `out` then unspecified.
bool loessInto(const RiskPoints& support, const LoessOptions& options, LoessSummary& out);
inline std::optional<LoessSummary> loessOnSupport(const RiskSupport& support, const LoessOptions& options = {})
{
    return loessOnSupport(support.points(), options);
}

// The same per patient: `fitted` then has one value per patient, in data order.
struct LoessCalibration {
    std::vector<double> fitted;
    double ici = 0.0, e50 = 0.0, e90 = 0.0, emax = 0.0;
    bool binned = false;
};
std::optional<LoessCalibration> loessCalibration(std::span<const std::uint8_t> outcome, std::span<const double> risk,
                                                 const ScoreOrder& order, const LoessOptions& options = {});
std::optional<LoessCalibration> loessCalibration(std::span<const std::uint8_t> outcome, std::span<const double> risk,
                                                 const LoessOptions& options = {});


// The smoothed curve of a whole sample, read off its shared order, for its panel: the summary of
// loessCalibration (ICI, E50, E90, Emax, binned; no fitted values) and `points` (risk, fitted)
// pairs evenly spread over the distinct risks (the k-th of m at distinct risk k·(d − 1)/(m − 1)).
// Binned, the support (three doubles per distinct risk) is never held: the bins are filled as
// the order is walked, and the curve read at each distinct risk as it is walked again, keeping
// only each risk's distance and count for E50 and E90. The same numbers as loessOnSupport of
// collapseRisks.
struct LoessCurve {
    LoessSummary summary;
    std::vector<std::pair<double, double>> points;
};
std::optional<LoessCurve> loessCurve(std::span<const std::uint8_t> outcome, std::span<const double> risk, const ScoreOrder& order,
                                     std::size_t points, const LoessOptions& options = {});

} // namespace plumbline
