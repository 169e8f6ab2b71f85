#include "analyses/decision_curve.hpp"

#include "analyses/paired_bootstrap.hpp"

#include <cmath>
#include <numeric>

namespace plumbline {

std::vector<double> decisionGrid(double from, double to, double step)
{
    std::vector<double> grid;
    const auto steps = static_cast<long>(std::floor((to - from) / step + 1e-9));
    for (long k = 0; k <= steps; ++k) {
        // Rounded to the step's decimals so that 0.05 + 3·0.01 is exactly 0.08, as the user wrote it.
        const double t = std::round((from + double(k) * step) * 1e6) / 1e6;
        if (t > 0.0 && t < 1.0)
            grid.push_back(t);
    }
    return grid;
}

namespace {

std::vector<DecisionCurvePoint> curveOf(const std::vector<double>& nb, double rate, std::span<const double> thresholds)
{
    std::vector<DecisionCurvePoint> curve;
    for (std::size_t k = 0; k < thresholds.size(); ++k) {
        const double t = thresholds[k], odds = t / (1.0 - t);
        DecisionCurvePoint p;
        p.threshold = t;
        p.netBenefit = nb[k];
        p.treatAll = rate - (1.0 - rate) * odds;
        p.standardized = nb[k] / rate;
        p.netReductionPer100 = (nb[k] - p.treatAll) / odds * 100.0;
        curve.push_back(p);
    }
    return curve;
}

} // namespace

std::vector<DecisionCurvePoint> decisionCurve(const ModelSupport& support, const SupportCounts& counts,
                                              std::span<const double> thresholds)
{
    const double events = std::accumulate(counts.events.begin(), counts.events.end(), 0.0);
    const double n = events + std::accumulate(counts.nonEvents.begin(), counts.nonEvents.end(), 0.0);
    return curveOf(netBenefitAt(support, counts, thresholds), events / n, thresholds);
}

std::vector<DecisionCurvePoint> decisionCurve(std::span<const ThresholdCounts> above, std::size_t events, std::size_t n,
                                              std::span<const double> thresholds)
{
    // Whole numbers, so each is the same double as the sums over support points give.
    const double total = double(n);
    std::vector<double> nb;
    for (std::size_t k = 0; k < thresholds.size(); ++k) {
        const double t = thresholds[k];
        nb.push_back(double(above[k].events) / total - double(above[k].nonEvents) / total * t / (1.0 - t));
    }
    return curveOf(nb, double(events) / total, thresholds);
}

} // namespace plumbline
