#include "discrimination.hpp"

#include "distributions.hpp"

#include <algorithm>
#include <cmath>
#include <numeric>

namespace plumbline {

std::vector<double> midRanks(std::span<const double> values)
{
    const std::size_t n = values.size();
    std::vector<std::size_t> order(n);
    std::iota(order.begin(), order.end(), std::size_t{0});
    std::sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) { return values[a] < values[b]; });
    std::vector<double> ranks(n);
    for (std::size_t i = 0; i < n;) {
        std::size_t j = i;
        while (j + 1 < n && values[order[j + 1]] == values[order[i]])
            ++j;
        const double rank = 0.5 * double(i + j) + 1.0; // positions i..j (0-based) → mean 1-based rank
        for (std::size_t k = i; k <= j; ++k)
            ranks[order[k]] = rank;
        i = j + 1;
    }
    return ranks;
}

Placements delongPlacements(std::span<const std::uint8_t> outcome, std::span<const double> score)
{
    std::vector<double> events;
    std::vector<double> nonEvents;
    for (std::size_t i = 0; i < outcome.size(); ++i)
        (outcome[i] ? events : nonEvents).push_back(score[i]);
    const std::size_t m = events.size();
    const std::size_t n = nonEvents.size();
    Placements out;
    if (m == 0 || n == 0)
        return out;
    std::vector<double> all(events);
    all.insert(all.end(), nonEvents.begin(), nonEvents.end());
    const std::vector<double> rankAll = midRanks(all);
    const std::vector<double> rankEvents = midRanks(events);
    const std::vector<double> rankNonEvents = midRanks(nonEvents);
    out.eventPlacements.resize(m);
    out.nonEventPlacements.resize(n);
    double eventRankSum = 0.0;
    for (std::size_t i = 0; i < m; ++i) {
        out.eventPlacements[i] = (rankAll[i] - rankEvents[i]) / double(n);
        eventRankSum += rankAll[i];
    }
    for (std::size_t j = 0; j < n; ++j)
        out.nonEventPlacements[j] = 1.0 - (rankAll[m + j] - rankNonEvents[j]) / double(m);
    out.c = (eventRankSum - double(m) * double(m + 1) / 2.0) / (double(m) * double(n));
    return out;
}

namespace {
double sampleCovariance(const std::vector<double>& a, double meanA, const std::vector<double>& b, double meanB)
{
    double sum = 0.0;
    for (std::size_t i = 0; i < a.size(); ++i)
        sum += (a[i] - meanA) * (b[i] - meanB);
    return sum / double(a.size() - 1);
}
} // namespace

double delongCovariance(const Placements& a, const Placements& b)
{
    const double s10 = sampleCovariance(a.eventPlacements, a.c, b.eventPlacements, b.c);
    const double s01 = sampleCovariance(a.nonEventPlacements, a.c, b.nonEventPlacements, b.c);
    return s10 / double(a.eventPlacements.size()) + s01 / double(a.nonEventPlacements.size());
}

double delongVariance(const Placements& placements)
{
    return delongCovariance(placements, placements);
}

Estimate cStatistic(std::span<const std::uint8_t> outcome, std::span<const double> score, CStatisticScale scale,
                    double confidence)
{
    const Placements placements = delongPlacements(outcome, score);
    if (placements.eventPlacements.empty() || placements.nonEventPlacements.empty())
        return Estimate::undefined();
    Estimate estimate = Estimate::point(placements.c);
    if (placements.eventPlacements.size() < 2 || placements.nonEventPlacements.size() < 2)
        return estimate;
    const double se = std::sqrt(std::max(0.0, delongVariance(placements)));
    estimate.se = se;
    const double z = zForConfidence(confidence);
    const double c = placements.c;
    if (scale == CStatisticScale::Plain) {
        estimate.lower = std::max(0.0, c - z * se);
        estimate.upper = std::min(1.0, c + z * se);
        estimate.ciMethod = CiMethod::DeLongPlain;
        return estimate;
    }
    if (c <= 0.0 || c >= 1.0)
        return estimate; // the logit interval does not exist at the boundary
    const double centre = std::log(c / (1.0 - c));
    const double half = z * se / (c * (1.0 - c));
    estimate.lower = 1.0 / (1.0 + std::exp(-(centre - half)));
    estimate.upper = 1.0 / (1.0 + std::exp(-(centre + half)));
    estimate.ciMethod = CiMethod::DeLongLogit;
    return estimate;
}

