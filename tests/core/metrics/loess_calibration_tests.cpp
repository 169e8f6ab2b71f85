#include "support/check_datasets.hpp"
#include "files/cohort_simulator.hpp"
#include "support/intake_test_support.hpp"
#include "test_paths.hpp"
#include "metrics/loess_calibration.hpp"
#include "resampling/random_stream.hpp"

#include <catch2/catch.hpp>

#include <algorithm>
#include <cmath>

using namespace plumbline;
using namespace plumbline::test;
using Catch::Matchers::WithinAbs;

// Check values: docs/methods.md §12, R 4.2.2 loess(y ~ p, control = loess.control(surface =
// "direct")), reproduced by an independent Python implementation to 1e-6; ICI, E50, E90 and Emax
// as defined by Austin & Steyerberg 2019 (Stat Med 38:4051).
TEST_CASE("Direct loess reproduces the Toy-20 fitted curve and ICI E50 E90 Emax", "[loess]")
{
    const auto a = toy20A();
    const auto fit = loessCalibration(a.y, a.p);
    REQUIRE(fit);
    const double expected[20] = {0.107319, 0.161376, 0.192824, 0.192824, 0.221033, 0.257221, 0.301008,
                                 0.301008, 0.328571, 0.369033, 0.369033, 0.407647, 0.437001, 0.465187,
                                 0.535888, 0.632026, 0.727799, 0.746904, 0.608144, 0.299646};
    for (std::size_t i = 0; i < 20; ++i)
        CHECK_THAT(fit->fitted[i], WithinAbs(expected[i], 1e-6));
    CHECK_THAT(fit->ici, WithinAbs(0.1072957, 1e-6));
    CHECK_THAT(fit->e50, WithinAbs(0.0817012, 1e-6));
    CHECK_THAT(fit->e90, WithinAbs(0.1342048, 1e-6));
    CHECK_THAT(fit->emax, WithinAbs(0.6003545, 1e-6));
    CHECK_FALSE(fit->binned);
}

TEST_CASE("Direct loess reproduces the Gen-1000 ICI E50 E90 Emax", "[loess]")
{
    const auto gen = gen1000();
    const auto fit = loessCalibration(gen.y, gen.p);
    REQUIRE(fit);
    CHECK_THAT(fit->ici, WithinAbs(0.035817, 1e-6));
    CHECK_THAT(fit->e50, WithinAbs(0.026915, 1e-6));
    CHECK_THAT(fit->e90, WithinAbs(0.079262, 1e-6));
    CHECK_THAT(fit->emax, WithinAbs(0.087841, 1e-6));
}

namespace {
// ICI by the exact (collapsed, unbinned) computation and by the default, which bins above 5,000
// patients with more than 2,000 distinct risks.
void checkBinnedAgainstExact(const Cohort& cohort)
{
    for (const auto& model : cohort.models) {
        LoessOptions exactOptions;
        exactOptions.maxSupportPoints = cohort.rows();
        const auto exact = loessCalibration(cohort.outcome, model.values, exactOptions);
        const auto binned = loessCalibration(cohort.outcome, model.values);
        REQUIRE(exact);
        REQUIRE(binned);
        CHECK_FALSE(exact->binned);
        CHECK(binned->binned);
        CHECK_THAT(binned->ici, WithinAbs(exact->ici, 0.001));
        CHECK_THAT(binned->e90, WithinAbs(exact->e90, 0.002));
    }
}

IntakeSettings sampleSettings(std::string file)
{
    IntakeSettings settings = settingsFor({"supplier_score", "local_score"}, "readmitted_30d");
    settings.cohortFile = std::move(file);
    return settings;
}
} // namespace

TEST_CASE("The binned loess keeps ICI within 0.001 of the exact value on the sample cohort", "[loess][slow]")
{
    const auto intake = runIntake(sampleSettings(std::string(sampleDataDir) + "/readmissions.csv"));
    REQUIRE(intake);
    checkBinnedAgainstExact(intake->cohort);
}

TEST_CASE("The binned loess keeps ICI within 0.001 of the exact value on a simulated 50000-row cohort", "[loess][slow]")
{
    const auto files = simulateCohort({50000, 424242}, false);
    const auto intake = intakeOf(sampleSettings("simulated.csv"), files.cohort);
    REQUIRE(intake);
    checkBinnedAgainstExact(intake->cohort);
}

