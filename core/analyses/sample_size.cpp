#include "analyses/sample_size.hpp"

#include "metrics/distributions.hpp"

#include <iomanip>
#include <sstream>
#include <cmath>
#include <cstdio>
#include <vector>

namespace plumbline {

namespace {

constexpr int gridPoints = 4001;

double expit(double x)
{
    return 1.0 / (1.0 + std::exp(-x));
}

// The standard normal on a fine grid over ±9 SD: nodes and normalised weights, computed once.
// The linear predictor's grid is μ + σ·z, so nothing here depends on μ or σ.
struct StandardGrid {
    std::vector<double> z, w;
    StandardGrid()
    {
        double total = 0.0;
        for (int i = 0; i < gridPoints; ++i) {
            z.push_back(-9.0 + 18.0 * i / (gridPoints - 1));
            w.push_back(std::exp(-0.5 * z.back() * z.back()));
            total += w.back();
        }
        for (double& weight : w)
            weight /= total;
    }
};

const StandardGrid& standardGrid()
{
    static const StandardGrid grid;
    return grid;
}

// The LP distribution on the grid: points and normalised weights.
struct Grid {
    std::vector<double> x, w;
};

Grid grid(double mu, double sigma)
{
    const StandardGrid& s = standardGrid();
    Grid g{std::vector<double>(gridPoints), s.w};
    for (int i = 0; i < gridPoints; ++i)
        g.x[i] = mu + sigma * s.z[i];
    return g;
}

// C of the LP for outcomes drawn from it: P(x_event > x_non-event), ties (none on a grid) half.
double cOf(double mu, double sigma)
{
    const StandardGrid& g = standardGrid();
    double events = 0.0, nonEvents = 0.0, below = 0.0, numerator = 0.0;
    for (int i = 0; i < gridPoints; ++i) {
        const double p = expit(mu + sigma * g.z[i]);
        const double e = g.w[i] * p, n = g.w[i] * (1.0 - p);
        numerator += e * (below + 0.5 * n);
        below += n;
        events += e;
        nonEvents += n;
    }
    return numerator / (events * nonEvents);
}

// μ such that the mean risk is the prevalence. The mean risk rises with μ, with slope
// Σ w·p(1 − p): safeguarded Newton steps inside a shrinking bracket converge in a handful of
// passes where plain bisection needed 200 (the planner answers while the user types).
double solveMu(double prevalence, double sigma)
{
    const StandardGrid& g = standardGrid();
    double lo = -20.0, hi = 20.0, mu = std::log(prevalence / (1.0 - prevalence));
    for (int k = 0; k < 200; ++k) {
        double mean = 0.0, slope = 0.0;
        for (int i = 0; i < gridPoints; ++i) {
            const double p = expit(mu + sigma * g.z[i]);
            mean += g.w[i] * p;
            slope += g.w[i] * p * (1.0 - p);
        }
        (mean < prevalence ? lo : hi) = mu;
        double next = slope > 0.0 ? mu - (mean - prevalence) / slope : 0.5 * (lo + hi);
        if (!(next > lo && next < hi))
            next = 0.5 * (lo + hi);
        if (std::abs(next - mu) <= 1e-15 * std::max(1.0, std::abs(mu)) || hi - lo <= 1e-15 * std::max(1.0, std::abs(mu)))
            return next;
        mu = next;
    }
    return mu;
}

std::string label(const char* format, double value)
{
    char buffer[64];
    std::snprintf(buffer, sizeof buffer, format, value);
    return buffer;
}

} // namespace

std::optional<SampleSizePlan> planSampleSize(double phi, double c, const SampleSizeTargets& targets)
{
    if (!(phi > 0.0 && phi < 1.0) || !(c > 0.5 && c < 1.0))
        return std::nullopt;
    SampleSizePlan plan;
    // σ by bisection on C (C rises with σ), μ for each σ from the prevalence.
    double lo = 1e-3, hi = 10.0;
    for (int k = 0; k < 100 && hi - lo > 1e-13 * hi; ++k) {
        const double mid = 0.5 * (lo + hi);
        (cOf(solveMu(phi, mid), mid) < c ? lo : hi) = mid;
    }
    plan.sigma = 0.5 * (lo + hi);
    plan.mu = solveMu(phi, plan.sigma);
    const double z = zForConfidence(targets.confidence);
    auto add = [&](std::string name, double se, double n) {
        const auto patients = static_cast<std::size_t>(std::ceil(n - 1e-9));
        plan.criteria.push_back({std::move(name), se, patients, double(patients) * phi});
    };
    // 1. O/E: SE(ln O/E) = sqrt((1 − φ)/(Nφ)); a width w around 1 means SE = asinh(w/2)/z.
    const double seOe = std::asinh(targets.oeWidth / 2.0) / z;
    add("O/E", seOe, (1.0 - phi) / (phi * seOe * seOe));
    // 2. Slope: N = I_α / (SE² (I_α I_β − I_αβ²)) with the information over the LP distribution.
    const Grid g = grid(plan.mu, plan.sigma);
    double ia = 0.0, iab = 0.0, ib = 0.0;
    for (int i = 0; i < gridPoints; ++i) {
        const double p = expit(g.x[i]), v = g.w[i] * p * (1.0 - p);
        ia += v;
        iab += v * g.x[i];
        ib += v * g.x[i] * g.x[i];
    }
    const double seSlope = targets.slopeWidth / (2.0 * z);
    add("calibration slope", seSlope, ia / (seSlope * seSlope * (ia * ib - iab * iab)));
    // 3. C: the Newcombe (2006) form of Hanley & McNeil's SE with N/2 − 1 (from memory); solve for N.
    const double seC = targets.cWidth / (2.0 * z);
    auto seOfC = [&](double n) {
        const double m = n / 2.0 - 1.0;
        return std::sqrt(c * (1.0 - c) * (1.0 + m * (1.0 - c) / (2.0 - c) + m * c / (1.0 + c)) / (n * n * phi * (1.0 - phi)));
    };
    double nLo = 4.0, nHi = 1e9;
    for (int k = 0; k < 200; ++k) {
        const double mid = 0.5 * (nLo + nHi);
        (seOfC(mid) > seC ? nLo : nHi) = mid;
    }
    add("C statistic", seC, nHi);
    // 4. Standardised net benefit at each threshold (docs/methods.md §22): SE from Se and Sp at t.
    const double seNb = targets.netBenefitWidth / (2.0 * z);
    for (double t : targets.thresholds) {
        double tp = 0.0, fp = 0.0;
        for (int i = 0; i < gridPoints; ++i)
            if (expit(g.x[i]) >= t) {
                tp += g.w[i] * expit(g.x[i]);
                fp += g.w[i] * (1.0 - expit(g.x[i]));
            }
        const double se = tp / phi, sp = 1.0 - fp / (1.0 - phi);
        const double w = (1.0 - phi) / phi * t / (1.0 - t);
        const double n = (se * (1.0 - se) / phi + w * w * sp * (1.0 - sp) / (1.0 - phi) + w * w * (1.0 - sp) * (1.0 - sp) / (phi * (1.0 - phi)))
            / (seNb * seNb);
        add(label("net benefit at %.2f", t), seNb, n);
    }
    for (const auto& criterion : plan.criteria)
        if (criterion.patients > plan.minimum) {
            plan.minimum = criterion.patients;
            plan.driver = criterion.name;
        }
    return plan;
}

std::string describePlan(const SampleSizePlan& plan, double prevalence, double cStatistic, const SampleSizeTargets& targets)
{
    std::ostringstream out;
    out << "Minimum sample size for an external validation (Riley et al. 2021 criteria)\n"
        << "  anticipated outcome proportion " << prevalence << ", C statistic " << cStatistic << "\n"
        << "  linear predictor assumed Normal(" << std::fixed << std::setprecision(4) << plan.mu << ", " << plan.sigma
        << "^2), calibration assumed perfect\n\n";
    out << "  " << std::left << std::setw(26) << "criterion" << std::right << std::setw(11) << "target SE" << std::setw(12)
        << "patients" << std::setw(10) << "events" << '\n';
    for (const auto& c : plan.criteria)
        out << "  " << std::left << std::setw(26) << c.name << std::right << std::setw(11) << std::setprecision(5) << c.targetSe
            << std::setw(12) << c.patients << std::setw(10) << std::setprecision(0) << c.events << '\n';
    out << "\n  Minimum: " << plan.minimum << " patients (about " << std::setprecision(0) << double(plan.minimum) * prevalence
        << " events), driven by the " << plan.driver << " criterion.\n"
        << std::setprecision(2) << "  Targets: CI widths " << targets.oeWidth << " for O/E, " << targets.slopeWidth
        << " for the calibration slope, " << targets.cWidth << " for C, " << targets.netBenefitWidth
        << " for standardised net benefit (the defaults are common choices, not rules).\n";
    return out.str();
}

} // namespace plumbline