std::vector<RocPoint> rocCurve(std::span<const std::uint8_t> outcome, std::span<const double> score)
{
    std::vector<std::size_t> order(score.size());
    std::iota(order.begin(), order.end(), std::size_t{0});
    std::sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) { return score[a] > score[b]; });
    const double events = double(std::count(outcome.begin(), outcome.end(), std::uint8_t{1}));
    const double nonEvents = double(outcome.size()) - events;
    std::vector<RocPoint> curve;
    if (events == 0 || nonEvents == 0)
        return curve;
    curve.push_back({order.empty() ? 1.0 : score[order.front()] + 1.0, 0.0, 1.0});
    double tp = 0.0;
    double fp = 0.0;
    for (std::size_t i = 0; i < order.size();) {
        const double threshold = score[order[i]];
        while (i < order.size() && score[order[i]] == threshold) {
            (outcome[order[i]] ? tp : fp) += 1.0;
            ++i;
        }
        curve.push_back({threshold, tp / events, 1.0 - fp / nonEvents});
    }
    return curve;
}

std::vector<RocPoint> thinRocCurve(const std::vector<RocPoint>& curve, std::size_t maxPoints)
{
    if (curve.size() <= maxPoints || maxPoints < 2)
        return curve;
    // Drop collinear interior points first: they carry no area. Then keep an even spread by
    // false-positive rate, always keeping the ends, so the chart keeps its shape.
    std::vector<RocPoint> kept{curve.front()};
    for (std::size_t i = 1; i + 1 < curve.size(); ++i) {
        const RocPoint& a = kept.back();
        const RocPoint& b = curve[i];
        const RocPoint& c = curve[i + 1];
        const double cross = (b.specificity - a.specificity) * (c.sensitivity - a.sensitivity)
            - (c.specificity - a.specificity) * (b.sensitivity - a.sensitivity);
        if (std::abs(cross) > 1e-15)
            kept.push_back(b);
    }
    kept.push_back(curve.back());
    if (kept.size() <= maxPoints)
        return kept;
    std::vector<RocPoint> thinned;
    const double step = double(kept.size() - 1) / double(maxPoints - 1);
    for (std::size_t k = 0; k < maxPoints; ++k)
        thinned.push_back(kept[static_cast<std::size_t>(std::llround(double(k) * step))]);
    return thinned;
}

std::optional<double> averagePrecision(std::span<const std::uint8_t> outcome, std::span<const double> score)
{
    const auto curve = rocCurve(outcome, score);
    if (curve.empty())
        return std::nullopt;
    const double events = double(std::count(outcome.begin(), outcome.end(), std::uint8_t{1}));
    const double nonEvents = double(outcome.size()) - events;
    double ap = 0.0;
    for (std::size_t k = 1; k < curve.size(); ++k) {
        const double tp = curve[k].sensitivity * events;
        const double fp = (1.0 - curve[k].specificity) * nonEvents;
        const double precision = tp + fp > 0.0 ? tp / (tp + fp) : 1.0;
        ap += (curve[k].sensitivity - curve[k - 1].sensitivity) * precision;
    }
    return ap;
}

std::optional<double> discriminationSlope(std::span<const std::uint8_t> outcome, std::span<const double> risk)
{
    double sumEvents = 0.0, sumNonEvents = 0.0;
    std::size_t events = 0, nonEvents = 0;
    for (std::size_t i = 0; i < outcome.size(); ++i) {
        if (outcome[i]) {
            sumEvents += risk[i];
            ++events;
        } else {
            sumNonEvents += risk[i];
            ++nonEvents;
        }
    }
    if (events == 0 || nonEvents == 0)
        return std::nullopt;
    return sumEvents / double(events) - sumNonEvents / double(nonEvents);
}

} // namespace plumbline