TEST_CASE("The binned approximation keeps ICI within 0.001 of the exact value on 50000 continuous risks", "[loess][slow]")
{
    // Continuous risks (all distinct) so the binning really approximates.
    RandomStream random(50000);
    const std::size_t n = 50000;
    std::vector<std::uint8_t> y(n);
    std::vector<double> p(n);
    for (std::size_t i = 0; i < n; ++i) {
        const double lp = -1.8 + 0.9 * random.normal();
        p[i] = 1.0 / (1.0 + std::exp(-(0.3 + 1.3 * lp)));
        y[i] = random.uniform() < 1.0 / (1.0 + std::exp(-lp)) ? 1 : 0;
    }
    LoessOptions exactOptions;
    exactOptions.exactUpTo = n;
    const auto exact = loessCalibration(y, p, exactOptions);
    LoessOptions binnedOptions;
    binnedOptions.maxSupportPoints = 2000;
    const auto binned = loessCalibration(y, p, binnedOptions);
    REQUIRE(exact);
    REQUIRE(binned);
    CHECK_FALSE(exact->binned);
    CHECK(binned->binned);
    CHECK_THAT(binned->ici, WithinAbs(exact->ici, 0.001));
}

namespace {
// The direct loess of docs/methods.md §12, row by row (no collapsing of ties): q = floor(N·span),
// h = q-th smallest distance, tricube weights, weighted least squares on [1, d, d²].
double bruteForceLoessAt(const std::vector<std::uint8_t>& y, const std::vector<double>& p, double x0)
{
    const std::size_t n = p.size();
    std::vector<double> d(n);
    for (std::size_t i = 0; i < n; ++i)
        d[i] = std::abs(p[i] - x0);
    std::vector<double> sorted = d;
    const auto q = static_cast<std::size_t>(std::floor(double(n) * 0.75));
    std::nth_element(sorted.begin(), sorted.begin() + static_cast<long>(q - 1), sorted.end());
    const double h = sorted[q - 1];
    double m[3][3] = {}, r[3] = {};
    for (std::size_t i = 0; i < n; ++i) {
        if (d[i] >= h)
            continue;
        const double u = d[i] / h, w = std::pow(1.0 - u * u * u, 3);
        const double x[3] = {1.0, p[i] - x0, (p[i] - x0) * (p[i] - x0)};
        for (int a = 0; a < 3; ++a) {
            r[a] += w * x[a] * y[i];
            for (int b = 0; b < 3; ++b)
                m[a][b] += w * x[a] * x[b];
        }
    }
    // Gaussian elimination for the intercept.
    for (int c = 0; c < 3; ++c)
        for (int row = c + 1; row < 3; ++row) {
            const double f = m[row][c] / m[c][c];
            for (int k = c; k < 3; ++k)
                m[row][k] -= f * m[c][k];
            r[row] -= f * r[c];
        }
    double beta[3];
    for (int c = 2; c >= 0; --c) {
        beta[c] = r[c];
        for (int k = c + 1; k < 3; ++k)
            beta[c] -= m[c][k] * beta[k];
        beta[c] /= m[c][c];
    }
    return beta[0];
}
} // namespace

TEST_CASE("Collapsing tied risks gives the same curve as loess on the rows themselves", "[loess]")
{
    RandomStream random(77);
    for (int trial = 0; trial < 5; ++trial) {
        const std::size_t n = 300 + random.below(300);
        std::vector<std::uint8_t> y(n);
        std::vector<double> p(n);
        for (std::size_t i = 0; i < n; ++i) {
            p[i] = 0.02 + 0.01 * double(random.below(40)); // 40 values, many ties
            y[i] = random.uniform() < p[i] ? 1 : 0;
        }
        const auto fit = loessCalibration(y, p);
        REQUIRE(fit);
        for (std::size_t i = 0; i < n; i += 7)
            CHECK_THAT(fit->fitted[i], WithinAbs(bruteForceLoessAt(y, p, p[i]), 1e-9));
    }
}

TEST_CASE("Fewer than ten distinct risks give no smoothed curve", "[loess]")
{
    const std::vector<std::uint8_t> y{0, 1, 0, 0, 1, 0, 1, 1, 0, 0, 1, 0};
    const std::vector<double> points{1, 2, 3, 4, 5, 6, 7, 8, 9, 1, 2, 3};
    CHECK_FALSE(loessCalibration(y, points)); // 9 distinct values: a points score (common practice; docs/methods.md §12)
}

