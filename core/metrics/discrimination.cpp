#include "metrics/discrimination.hpp"

#include "metrics/distributions.hpp"

#include <algorithm>
#include <cmath>
#include <numeric>
#include <optional>

namespace plumbline {

namespace {

// Mid-ranks of a tie block of `size` rows, `events` of them events, among all rows, among the
// events and among the non-events, given the rows, events and non-events below the block.
struct TieBlockRanks {
    double all, events, nonEvents;
};
TieBlockRanks tieBlockRanks(std::size_t below, std::size_t eventsBelow, std::size_t nonEventsBelow, std::size_t size,
                            std::size_t events)
{
    return {double(below) + (double(size) + 1.0) / 2.0, double(eventsBelow) + (double(events) + 1.0) / 2.0,
            double(nonEventsBelow) + (double(size - events) + 1.0) / 2.0};
}

} // namespace

Placements delongPlacements(std::span<const std::uint8_t> outcome, std::span<const double> score,
                            const ScoreOrder& order)
{
    const std::size_t total = outcome.size();
    const auto m = static_cast<std::size_t>(std::count(outcome.begin(), outcome.end(), std::uint8_t{1}));
    const std::size_t n = total - m;
    Placements out;
    if (m == 0 || n == 0)
        return out;
    // Each row's position among the events (or non-events) in data order, where its placement
    // goes: 4 bytes a row, one sequential pass. (Packing score, outcome and position into 16
    // bytes a row saved cache misses in the sweep but cost 160 MB at ten million rows, held by
    // both models' panels at once; the sweep fetches the three ahead of itself instead.)
    struct RowKey {
        double score;
        std::uint32_t classIndex;
        std::uint32_t event;
    };
    std::vector<std::uint32_t> classIndex(total);
    std::size_t eventsSeen = 0, nonEventsSeen = 0;
    for (std::size_t i = 0; i < total; ++i)
        classIndex[i] = static_cast<std::uint32_t>(outcome[i] ? eventsSeen++ : nonEventsSeen++);
    out.eventPlacements.resize(m);
    out.nonEventPlacements.resize(n);
    constexpr std::size_t ahead = 16;
    auto key = [&](std::size_t j) -> RowKey {
        if (j + ahead < total) {
            const std::uint32_t later = order[j + ahead];
            __builtin_prefetch(&score[later]);
            __builtin_prefetch(&outcome[later]);
            __builtin_prefetch(&classIndex[later]);
        }
        const std::uint32_t row = order[j];
        return {score[row], classIndex[row], outcome[row] ? 1u : 0u};
    };
    // Sun & Xu: V10 = (rank among all − rank among events)/n, V01 = 1 − (rank among all − rank
    // among non-events)/m, all ranks mid-ranks; a tie block shares them.
    double eventRankSum = 0.0;
    std::size_t below = 0, eventsBelow = 0, nonEventsBelow = 0;
    thread_local std::vector<RowKey> block;
    for (std::size_t k = 0; k < total;) {
        // The tie block, copied as it is read so the second walk needs no random access.
        block.clear();
        block.push_back(key(k));
        std::size_t end = k + 1;
        std::size_t blockEvents = block.back().event;
        while (end < total) {
            const RowKey next = key(end);
            if (next.score != block.front().score)
                break;
            block.push_back(next);
            blockEvents += next.event;
            ++end;
        }
        const std::size_t size = end - k;
        const std::size_t blockNonEvents = size - blockEvents;
        const auto [rankAll, rankEvents, rankNonEvents] = tieBlockRanks(below, eventsBelow, nonEventsBelow, size, blockEvents);
        for (const RowKey& row : block) {
            if (row.event) {
                out.eventPlacements[row.classIndex] = (rankAll - rankEvents) / double(n);
                eventRankSum += rankAll;
            } else {
                out.nonEventPlacements[row.classIndex] = 1.0 - (rankAll - rankNonEvents) / double(m);
            }
        }
        below += size;
        eventsBelow += blockEvents;
        nonEventsBelow += blockNonEvents;
        k = end;
    }
    out.c = (eventRankSum - double(m) * double(m + 1) / 2.0) / (double(m) * double(n));
    return out;
}

Placements delongPlacements(std::span<const std::uint8_t> outcome, std::span<const double> score)
{
    return delongPlacements(outcome, score, ascendingOrder(score));
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
    return cStatistic(delongPlacements(outcome, score), scale, confidence);
}

namespace {

// The estimate and interval of a C with m events and n non-events; `variance` is read only when
// both classes have two patients or more.
Estimate cStatisticEstimate(double c, std::size_t m, std::size_t n, double variance, CStatisticScale scale, double confidence)
{
    if (m == 0 || n == 0)
        return Estimate::undefined();
    Estimate estimate = Estimate::point(c);
    if (m < 2 || n < 2)
        return estimate;
    const double se = std::sqrt(std::max(0.0, variance));
    estimate.se = se;
    const double z = zForConfidence(confidence);
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

} // namespace

Estimate cStatistic(const Placements& placements, CStatisticScale scale, double confidence)
{
    const std::size_t m = placements.eventPlacements.size(), n = placements.nonEventPlacements.size();
    return cStatisticEstimate(placements.c, m, n, m >= 2 && n >= 2 ? delongVariance(placements) : 0.0, scale, confidence);
}

Estimate cStatistic(std::span<const std::uint8_t> outcome, std::span<const double> score, const ScoreOrder& order,
                    CStatisticScale scale, double confidence)
{
    const std::size_t total = outcome.size();
    const auto m = static_cast<std::size_t>(std::count(outcome.begin(), outcome.end(), std::uint8_t{1}));
    const std::size_t n = total - m;
    if (m == 0 || n == 0)
        return Estimate::undefined();
    // The walk of delongPlacements, with each block's placements summed by its counts. The
    // squares are taken about ½, near every C of interest, so that Σ(V − ½)² − (Σ(V − ½))²/m
    // loses no precision to cancellation.
    constexpr double shift = 0.5;
    double eventRankSum = 0.0;
    double eventSum = 0.0, eventSquares = 0.0, nonEventSum = 0.0, nonEventSquares = 0.0;
    std::size_t below = 0, eventsBelow = 0, nonEventsBelow = 0;
    for (std::size_t k = 0; k < total;) {
        // The block's first row is taken before any comparison, so a score equal to nothing
        // (NaN) still ends its block of one, as in delongPlacements.
        const double value = score[order[k]];
        std::size_t end = k + 1;
        std::size_t blockEvents = outcome[order[k]] ? 1 : 0;
        while (end < total && score[order[end]] == value) {
            prefetchInOrder(order, end, score.data(), outcome.data());
            blockEvents += outcome[order[end]] ? 1 : 0;
            ++end;
        }
        const std::size_t blockNonEvents = end - k - blockEvents;
        const auto [rankAll, rankEvents, rankNonEvents] = tieBlockRanks(below, eventsBelow, nonEventsBelow, end - k, blockEvents);
        if (blockEvents > 0) {
            const double v = (rankAll - rankEvents) / double(n) - shift;
            eventSum += double(blockEvents) * v;
            eventSquares += double(blockEvents) * v * v;
            // Added once per event, as delongPlacements adds it, so that C is the same to the bit.
            for (std::size_t e = 0; e < blockEvents; ++e)
                eventRankSum += rankAll;
        }
        if (blockNonEvents > 0) {
            const double v = 1.0 - (rankAll - rankNonEvents) / double(m) - shift;
            nonEventSum += double(blockNonEvents) * v;
            nonEventSquares += double(blockNonEvents) * v * v;
        }
        below = end;
        eventsBelow += blockEvents;
        nonEventsBelow += blockNonEvents;
        k = end;
    }
    const double c = (eventRankSum - double(m) * double(m + 1) / 2.0) / (double(m) * double(n));
    double variance = 0.0;
    if (m >= 2 && n >= 2) {
        const double s10 = (eventSquares - eventSum * eventSum / double(m)) / double(m - 1);
        const double s01 = (nonEventSquares - nonEventSum * nonEventSum / double(n)) / double(n - 1);
        variance = s10 / double(m) + s01 / double(n);
    }
    return cStatisticEstimate(c, m, n, variance, scale, confidence);
}

std::vector<RocPoint> rocCurve(std::span<const std::uint8_t> outcome, std::span<const double> score)
{
    return rocCurve(outcome, score, ascendingOrder(score));
}

namespace {

// The patients by ascending score, read through the shared order.
struct ThroughOrder {
    std::span<const std::uint8_t> outcome;
    std::span<const double> scores;
    const ScoreOrder& order;
    std::size_t size() const { return order.size(); }
    double score(std::size_t k) const { return scores[order[k]]; }
    bool event(std::size_t k) const { return outcome[order[k]] != 0; }
};

// The same gathered into arrays in that order (9 bytes a patient), for walks repeated over it:
// each walk then reads memory in sequence instead of at the order's random places.
struct GatheredInOrder {
    std::vector<double> scores;
    std::vector<std::uint8_t> outcome;
    explicit GatheredInOrder(const ThroughOrder& from)
        : scores(from.size())
        , outcome(from.size())
    {
        for (std::size_t k = 0; k < from.size(); ++k) {
            scores[k] = from.score(k);
            outcome[k] = from.event(k) ? 1 : 0;
        }
    }
    std::size_t size() const { return scores.size(); }
    double score(std::size_t k) const { return scores[k]; }
    bool event(std::size_t k) const { return outcome[k] != 0; }
};

// Calls visit(point) for each point of the ROC curve, highest threshold first: walks the
// patients by ascending score backwards, one point per tie block. False when a class is empty
// (no curve).
template <typename Patients, typename Visit>
bool forEachRocPoint(const Patients& patients, double events, Visit&& visit)
{
    const double nonEvents = double(patients.size()) - events;
    if (events == 0 || nonEvents == 0)
        return false;
    visit(RocPoint{patients.score(patients.size() - 1) + 1.0, 0.0, 1.0});
    double tp = 0.0;
    double fp = 0.0;
    for (std::size_t k = patients.size(); k > 0;) {
        const double threshold = patients.score(k - 1);
        while (k > 0 && patients.score(k - 1) == threshold) {
            (patients.event(k - 1) ? tp : fp) += 1.0;
            --k;
        }
        visit(RocPoint{threshold, tp / events, 1.0 - fp / nonEvents});
    }
    return true;
}

// Drops the interior points of a curve that lie on the line from the last point kept to the
// next one (they carry no area), taking the points one at a time: the first and last are kept.
class CollinearFilter {
public:
    template <typename Keep>
    void add(const RocPoint& point, Keep&& keep)
    {
        if (!m_started) {
            m_started = true;
            m_kept = point;
            keep(point);
            return;
        }
        if (m_pending) {
            const RocPoint& a = m_kept;
            const RocPoint& b = *m_pending;
            const RocPoint& c = point;
            const double cross = (b.specificity - a.specificity) * (c.sensitivity - a.sensitivity)
                - (c.specificity - a.specificity) * (b.sensitivity - a.sensitivity);
            if (std::abs(cross) > 1e-15) {
                m_kept = b;
                keep(b);
            }
        }
        m_pending = point;
    }
    template <typename Keep>
    void finish(Keep&& keep)
    {
        if (m_pending)
            keep(*m_pending);
    }

private:
    bool m_started = false;
    RocPoint m_kept{};
    std::optional<RocPoint> m_pending;
};

// Average precision, one point at a time, summed as averagePrecision sums it.
class AveragePrecisionSum {
public:
    AveragePrecisionSum(double events, double nonEvents)
        : m_events(events)
        , m_nonEvents(nonEvents)
    {
    }
    void add(const RocPoint& point)
    {
        if (m_previous) {
            const double tp = point.sensitivity * m_events;
            const double fp = (1.0 - point.specificity) * m_nonEvents;
            const double precision = tp + fp > 0.0 ? tp / (tp + fp) : 1.0;
            m_ap += (point.sensitivity - m_previous->sensitivity) * precision;
        }
        m_previous = point;
    }
    double value() const { return m_ap; }

private:
    double m_events, m_nonEvents;
    double m_ap = 0.0;
    std::optional<RocPoint> m_previous;
};

} // namespace

std::vector<RocPoint> rocCurve(std::span<const std::uint8_t> outcome, std::span<const double> score,
                               const ScoreOrder& ascending)
{
    std::vector<RocPoint> curve;
    const double events = double(std::count(outcome.begin(), outcome.end(), std::uint8_t{1}));
    forEachRocPoint(ThroughOrder{outcome, score, ascending}, events, [&](const RocPoint& point) { curve.push_back(point); });
    return curve;
}

std::vector<RocPoint> thinRocCurve(const std::vector<RocPoint>& curve, std::size_t maxPoints)
{
    if (curve.size() <= maxPoints || maxPoints < 2)
        return curve;
    // Drop collinear interior points first: they carry no area. Then keep an even spread by
    // false-positive rate, always keeping the ends, so the chart keeps its shape.
    std::vector<RocPoint> kept;
    CollinearFilter filter;
    const auto keep = [&](const RocPoint& point) { kept.push_back(point); };
    for (const RocPoint& point : curve)
        filter.add(point, keep);
    filter.finish(keep);
    if (kept.size() <= maxPoints)
        return kept;
    std::vector<RocPoint> thinned;
    const double step = double(kept.size() - 1) / double(maxPoints - 1);
    for (std::size_t k = 0; k < maxPoints; ++k)
        thinned.push_back(kept[static_cast<std::size_t>(std::llround(double(k) * step))]);
    return thinned;
}

RocSummary rocSummary(std::span<const std::uint8_t> outcome, std::span<const double> score, const ScoreOrder& ascending,
                      std::size_t maxPoints)
{
    // Two walks over the patients by score instead of a curve in memory (24 bytes per distinct
    // score): the first sums the average precision and counts the points and those the thinning
    // keeps, the second gathers the points to show.
    const auto events = static_cast<std::size_t>(std::count(outcome.begin(), outcome.end(), std::uint8_t{1}));
    const GatheredInOrder patients(ThroughOrder{outcome, score, ascending});
    AveragePrecisionSum ap(double(events), double(outcome.size() - events));
    CollinearFilter counting;
    std::size_t points = 0, kept = 0;
    const bool any = forEachRocPoint(patients, double(events), [&](const RocPoint& point) {
        ap.add(point);
        ++points;
        counting.add(point, [&](const RocPoint&) { ++kept; });
    });
    counting.finish([&](const RocPoint&) { ++kept; });
    RocSummary out;
    if (!any)
        return out;
    out.averagePrecision = ap.value();
    if (points <= maxPoints || maxPoints < 2) {
        forEachRocPoint(patients, double(events), [&](const RocPoint& point) { out.thinned.push_back(point); });
        return out;
    }
    // Kept point j is shown when it is the next of round(k·step), k = 0 … maxPoints − 1 (all of
    // them when no more than maxPoints are kept), as thinRocCurve picks them.
    const bool all = kept <= maxPoints;
    const double step = all ? 1.0 : double(kept - 1) / double(maxPoints - 1);
    std::size_t index = 0, next = 0;
    const auto show = [&](const RocPoint& point) {
        if (all || (next < maxPoints && index == static_cast<std::size_t>(std::llround(double(next) * step)))) {
            out.thinned.push_back(point);
            ++next;
        }
        ++index;
    };
    CollinearFilter filter;
    forEachRocPoint(patients, double(events), [&](const RocPoint& point) { filter.add(point, show); });
    filter.finish(show);
    return out;
}

std::optional<double> averagePrecision(std::span<const std::uint8_t> outcome, std::span<const double> score)
{
    const auto events = static_cast<std::size_t>(std::count(outcome.begin(), outcome.end(), std::uint8_t{1}));
    return averagePrecision(rocCurve(outcome, score), events, outcome.size() - events);
}

std::optional<double> averagePrecision(const std::vector<RocPoint>& curve, std::size_t eventCount, std::size_t nonEventCount)
{
    if (curve.empty())
        return std::nullopt;
    const double events = double(eventCount);
    const double nonEvents = double(nonEventCount);
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
