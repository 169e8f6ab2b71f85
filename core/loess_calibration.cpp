#include "loess_calibration.hpp"

#include <algorithm>
#include <cmath>
#include <numeric>

namespace plumbline {

namespace {

// Distinct x with the patients' count and the number of events at it.
struct SupportPoints {
    std::vector<double> x;
    std::vector<double> count;
    std::vector<double> events;
};

SupportPoints collapse(std::span<const std::uint8_t> y, std::span<const double> p, const ScoreOrder& order)
{
    SupportPoints s;
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

// Pools support points into equal-width bins placed at their count-weighted mean.
SupportPoints bin(const SupportPoints& s, std::size_t bins)
{
    const double lo = s.x.front(), hi = s.x.back();
    const double width = (hi - lo) / double(bins);
    SupportPoints b;
    std::size_t current = bins + 1;
    double weightedX = 0.0;
    for (std::size_t i = 0; i < s.x.size(); ++i) {
        const auto index = std::min(bins - 1, static_cast<std::size_t>((s.x[i] - lo) / width));
        if (index != current) {
            if (!b.x.empty())
                b.x.back() = weightedX / b.count.back();
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
    b.x.back() = weightedX / b.count.back();
    return b;
}

// Local quadratic fit at x0 with tricube weights over the neighbourhood holding q patients.
std::optional<double> fitAt(const SupportPoints& s, double x0, double q)
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

// R's type-7 quantile (numpy's default) by selection, not a full sort: O(n).
double quantileType7(std::vector<double>& values, double probability)
{
    const double position = probability * double(values.size() - 1);
    const auto below = static_cast<std::size_t>(std::floor(position));
    std::nth_element(values.begin(), values.begin() + static_cast<long>(below), values.end());
    const double low = values[below];
    if (below + 1 >= values.size())
        return low;
    const double high = *std::min_element(values.begin() + static_cast<long>(below) + 1, values.end());
    return low + (position - double(below)) * (high - low);
}

} // namespace

std::optional<LoessCalibration> loessCalibration(std::span<const std::uint8_t> outcome, std::span<const double> risk,
                                                 const LoessOptions& options)
{
    return loessCalibration(outcome, risk, ascendingOrder(risk), options);
}

std::optional<LoessCalibration> loessCalibration(std::span<const std::uint8_t> outcome, std::span<const double> risk,
                                                 const ScoreOrder& order, const LoessOptions& options)
{
    const std::size_t n = risk.size();
    SupportPoints support = collapse(outcome, risk, order);
    constexpr std::size_t minimumDistinct = 10; // fewer: a points score, not a smooth risk [common practice]
    const double q = std::floor(double(n) * options.span);
    if (support.x.size() < minimumDistinct || q < 3.0)
        return std::nullopt;
    LoessCalibration out;
    if (n > options.exactUpTo && support.x.size() > options.maxSupportPoints) {
        support = bin(support, options.maxSupportPoints);
        out.binned = true;
    }
    out.supportPoints = support.x.size();
    std::vector<double> curve(support.x.size());
    for (std::size_t i = 0; i < support.x.size(); ++i) {
        const auto value = fitAt(support, support.x[i], q);
        if (!value)
            return std::nullopt;
        curve[i] = *value;
    }
    // Each patient's fitted value: exact at its own risk, or interpolated between bin positions.
    out.fitted.resize(n);
    std::size_t j = 0;
    for (std::size_t k = 0; k < n; ++k) {
        const double x = risk[order[k]];
        while (j + 1 < support.x.size() && support.x[j + 1] <= x)
            ++j;
        double value = curve[j];
        if (out.binned && x != support.x[j] && j + 1 < support.x.size() && x > support.x[j]) {
            const double t = (x - support.x[j]) / (support.x[j + 1] - support.x[j]);
            value = curve[j] + t * (curve[j + 1] - curve[j]);
        } else if (out.binned && x < support.x[j]) {
            value = curve[j]; // below the first bin position: hold the end value
        }
        out.fitted[order[k]] = value;
    }
    std::vector<double> distance(n);
    for (std::size_t i = 0; i < n; ++i)
        distance[i] = std::abs(out.fitted[i] - risk[i]);
    out.ici = std::accumulate(distance.begin(), distance.end(), 0.0) / double(n);
    out.e50 = quantileType7(distance, 0.5);
    out.e90 = quantileType7(distance, 0.9);
    out.emax = *std::max_element(distance.begin(), distance.end());
    return out;
}

} // namespace plumbline