namespace {

// The neighbourhood grown one point at a time (nearer side first, the left one on a tie) and the
// local quadratic by Cramer's rule: the definition of docs/methods.md §12 written out plainly, to
// hold the binary-searched neighbourhood of the implementation to the same points and h.
double plainLocalFit(const RiskSupport& s, double x0, double q)
{
    const std::size_t m = s.x.size();
    std::size_t right = std::size_t(std::lower_bound(s.x.begin(), s.x.end(), x0) - s.x.begin()), left = right;
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
    const double det = s0 * (s2 * s4 - s3 * s3) - s1 * (s1 * s4 - s3 * s2) + s2 * (s1 * s3 - s2 * s2);
    const double det0 = t0 * (s2 * s4 - s3 * s3) - s1 * (t1 * s4 - s3 * t2) + s2 * (t1 * s3 - s2 * t2);
    return det0 / det;
}

} // namespace

TEST_CASE("The searched neighbourhood gives the same fits as growing it point by point", "[loess]")
{
    // Also holds the fits made four at a time in vector lanes (every fit here goes through them
    // but the last few of each support) to the plain one-at-a-time sums, bit for bit.
    RandomStream random(5, 9);
    for (int trial = 0; trial < 300; ++trial) {
        // Risks on a coarse grid (so distances to the left and right tie exactly) or spread, some
        // points without patients, as in a bootstrap replicate.
        RiskSupport s;
        const std::size_t m = 12 + random.below(150);
        const bool grid = trial % 2 == 0;
        for (std::size_t k = 0; k < m; ++k) {
            const double x = grid ? double(k + 1) / 256.0 : (s.x.empty() ? 0.0 : s.x.back()) + 1e-4 + random.uniform() * 0.01;
            s.x.push_back(x);
            const double count = random.below(4) == 0 ? 0.0 : double(1 + random.below(3));
            s.count.push_back(count);
            s.events.push_back(double(random.below(std::uint64_t(count) + 1)));
        }
        const auto fit = loessOnSupport(s);
        if (!fit)
            continue; // too few occupied points or a singular neighbourhood
        const double q = std::floor(s.patients() * 0.75);
        for (std::size_t k = 0; k < m; ++k) {
            INFO("trial " << trial << " point " << k);
            CHECK(fit->fitted[k] == plainLocalFit(s, s.x[k], q));
        }
    }
}

TEST_CASE("The sample's curve read off the order equals the loess of its collapsed support", "[loess]")
{
    // Risks with ties on a fine grid, binned (small thresholds for binning) and exact.
    RandomStream random(5);
    std::vector<std::uint8_t> y;
    std::vector<double> p;
    for (int i = 0; i < 6000; ++i) {
        p.push_back(0.02 + double(random.below(4000)) / 4200.0);
        y.push_back(random.uniform() < p.back() * 0.8 + 0.05 ? 1 : 0);
    }
    const ScoreOrder order = ascendingOrder(p);
    const RiskSupport support = collapseRisks(y, p, order);
    LoessOptions binned;
    binned.exactUpTo = 1000;
    binned.maxSupportPoints = 300;
    binned.maxVertices = 60;
    LoessOptions exact;
    exact.exactUpTo = 100000;
    for (const auto* options : {&binned, &exact}) {
        const auto expected = loessOnSupport(support, *options);
        REQUIRE(expected);
        for (const std::size_t points : {std::size_t{1}, std::size_t{2}, std::size_t{101}, support.x.size() + 5}) {
            const auto curve = loessCurve(y, p, order, points, *options);
            REQUIRE(curve);
            CHECK(curve->summary.binned == expected->binned);
            CHECK(curve->summary.ici == expected->ici);
            CHECK(curve->summary.e50 == expected->e50);
            CHECK(curve->summary.e90 == expected->e90);
            CHECK(curve->summary.emax == expected->emax);
            const std::size_t wanted = std::min(points, support.x.size());
            REQUIRE(curve->points.size() == wanted);
            for (std::size_t k = 0; k < wanted; ++k) {
                const std::size_t at = wanted == 1 ? 0 : k * (support.x.size() - 1) / (wanted - 1);
                CHECK(curve->points[k].first == support.x[at]);
                CHECK(curve->points[k].second == expected->fitted[at]);
            }
        }
    }
    CHECK(loessOnSupport(support, binned)->binned);
    // Fewer than ten distinct risks: no curve, binned or not.
    const std::vector<double> points{0.1, 0.2, 0.3, 0.4, 0.5, 0.6};
    std::vector<double> few;
    std::vector<std::uint8_t> fy;
    for (int i = 0; i < 3000; ++i) {
        few.push_back(points[std::size_t(i) % points.size()]);
        fy.push_back(i % 3 == 0 ? 1 : 0);
    }
    CHECK_FALSE(loessCurve(fy, few, ascendingOrder(few), 100, binned));
}
