#include "metrics/operating_points.hpp"

#include <algorithm>
#include <cmath>

namespace plumbline {

std::vector<OperatingPoint> operatingPoints(std::span<const std::uint8_t> outcome, std::span<const double> risk,
                                            const ScoreOrder& order, double step)
{
    const auto steps = static_cast<std::size_t>(std::llround(1.0 / step));
    std::size_t events = 0;
    for (std::uint8_t y : outcome)
        events += y;
    const std::size_t nonEvents = outcome.size() - events;
    std::vector<OperatingPoint> out;
    // Walk the ascending order once: rows below the threshold are the negatives.
    std::size_t k = 0, eventsBelow = 0, nonEventsBelow = 0;
    for (std::size_t s = 0; s <= steps; ++s) {
        const double t = double(s) / double(steps);
        while (k < order.size() && risk[order[k]] < t) {
            prefetchInOrder(order, k, risk.data(), outcome.data());
            (outcome[order[k]] ? eventsBelow : nonEventsBelow) += 1;
            ++k;
        }
        out.push_back({t, events - eventsBelow, nonEvents - nonEventsBelow, nonEventsBelow, eventsBelow});
    }
    return out;
}

OperatingPointSummary summarise(const OperatingPoint& p)
{
    auto ratio = [](std::size_t a, std::size_t b) { return b > 0 ? std::optional<double>(double(a) / double(b)) : std::nullopt; };
    OperatingPointSummary s;
    s.sensitivity = ratio(p.tp, p.tp + p.fn);
    s.specificity = ratio(p.tn, p.tn + p.fp);
    s.ppv = ratio(p.tp, p.tp + p.fp);
    s.npv = ratio(p.tn, p.tn + p.fn);
    const double n = double(p.tp + p.fp + p.tn + p.fn);
    s.flagRate = double(p.tp + p.fp) / n;
    const double odds = p.threshold < 1.0 ? p.threshold / (1.0 - p.threshold) : 0.0;
    const double rate = double(p.tp + p.fn) / n;
    s.netBenefit = double(p.tp) / n - double(p.fp) / n * odds;
    s.netBenefitTreatAll = rate - (1.0 - rate) * odds;
    return s;
}

RiskHistogram riskHistogram(std::span<const std::uint8_t> outcome, std::span<const double> risk, std::size_t bins)
{
    RiskHistogram h;
    for (std::size_t b = 0; b <= bins; ++b)
        h.edges.push_back(double(b) / double(bins));
    h.events.assign(bins, 0);
    h.nonEvents.assign(bins, 0);
    for (std::size_t i = 0; i < risk.size(); ++i) {
        const auto bin = std::min(bins - 1, static_cast<std::size_t>(std::max(0.0, risk[i]) * double(bins)));
        ++(outcome[i] ? h.events : h.nonEvents)[bin];
    }
    return h;
}

OperatingPoint treatAll(const OperatingPoint& point)
{
    return {point.threshold, point.tp + point.fn, point.fp + point.tn, 0, 0};
}

} // namespace plumbline
