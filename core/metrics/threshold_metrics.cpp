#include "metrics/threshold_metrics.hpp"

#include "metrics/threshold_counts.hpp"

#include <algorithm>

namespace plumbline {

namespace {
ProportionWithCi proportion(std::size_t x, std::size_t n, double confidence, CiMethod method)
{
    if (n == 0)
        return {};
    return {double(x) / double(n), binomialInterval(x, n, confidence, method)};
}
} // namespace

std::vector<ThresholdMetrics> thresholdMetrics(std::span<const std::uint8_t> outcome, std::span<const double> risk,
                                               std::span<const double> thresholds, double confidence, CiMethod method)
{
    return thresholdMetrics(outcome, risk, ascendingOrder(risk), thresholds, confidence, method);
}

std::vector<ThresholdMetrics> thresholdMetrics(std::span<const std::uint8_t> outcome, std::span<const double> risk,
                                               const ScoreOrder& order, std::span<const double> thresholds,
                                               double confidence, CiMethod method)
{
    // Each threshold is a binary search in the shared order.
    const std::vector<ThresholdCounts> above = countsAtOrAbove(outcome, risk, order, thresholds);
    const std::size_t n = outcome.size();
    const std::size_t events = static_cast<std::size_t>(std::count(outcome.begin(), outcome.end(), std::uint8_t{1}));
    const double rate = n ? double(events) / double(n) : 0.0;
    std::vector<ThresholdMetrics> out;
    for (std::size_t j = 0; j < thresholds.size(); ++j) {
        const double t = thresholds[j];
        ThresholdMetrics m;
        m.threshold = t;
        m.tp = above[j].events;
        m.fn = events - m.tp;
        m.fp = above[j].nonEvents;
        m.tn = n - events - m.fp;
        m.sensitivity = proportion(m.tp, m.tp + m.fn, confidence, method);
        m.specificity = proportion(m.tn, m.tn + m.fp, confidence, method);
        m.ppv = proportion(m.tp, m.tp + m.fp, confidence, method);
        m.npv = proportion(m.tn, m.tn + m.fn, confidence, method);
        m.flagRate = proportion(m.tp + m.fp, n, confidence, method);
        if (m.ppv.value && *m.ppv.value > 0.0)
            m.numberNeededToEvaluate = 1.0 / *m.ppv.value;
        const double odds = t / (1.0 - t);
        if (n > 0) {
            m.netBenefit = double(m.tp) / double(n) - double(m.fp) / double(n) * odds;
            m.netBenefitTreatAll = rate - (1.0 - rate) * odds;
        }
        out.push_back(m);
    }
    return out;
}

} // namespace plumbline
