#include "metrics/loess_calibration.hpp"

#include "metrics/weighted_quantile.hpp"

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <numeric>

namespace plumbline {

namespace {

// Pools support points into equal-width bins placed at their count-weighted mean; bins holding
// no patient are left out. The points are sorted and a point's bin never decreases with its risk
// (rounding is monotone), so each bin's first point is found by binary search: a few thousand
// divisions instead of one per point, the same bins and the same sums in the same order.
void binInto(const RiskPoints& s, std::size_t bins, RiskSupport& b)
{
    const double lo = s.x.front(), hi = s.x.back();
    const double width = (hi - lo) / double(bins);
    auto binOf = [&](double x) { return std::min(bins - 1, static_cast<std::size_t>((x - lo) / width)); };
    b.x.clear();
    b.count.clear();
    b.events.clear();
    std::size_t first = 0;
    while (first < s.x.size()) {
        const std::size_t index = binOf(s.x[first]);
        // The bin's end, searched for near its start (a bin spans a small part of the support):
        // steps doubling from the start, then halving, so the points read stay close together
        // instead of a search over the whole support missing the cache at every step.
        auto inBin = [&](double x) { return binOf(x) == index; };
        std::size_t below = first + 1, step = 1; // s.x[below - 1] is in the bin
        while (below + step <= s.x.size() && inBin(s.x[below + step - 1])) {
            below += step;
            step *= 2;
        }
        const std::size_t limit = std::min(s.x.size(), below + step - 1);
        const auto end = std::partition_point(s.x.begin() + std::ptrdiff_t(below), s.x.begin() + std::ptrdiff_t(limit), inBin);
        const auto last = static_cast<std::size_t>(end - s.x.begin());
        double count = 0.0, events = 0.0, weightedX = 0.0;
        for (std::size_t i = first; i < last; ++i) {
            count += s.count[i];
            events += s.events[i];
            weightedX += s.x[i] * s.count[i];
        }
        if (count > 0.0) {
            b.x.push_back(weightedX / count);
            b.count.push_back(count);
            b.events.push_back(events);
        }
        first = last;
    }
}

// The neighbourhood of x0 holding q patients: the points taken nearest first (the nearer of
// the two sides next, the left one on a tie) until they hold q patients; h is the distance of the
// last one taken. Found by binary search on that distance with cumulative counts (whole numbers,
// so exact in any order): the same h, and the same fit, as growing the window one point at a
// time, at a logarithmic instead of a linear cost per fit.
struct Neighbourhood {
    std::size_t left, right; // [left, right)
    double h;
};

Neighbourhood neighbourhood(const RiskPoints& s, std::span<const double> cumulative, double x0, double q)
{
    const std::size_t m = s.x.size();
    const auto start = std::size_t(std::lower_bound(s.x.begin(), s.x.end(), x0) - s.x.begin());
    // First left point within h (x0 − x ≤ h), one past the last right point within h (x − x0 ≤ h);
    // the computed distances are monotone in x, so each is a binary search.
    auto leftWithin = [&](double h) {
        return std::size_t(std::partition_point(s.x.begin(), s.x.begin() + std::ptrdiff_t(start),
                                                [&](double x) { return x0 - x > h; })
                           - s.x.begin());
    };
    auto rightWithin = [&](double h) {
        return std::size_t(std::partition_point(s.x.begin() + std::ptrdiff_t(start), s.x.end(),
                                                [&](double x) { return x - x0 <= h; })
                           - s.x.begin());
    };
    auto heldWithin = [&](double h) { return cumulative[rightWithin(h)] - cumulative[leftWithin(h)]; };
    // The smallest distance of a point, on either side, at which q patients are held.
    double h = INFINITY;
    {
        std::size_t lo = 0, hi = start; // left: the nearest i in [lo, hi) still holding q
        while (lo < hi) {
            const std::size_t mid = lo + (hi - lo) / 2;
            if (heldWithin(x0 - s.x[mid]) >= q)
                lo = mid + 1;
            else
                hi = mid;
        }
        if (lo > 0)
            h = x0 - s.x[lo - 1];
    }
    {
        std::size_t lo = start, hi = m; // right: the nearest j in [lo, hi) holding q
        while (lo < hi) {
            const std::size_t mid = lo + (hi - lo) / 2;
            if (heldWithin(s.x[mid] - x0) >= q)
                hi = mid;
            else
                lo = mid + 1;
        }
        if (lo < m)
            h = std::min(h, s.x[lo] - x0);
    }
    if (h == INFINITY) // fewer than q patients in all: everything, h the farthest
        return {0, m, std::max(x0 - s.x.front(), s.x.back() - x0)};
    // Points at distance h itself have weight zero, so which of them the growing window would
    // have taken changes nothing: all points within h are returned.
    const std::size_t left = leftWithin(h), right = rightWithin(h);
    return {left, right, h};
}

// Solves [s0 s1 s2; s1 s2 s3; s2 s3 s4] β = [t0 t1 t2] for β0 by Cramer's rule.
std::optional<double> solveLocalQuadratic(double s0, double s1, double s2, double s3, double s4, double t0, double t1,
                                          double t2)
{
    const double det = s0 * (s2 * s4 - s3 * s3) - s1 * (s1 * s4 - s3 * s2) + s2 * (s1 * s3 - s2 * s2);
    if (!(std::abs(det) > 1e-300) || !std::isfinite(det))
        return std::nullopt;
    const double det0 = t0 * (s2 * s4 - s3 * s3) - s1 * (t1 * s4 - s3 * t2) + s2 * (t1 * s3 - s2 * t2);
    return det0 / det;
}

// Local quadratic fit at x0 with tricube weights over the neighbourhood holding q patients.
// The weighted sums of a local quadratic fit, for one fit (T = double) or for one per vector
// lane: the same operations in the same order either way.
template <class T>
struct KernelSums {
    T s0{}, s1{}, s2{}, s3{}, s4{}, t0{}, t1{}, t2{};
    // A point at distance d from x0 with tricube weight w. By reference and always inlined: the
    // four-lane caller is built for AVX2, this template is not.
    [[gnu::always_inline]] void add(const T& d, const T& w, double count, double events)
    {
        const T wc = w * count, wy = w * events;
        s0 += wc;
        s1 += wc * d;
        s2 += wc * d * d;
        s3 += wc * d * d * d;
        s4 += wc * d * d * d * d;
        t0 += wy;
        t1 += wy * d;
        t2 += wy * d * d;
    }
};

std::optional<double> fitAt(const RiskPoints& s, std::span<const double> cumulative, double x0, double q)
{
    const auto [left, right, h] = neighbourhood(s, cumulative, x0, q);
    if (!(h > 0.0))
        return std::nullopt; // more than q patients share x0: the local quadratic is singular
    KernelSums<double> sums;
    for (std::size_t i = left; i < right; ++i) {
        const double d = s.x[i] - x0;
        const double u = std::abs(d) / h;
        if (u >= 1.0)
            continue;
        const double tri = 1.0 - u * u * u;
        sums.add(d, tri * tri * tri, s.count[i], s.events[i]);
    }
    return solveLocalQuadratic(sums.s0, sums.s1, sums.s2, sums.s3, sums.s4, sums.t0, sums.t1, sums.t2);
}

// Four local fits at once, one per lane of a vector: each lane adds the same terms in the same
// order as fitAt (a lane's points outside its own window, or at or beyond its h, add a zero,
// which changes no sum), so each value is fitAt's to the bit. The kernel sums are most of the
// loess's cost in a replicate (a few hundred fits over about 1,500 bins each); lanes make them
// vector instructions without changing the order of any sum. False when a lane has a window the
// lanes cannot share (no width): the caller then fits one at a time.
using Lanes = double __attribute__((vector_size(4 * sizeof(double))));
using LaneMask = std::int64_t __attribute__((vector_size(4 * sizeof(double))));
constexpr std::size_t laneCount = 4;

// Built twice, the machine choosing at load time: with 256-bit vectors where the processor has
// AVX2 (one instruction per operation on the four lanes), with two 128-bit halves otherwise.
// Either way each lane's operations are the same IEEE operations in the same order (no fused
// multiply-add is enabled), so the two builds give the same bits.
__attribute__((target_clones("avx2", "default")))
bool fitFour(const RiskPoints& s, std::span<const double> cumulative, const double (&x0)[laneCount], double q,
             std::optional<double> (&out)[laneCount])
{
    Lanes center, width;
    std::size_t left = s.x.size(), right = 0;
    for (std::size_t j = 0; j < laneCount; ++j) {
        const Neighbourhood n = neighbourhood(s, cumulative, x0[j], q);
        if (!(n.h > 0.0))
            return false;
        center[j] = x0[j];
        width[j] = n.h;
        left = std::min(left, n.left);
        right = std::max(right, n.right);
    }
    const LaneMask magnitude = {INT64_MAX, INT64_MAX, INT64_MAX, INT64_MAX};
    KernelSums<Lanes> sums;
    for (std::size_t i = left; i < right; ++i) {
        const Lanes d = s.x[i] - center;
        const Lanes u = Lanes(LaneMask(d) & magnitude) / width; // |d| / h
        const LaneMask inside = u < 1.0;
        const Lanes tri = 1.0 - u * u * u;
        sums.add(d, Lanes(LaneMask(tri * tri * tri) & inside), s.count[i], s.events[i]);
    }
    for (std::size_t j = 0; j < laneCount; ++j)
        out[j] = solveLocalQuadratic(sums.s0[j], sums.s1[j], sums.s2[j], sums.s3[j], sums.s4[j], sums.t0[j], sums.t1[j],
                                     sums.t2[j]);
    return true;
}

} // namespace

double RiskPoints::patients() const
{
    return std::accumulate(count.begin(), count.end(), 0.0);
}

std::size_t RiskPoints::occupied() const
{
    return static_cast<std::size_t>(std::count_if(count.begin(), count.end(), [](double c) { return c > 0.0; }));
}

namespace {

constexpr std::size_t minimumDistinct = 10; // fewer: a points score, not a smooth risk [common practice]

// Calls visit(risk, patients, events) for each distinct risk in ascending order: the points
// collapseRisks makes, with the same sums.
template <typename Visit>
void forEachDistinctRisk(std::span<const std::uint8_t> y, std::span<const double> p, const ScoreOrder& order, Visit&& visit)
{
    for (std::size_t k = 0; k < order.size();) {
        const double x = p[order[k]];
        double count = 0.0, events = 0.0;
        do {
            prefetchInOrder(order, k, p.data(), y.data());
            count += 1.0;
            events += y[order[k]];
            ++k;
        } while (k < order.size() && p[order[k]] == x);
        visit(x, count, events);
    }
}

} // namespace

RiskSupport collapseRisks(std::span<const std::uint8_t> y, std::span<const double> p, const ScoreOrder& order)
{
    // Sized first: grown by doubling, the three arrays of a support as large as the cohort (a
    // risk per patient, written with many decimals) would briefly need half as much again.
    std::size_t distinct = 0;
    forEachDistinctRisk(y, p, order, [&](double, double, double) { ++distinct; });
    RiskSupport s;
    s.x.reserve(distinct);
    s.count.reserve(distinct);
    s.events.reserve(distinct);
    forEachDistinctRisk(y, p, order, [&](double x, double count, double events) {
        s.x.push_back(x);
        s.count.push_back(count);
        s.events.push_back(events);
    });
    return s;
}

namespace {

// The curve at every point of s: a local fit at each (exact), or at up to maxVertices of them
// with straight lines between (binned: the bins are dense, the curve smooth). False when a fit
// fails or a stop is requested.
bool fitCurve(const RiskPoints& s, double q, bool binned, const LoessOptions& options, std::vector<double>& curve)
{
    thread_local std::vector<double> cumulative;
    curve.assign(s.x.size(), 0.0);
    cumulative.resize(s.x.size() + 1);
    cumulative[0] = 0.0;
    for (std::size_t i = 0; i < s.x.size(); ++i)
        cumulative[i + 1] = cumulative[i] + s.count[i];
    const std::size_t stride = binned ? (s.x.size() + options.maxVertices - 1) / options.maxVertices : 1;
    thread_local std::vector<std::size_t> vertices;
    vertices.clear();
    for (std::size_t i = 0; i < s.x.size(); i += stride)
        vertices.push_back(i);
    if (vertices.back() != s.x.size() - 1)
        vertices.push_back(s.x.size() - 1);
    // The fits, four vertices at a time where they can share lanes (fitFour), one at a time
    // otherwise; then straight lines between consecutive vertices.
    thread_local std::vector<double> atVertices;
    atVertices.resize(vertices.size());
    for (std::size_t v = 0; v < vertices.size(); v += laneCount) {
        if (options.stop.stop_requested())
            return false;
        std::optional<double> values[laneCount];
        const std::size_t lanes = std::min(laneCount, vertices.size() - v);
        bool together = false;
        if (lanes == laneCount) {
            double at[laneCount];
            for (std::size_t j = 0; j < laneCount; ++j)
                at[j] = s.x[vertices[v + j]];
            together = fitFour(s, cumulative, at, q, values);
        }
        for (std::size_t j = 0; j < lanes; ++j) {
            if (!together)
                values[j] = fitAt(s, cumulative, s.x[vertices[v + j]], q);
            if (!values[j])
                return false;
            atVertices[v + j] = *values[j];
        }
    }
    for (std::size_t v = 0; v < vertices.size(); ++v) {
        const std::size_t i = vertices[v];
        curve[i] = atVertices[v];
        if (v == 0)
            continue;
        const std::size_t previous = vertices[v - 1];
        for (std::size_t j = previous + 1; j < i; ++j)
            curve[j] = curve[previous] + (s.x[j] - s.x[previous]) / (s.x[i] - s.x[previous]) * (curve[i] - curve[previous]);
    }
    return true;
}

// A binned curve read at ascending risks: linear between bin positions, held beyond the first
// and the last.
class CurveBetweenBins {
public:
    CurveBetweenBins(std::span<const double> x, std::span<const double> curve)
        : m_x(x)
        , m_curve(curve)
    {
    }
    double at(double x)
    {
        while (m_j + 1 < m_x.size() && m_x[m_j + 1] <= x)
            ++m_j;
        if (x > m_x[m_j] && m_j + 1 < m_x.size())
            return m_curve[m_j] + (x - m_x[m_j]) / (m_x[m_j + 1] - m_x[m_j]) * (m_curve[m_j + 1] - m_curve[m_j]);
        return m_curve[m_j]; // at a bin position, or beyond the first or last: hold the end
    }

private:
    std::span<const double> m_x, m_curve;
    std::size_t m_j = 0;
};

// ICI, Emax, E50 and E90 of |curve − risk| over patients, from the distinct risks one at a time.
// A local object, its add() inlined: the compiler then keeps the sums in registers while the
// distances are stored (a sum kept in an object the caller owns could alias those stores).
class DistanceSummary {
public:
    DistanceSummary(std::vector<double>& distance, std::size_t points)
        : m_distance(distance)
        , m_buckets(threadBuckets())
        , m_filler(m_buckets)
    {
        m_distance.resize(points);
    }
    // Branch-free (which points hold patients is random): a point without patients adds an
    // exact zero to the sum and a zero to the maximum. The distances' counts by bucket, for E50
    // and E90, are gathered here rather than in another pass over them.
    void add(std::size_t k, double fitted, double x, double count)
    {
        const double d = std::abs(fitted - x);
        m_distance[k] = d;
        m_finite = m_finite && std::isfinite(d);
        m_sum += d * count;
        m_emax = std::max(m_emax, count > 0.0 ? d : 0.0);
        m_filler.add(d, count);
    }
    // False when a local fit overflowed: no curve rather than a meaningless one.
    bool finish(std::span<const double> counts, double n, LoessSummary& out)
    {
        m_filler.finish();
        out.ici = m_sum / n;
        out.emax = m_emax;
        if (!m_finite)
            return false;
        const double probabilities[] = {0.5, 0.9};
        double quantiles[2];
        weightedQuantilesType7(m_distance, counts, n, probabilities, quantiles, &m_buckets);
        out.e50 = quantiles[0];
        out.e90 = quantiles[1];
        return true;
    }

private:
    // The buckets' counts are kept per thread (a few thousand doubles), cleared for each use.
    static QuantileBuckets& threadBuckets()
    {
        thread_local QuantileBuckets buckets;
        buckets.clear();
        return buckets;
    }

