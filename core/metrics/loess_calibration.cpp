#include "metrics/loess_calibration.hpp"

#include <algorithm>
#include <cmath>
#include <numeric>

namespace plumbline {

namespace {

// Pools support points into equal-width bins placed at their count-weighted mean; bins holding
// no patient are left out.
RiskSupport bin(const RiskPoints& s, std::size_t bins)
{
    const double lo = s.x.front(), hi = s.x.back();
    const double width = (hi - lo) / double(bins);
    RiskSupport b;
    std::size_t current = bins + 1;
    double weightedX = 0.0;
    auto close = [&] {
        if (b.x.empty())
            return;
        if (b.count.back() > 0.0) {
            b.x.back() = weightedX / b.count.back();
        } else {
            b.x.pop_back();
            b.count.pop_back();
            b.events.pop_back();
        }
    };
    for (std::size_t i = 0; i < s.x.size(); ++i) {
        const auto index = std::min(bins - 1, static_cast<std::size_t>((s.x[i] - lo) / width));
        if (index != current) {
            close();
            b.x.push_back(0.0);
            b.count.push_back(0.0);
            b.events.push_back(0.0);
            weightedX = 0.0;
            current = index;
        }
        b.count.back() += s.count[i];
        b.events.back() += s.events[i];
        weightedX += s.x[i] * s.count[i];
    }
    close();
    return b;
}

// Local quadratic fit at x0 with tricube weights over the neighbourhood holding q patients.
std::optional<double> fitAt(const RiskPoints& s, double x0, double q)
{
    // The q nearest patients: grow a window around x0 by distance until it holds q patients.
    const std::size_t m = s.x.size();
    std::size_t right = std::size_t(std::lower_bound(s.x.begin(), s.x.end(), x0) - s.x.begin());
    std::size_t left = right; // window is [left, right)
    double held = 0.0, h = 0.0;
    while (held < q && (left > 0 || right < m)) {
        const double dl = left > 0 ? x0 - s.x[left - 1] : INFINITY;
        const double dr = right < m ? s.x[right] - x0 : INFINITY;
        if (dl <= dr) {
            held += s.count[--left];
            h = dl;
        } else {
            held += s.count[right++];
            h = dr;
        }
    }
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
    RiskSupport s;
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

double weightedQuantileType7(std::vector<std::pair<double, double>>& values, double probability)
{
    double total = 0.0;
    for (const auto& [value, count] : values)
        total += count;
    const double position = probability * (total - 1.0);
    const double below = std::floor(position);
    // Value at 0-based rank r of the expanded multiset, by three-way partitioning around a pivot.
    auto select = [&values](double rank) {
        auto lo = values.begin(), hi = values.end();
        for (;;) {
            const double pivot = (lo + (hi - lo) / 2)->first;
            auto lessEnd = std::partition(lo, hi, [pivot](const auto& v) { return v.first < pivot; });
            auto equalEnd = std::partition(lessEnd, hi, [pivot](const auto& v) { return v.first == pivot; });
            double less = 0.0, equal = 0.0;
            for (auto it = lo; it != lessEnd; ++it)
                less += it->second;
            for (auto it = lessEnd; it != equalEnd; ++it)
                equal += it->second;
            if (rank < less) {
                hi = lessEnd;
            } else if (rank < less + equal || equalEnd == hi) {
                return pivot;
            } else {
                rank -= less + equal;
                lo = equalEnd;
            }
        }
    };
    const double low = select(below);
    if (below + 1.0 > total - 1.0)
        return low;
    const double high = select(below + 1.0);
    return low + (position - below) * (high - low);
}

std::optional<LoessSummary> loessOnSupport(const RiskPoints& full, const LoessOptions& options)
{
    constexpr std::size_t minimumDistinct = 10; // fewer: a points score, not a smooth risk [common practice]
    const double n = full.patients();
    const double q = std::floor(n * options.span);
    if (full.occupied() < minimumDistinct || q < 3.0)
        return std::nullopt;
    LoessSummary out;
    out.binned = n > double(options.exactUpTo) && full.occupied() > options.maxSupportPoints;
    const RiskSupport binnedSupport = out.binned ? bin(full, options.maxSupportPoints) : RiskSupport{};
    const RiskPoints s = out.binned ? binnedSupport.points() : full;
    thread_local std::vector<double> curve; // kept per thread: replicates call this again and again
    curve.assign(s.x.size(), 0.0);
    // Binned: fits at up to maxVertices bin positions, straight lines between them (the bins
    // are dense, the curve smooth). Exact: a fit at every distinct risk.
    const std::size_t stride = out.binned ? (s.x.size() + options.maxVertices - 1) / options.maxVertices : 1;
    std::vector<std::size_t> vertices;
    for (std::size_t i = 0; i < s.x.size(); i += stride)
        vertices.push_back(i);
    if (vertices.back() != s.x.size() - 1)
        vertices.push_back(s.x.size() - 1);
    for (std::size_t v = 0; v < vertices.size(); ++v) {
        if (options.stop.stop_requested())
            return std::nullopt;
        const std::size_t i = vertices[v];
        const auto value = fitAt(s, s.x[i], q);
        if (!value)
            return std::nullopt;
        curve[i] = *value;
        if (v == 0)
            continue;
        const std::size_t previous = vertices[v - 1];
        for (std::size_t j = previous + 1; j < i; ++j)
            curve[j] = curve[previous] + (s.x[j] - s.x[previous]) / (s.x[i] - s.x[previous]) * (curve[i] - curve[previous]);
    }
    // The fitted value at each distinct risk: its own fit, or interpolated between bin positions.
    if (!out.binned) {
        out.fitted = curve;
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
    thread_local std::vector<std::pair<double, double>> distances;
    distances.clear();
    distances.reserve(full.x.size());
    double sum = 0.0;
    for (std::size_t k = 0; k < full.x.size(); ++k) {
        if (full.count[k] <= 0.0)
            continue;
        const double d = std::abs(out.fitted[k] - full.x[k]);
        sum += d * full.count[k];
        out.emax = std::max(out.emax, d);
        distances.emplace_back(d, full.count[k]);
    }
    out.ici = sum / n;
    out.e50 = weightedQuantileType7(distances, 0.5);
    out.e90 = weightedQuantileType7(distances, 0.9);
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
