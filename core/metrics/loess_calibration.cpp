#include "metrics/loess_calibration.hpp"

#include "metrics/weighted_quantile.hpp"

#include <algorithm>
#include <cmath>
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
        const auto end = std::partition_point(s.x.begin() + std::ptrdiff_t(first), s.x.end(),
                                              [&](double x) { return binOf(x) == index; });
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

// Local quadratic fit at x0 with tricube weights over the neighbourhood holding q patients.
std::optional<double> fitAt(const RiskPoints& s, std::span<const double> cumulative, double x0, double q)
{
    const auto [left, right, h] = neighbourhood(s, cumulative, x0, q);
    if (!(h > 0.0))
        return std::nullopt; // more than q patients share x0: the local quadratic is singular
    double s0 = 0, s1 = 0, s2 = 0, s3 = 0, s4 = 0, t0 = 0, t1 = 0, t2 = 0;
    for (std::size_t i = left; i < right; ++i) {
        const double d = s.x[i] - x0;
        const double u = std::abs(d) / h;
        if (u >= 1.0)
            continue;
        const double tri = 1.0 - u * u * u;
        const double w = tri * tri * tri;
        const double wc = w * s.count[i], wy = w * s.events[i];
        s0 += wc;
        s1 += wc * d;
        s2 += wc * d * d;
        s3 += wc * d * d * d;
        s4 += wc * d * d * d * d;
        t0 += wy;
        t1 += wy * d;
        t2 += wy * d * d;
    }
    // Solve [s0 s1 s2; s1 s2 s3; s2 s3 s4] β = [t0 t1 t2] for β0 by Cramer's rule.
    const double det = s0 * (s2 * s4 - s3 * s3) - s1 * (s1 * s4 - s3 * s2) + s2 * (s1 * s3 - s2 * s2);
    if (!(std::abs(det) > 1e-300) || !std::isfinite(det))
        return std::nullopt;
    const double det0 = t0 * (s2 * s4 - s3 * s3) - s1 * (t1 * s4 - s3 * t2) + s2 * (t1 * s3 - s2 * t2);
    return det0 / det;
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

RiskSupport collapseRisks(std::span<const std::uint8_t> y, std::span<const double> p, const ScoreOrder& order)
{
    // Sized first: grown by doubling, the three arrays of a support as large as the cohort (a
    // risk per patient, written with many decimals) would briefly need half as much again.
    std::size_t distinct = 0;
    for (std::size_t k = 0; k < order.size(); ++k)
        distinct += k == 0 || p[order[k]] != p[order[k - 1]];
    RiskSupport s;
    s.x.reserve(distinct);
    s.count.reserve(distinct);
    s.events.reserve(distinct);
    for (std::size_t k = 0; k < order.size(); ++k) {
        const double x = p[order[k]];
        if (s.x.empty() || x != s.x.back()) {
            s.x.push_back(x);
            s.count.push_back(0.0);
            s.events.push_back(0.0);
        }
        s.count.back() += 1.0;
        s.events.back() += y[order[k]];
    }
    return s;
}

namespace {

// loessInto with the buffer of the points' distances from the curve given: the bootstrap's is
// kept per thread between replicates, a single fit's is freed when it ends.
bool loessIntoUsing(const RiskPoints& full, const LoessOptions& options, LoessSummary& out, std::vector<double>& distance)
{
    constexpr std::size_t minimumDistinct = 10; // fewer: a points score, not a smooth risk [common practice]
    double n = 0.0;
    std::size_t occupied = 0;
    for (const double c : full.count) {
        n += c;
        occupied += c > 0.0;
    }
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
    thread_local std::vector<double> curve, cumulative;
    curve.assign(s.x.size(), 0.0);
    cumulative.resize(s.x.size() + 1);
    cumulative[0] = 0.0;
    for (std::size_t i = 0; i < s.x.size(); ++i)
        cumulative[i + 1] = cumulative[i] + s.count[i];
    // Binned: fits at up to maxVertices bin positions, straight lines between them (the bins
    // are dense, the curve smooth). Exact: a fit at every distinct risk.
    const std::size_t stride = out.binned ? (s.x.size() + options.maxVertices - 1) / options.maxVertices : 1;
    thread_local std::vector<std::size_t> vertices;
    vertices.clear();
    for (std::size_t i = 0; i < s.x.size(); i += stride)
        vertices.push_back(i);
    if (vertices.back() != s.x.size() - 1)
        vertices.push_back(s.x.size() - 1);
    for (std::size_t v = 0; v < vertices.size(); ++v) {
        if (options.stop.stop_requested())
            return false;
        const std::size_t i = vertices[v];
        const auto value = fitAt(s, cumulative, s.x[i], q);
        if (!value)
            return false;
        curve[i] = *value;
        if (v == 0)
            continue;
        const std::size_t previous = vertices[v - 1];
        for (std::size_t j = previous + 1; j < i; ++j)
            curve[j] = curve[previous] + (s.x[j] - s.x[previous]) / (s.x[i] - s.x[previous]) * (curve[i] - curve[previous]);
    }
    // The fitted value at each distinct risk: its own fit, or interpolated between bin positions.
    if (!out.binned) {
        out.fitted.assign(curve.begin(), curve.end());
    } else {
        out.fitted.resize(full.x.size());
        std::size_t j = 0;
        for (std::size_t k = 0; k < full.x.size(); ++k) {
            const double x = full.x[k];
            while (j + 1 < s.x.size() && s.x[j + 1] <= x)
                ++j;
            if (x > s.x[j] && j + 1 < s.x.size())
                out.fitted[k] = curve[j] + (x - s.x[j]) / (s.x[j + 1] - s.x[j]) * (curve[j + 1] - curve[j]);
            else
                out.fitted[k] = curve[j]; // at a bin position, or beyond the first or last: hold the end
        }
    }
    distance.resize(full.x.size());
    double sum = 0.0;
    bool finite = true;
    // Branch-free (which points hold patients is random): a point without patients adds an
    // exact zero to the sum and a zero to the maximum.
    for (std::size_t k = 0; k < full.x.size(); ++k) {
        const double d = std::abs(out.fitted[k] - full.x[k]);
        distance[k] = d;
        finite = finite && std::isfinite(d);
        sum += d * full.count[k];
        out.emax = std::max(out.emax, full.count[k] > 0.0 ? d : 0.0);
    }
    out.ici = sum / n;
    if (!finite)
        return false; // a local fit overflowed: no curve rather than a meaningless one
    const double probabilities[] = {0.5, 0.9};
    double quantiles[2];
    weightedQuantilesType7(distance, full.count, n, probabilities, quantiles, out.emax);
    out.e50 = quantiles[0];
    out.e90 = quantiles[1];
    return true;
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

} // namespace plumbline