    std::vector<double>& m_distance;
    QuantileBuckets& m_buckets;
    QuantileBuckets::Filler m_filler;
    double m_sum = 0.0, m_emax = 0.0;
    bool m_finite = true;
};

// loessInto with the buffer of the points' distances from the curve given: the bootstrap's is
// kept per thread between replicates, a single fit's is freed when it ends.
bool loessIntoUsing(const RiskPoints& full, const LoessOptions& options, LoessSummary& out, std::vector<double>& distance)
{
    // Four running sums: the counts are whole numbers, so their total is exact in any order, and
    // four chains of additions run in parallel where one would wait on each addition in turn.
    double partial[4] = {0.0, 0.0, 0.0, 0.0};
    std::size_t occupied = 0;
    const std::size_t points = full.count.size();
    std::size_t i = 0;
    for (; i + 4 <= points; i += 4)
        for (std::size_t j = 0; j < 4; ++j) {
            partial[j] += full.count[i + j];
            occupied += full.count[i + j] > 0.0;
        }
    for (; i < points; ++i) {
        partial[0] += full.count[i];
        occupied += full.count[i] > 0.0;
    }
    const double n = (partial[0] + partial[1]) + (partial[2] + partial[3]);
    const double q = std::floor(n * options.span);
    if (occupied < minimumDistinct || q < 3.0)
        return false;
    out.ici = out.e50 = out.e90 = out.emax = 0.0;
    out.binned = n > double(options.exactUpTo) && occupied > options.maxSupportPoints;
    // Buffers kept per thread: bootstrap replicates call this again and again.
    thread_local RiskSupport binnedSupport;
    if (out.binned)
        binInto(full, options.maxSupportPoints, binnedSupport);
    const RiskPoints s = out.binned ? binnedSupport.points() : full;
    thread_local std::vector<double> curve;
    if (!fitCurve(s, q, out.binned, options, curve))
        return false;
    // The fitted value at each distinct risk (its own fit, or interpolated between bin positions)
    // and its distance from the risk, in one pass, through raw pointers.
    out.fitted.resize(full.x.size());
    double* const fitted = out.fitted.data();
    const double* const x = full.x.data();
    const double* const count = full.count.data();
    DistanceSummary summary(distance, full.x.size());
    if (!out.binned) {
        for (std::size_t k = 0; k < full.x.size(); ++k) {
            fitted[k] = curve[k];
            summary.add(k, fitted[k], x[k], count[k]);
        }
    } else {
        CurveBetweenBins between(s.x, curve);
        for (std::size_t k = 0; k < full.x.size(); ++k) {
            fitted[k] = between.at(x[k]);
            summary.add(k, fitted[k], x[k], count[k]);
        }
    }
    return summary.finish(full.count, n, out);
}

// binInto of the support collapseRisks would make, filled as the order is walked: the same bins
// with the same sums, without the support.
void binOnOrder(std::span<const std::uint8_t> y, std::span<const double> p, const ScoreOrder& order, double lo, double hi,
                std::size_t bins, RiskSupport& b)
{
    const double width = (hi - lo) / double(bins);
    auto binOf = [&](double x) { return std::min(bins - 1, static_cast<std::size_t>((x - lo) / width)); };
    b = RiskSupport{};
    std::size_t index = 0;
    double count = 0.0, events = 0.0, weightedX = 0.0;
    auto close = [&] {
        if (count > 0.0) {
            b.x.push_back(weightedX / count);
            b.count.push_back(count);
            b.events.push_back(events);
        }
        count = events = weightedX = 0.0;
    };
    bool first = true;
    forEachDistinctRisk(y, p, order, [&](double x, double patients, double pointEvents) {
        if (first || binOf(x) != index) {
            if (!first)
                close();
            index = binOf(x);
            first = false;
        }
        count += patients;
        events += pointEvents;
        weightedX += x * patients;
    });
    close();
}

} // namespace

bool loessInto(const RiskPoints& full, const LoessOptions& options, LoessSummary& out)
{
    thread_local std::vector<double> distance;
    return loessIntoUsing(full, options, out, distance);
}

std::optional<LoessSummary> loessOnSupport(const RiskPoints& full, const LoessOptions& options)
{
    // A buffer of its own: a single fit on a large cohort would otherwise leave a double per
    // distinct risk held by the thread for as long as it lives.
    LoessSummary out;
    std::vector<double> distance;
    if (!loessIntoUsing(full, options, out, distance))
        return std::nullopt;
    return out;
}

std::optional<LoessCalibration> loessCalibration(std::span<const std::uint8_t> outcome, std::span<const double> risk,
                                                 const LoessOptions& options)
{
    return loessCalibration(outcome, risk, ascendingOrder(risk), options);
}

std::optional<LoessCalibration> loessCalibration(std::span<const std::uint8_t> outcome, std::span<const double> risk,
                                                 const ScoreOrder& order, const LoessOptions& options)
{
    const RiskSupport support = collapseRisks(outcome, risk, order);
    const auto summary = loessOnSupport(support, options);
    if (!summary)
        return std::nullopt;
    LoessCalibration out{std::vector<double>(risk.size()), summary->ici, summary->e50, summary->e90, summary->emax,
                         summary->binned};
    std::size_t k = 0;
    for (std::size_t j = 0; j < order.size(); ++j) {
        if (j > 0 && risk[order[j]] != risk[order[j - 1]])
            ++k;
        out.fitted[order[j]] = summary->fitted[k];
    }
    return out;
}

std::optional<LoessCurve> loessCurve(std::span<const std::uint8_t> outcome, std::span<const double> risk, const ScoreOrder& order,
                                     std::size_t points, const LoessOptions& options)
{
    std::size_t distinct = 0;
    double first = 0.0, last = 0.0;
    forEachDistinctRisk(outcome, risk, order, [&](double x, double, double) {
        first = distinct++ == 0 ? x : first;
        last = x;
    });
    // Whole numbers: the same double as the support's summed counts.
    const double n = double(order.size());
    const bool binned = n > double(options.exactUpTo) && distinct > options.maxSupportPoints;
    LoessCurve out;
    const std::size_t wanted = std::min(distinct, points);
    // The k-th of `wanted` points sits at distinct risk k·(distinct − 1)/(wanted − 1).
    auto pointAt = [&](std::size_t k) { return wanted == 1 ? 0 : k * (distinct - 1) / (wanted - 1); };
    if (!binned) {
        const RiskSupport support = collapseRisks(outcome, risk, order);
        const auto summary = loessOnSupport(support, options);
        if (!summary)
            return std::nullopt;
        out.summary = *summary;
        for (std::size_t k = 0; k < wanted; ++k)
            out.points.emplace_back(support.x[pointAt(k)], summary->fitted[pointAt(k)]);
        out.summary.fitted.clear();
        return out;
    }
    const double q = std::floor(n * options.span);
    if (distinct < minimumDistinct || q < 3.0)
        return std::nullopt;
    out.summary.binned = true;
    RiskSupport bins;
    binOnOrder(outcome, risk, order, first, last, options.maxSupportPoints, bins);
    std::vector<double> curve;
    if (!fitCurve(bins.points(), q, true, options, curve))
        return std::nullopt;
    // The distances and counts of the distinct risks (two doubles each) are all that is held.
    std::vector<double> distance, counts(distinct);
    DistanceSummary summary(distance, distinct);
    CurveBetweenBins between(bins.x, curve);
    std::size_t k = 0, next = 0;
    forEachDistinctRisk(outcome, risk, order, [&](double x, double patients, double) {
        const double fitted = between.at(x);
        summary.add(k, fitted, x, patients);
        counts[k] = patients;
        for (; next < wanted && pointAt(next) == k; ++next)
            out.points.emplace_back(x, fitted);
        ++k;
    });
    if (!summary.finish(counts, n, out.summary))
        return std::nullopt;
    return out;
}

} // namespace plumbline
