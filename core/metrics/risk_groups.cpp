#include "metrics/risk_groups.hpp"

#include "metrics/binomial_interval.hpp"
#include "metrics/distributions.hpp"

#include <algorithm>

namespace plumbline {

std::vector<RiskGroup> riskGroups(std::span<const std::uint8_t> outcome, std::span<const double> risk,
                                  std::size_t groups, double confidence, CiMethod method)
{
    return riskGroups(outcome, risk, ascendingOrder(risk), groups, confidence, method);
}

std::vector<RiskGroup> riskGroups(std::span<const std::uint8_t> outcome, std::span<const double> risk,
                                  const ScoreOrder& order, std::size_t groups, double confidence, CiMethod method)
{
    const std::size_t n = risk.size();
    std::vector<RiskGroup> out;
    if (n == 0 || groups == 0)
        return out;
    const double target = double(n) / double(groups);
    // Boundaries: close a group once it reaches its cumulative target, at the end of a tie block.
    std::vector<std::pair<std::size_t, std::size_t>> spans;
    std::size_t start = 0;
    for (std::size_t i = 0; i < n;) {
        std::size_t j = i;
        while (j + 1 < n && risk[order[j + 1]] == risk[order[i]]) {
            prefetchInOrder(order, j + 1, risk.data());
            ++j;
        }
        prefetchInOrder(order, j + 1, risk.data());
        const double reached = double(j + 1);
        if (reached >= target * double(spans.size() + 1) - 1e-9 || j + 1 == n) {
            spans.emplace_back(start, j + 1);
            start = j + 1;
        }
        i = j + 1;
    }
    if (spans.size() > 1 && double(spans.back().second - spans.back().first) < target / 2.0) {
        spans[spans.size() - 2].second = spans.back().second;
        spans.pop_back();
    }
    for (const auto& [from, to] : spans) {
        RiskGroup g{};
        g.group = out.size() + 1;
        g.n = to - from;
        g.riskMin = risk[order[from]];
        g.riskMax = risk[order[to - 1]];
        for (std::size_t k = from; k < to; ++k) {
            prefetchInOrder(order, k, risk.data(), outcome.data());
            g.events += outcome[order[k]];
            g.expected += risk[order[k]];
        }
        g.meanPredicted = g.expected / double(g.n);
        g.observedRate = double(g.events) / double(g.n);
        const Interval ci = binomialInterval(g.events, g.n, confidence, method);
        g.ciLower = ci.lower;
        g.ciUpper = ci.upper;
        out.push_back(g);
    }
    return out;
}

std::optional<HosmerLemeshowTest> hosmerLemeshow(const std::vector<RiskGroup>& groups)
{
    if (groups.size() < 2)
        return std::nullopt;
    double statistic = 0.0;
    for (const auto& g : groups) {
        const double variance = g.expected * (1.0 - g.meanPredicted);
        if (!(variance > 0.0))
            return std::nullopt;
        const double diff = double(g.events) - g.expected;
        statistic += diff * diff / variance;
    }
    const std::size_t df = groups.size();
    return HosmerLemeshowTest{statistic, df, groups.size(), chiSquaredUpperTail(statistic, double(df))};
}

} // namespace plumbline
