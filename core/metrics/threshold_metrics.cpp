#include "metrics/threshold_metrics.hpp"

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
    // Risks of each class in ascending order from the shared order; each threshold is then a
    // binary search.
    std::vector<double> eventRisks;
    std::vector<double> nonEventRisks;
    for (const std::uint32_t row : order)
        (outcome[row] ? eventRisks : nonEventRisks).push_back(risk[row]);
    const std::size_t n = outcome.size();
    const double rate = n ? double(eventRisks.size()) / double(n) : 0.0;
    std::vector<ThresholdMetrics> out;
    for (double t : thresholds) {
        ThresholdMetrics m;
        m.threshold = t;
        const auto atOrAbove = [t](const std::vector<double>& sorted) {
            return std::size_t(sorted.end() - std::lower_bound(sorted.begin(), sorted.end(), t));
        };
        m.tp = atOrAbove(eventRisks);
        m.fn = eventRisks.size() - m.tp;
        m.fp = atOrAbove(nonEventRisks);
        m.tn = nonEventRisks.size() - m.fp;
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
