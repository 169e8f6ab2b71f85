#include "analyses/bootstrap_engine.hpp"
#include "resampling/random_stream.hpp"

#include <catch2/catch.hpp>

#include <cmath>
#include <vector>

using namespace plumbline;

// Simulation with known truth (a slow test, ctest label "slow"): the linear predictor is
// Normal(−1.7, 1), outcomes follow it exactly, and the model reports expit(−0.2 + 1.25·lp): too
// extreme, so the true calibration slope is 1/1.25 = 0.8. The true C is that of lp itself,
// P(lp_event > lp_non-event), by numerical integration here, checked against nested adaptive
// quadrature with scipy 1.10 (scipy.integrate.quad): 0.7449150041.
// Monte Carlo error: 1,000 cohorts give a coverage SD of sqrt(0.95 · 0.05 / 1000) = 0.0069, so the
// limits 0.92 and 0.98 lie more than 4 SDs from the nominal 0.95 (200 cohorts left them 2 SDs
// away: one unlucky cohort could fail a correct interval). Seed rule, fixed in advance: cohort k
// is drawn from RandomStream(20261202, k) and bootstrapped with seed 5000 + k.
namespace {

double expit(double x)
{
    return 1.0 / (1.0 + std::exp(-x));
}

// P(lp_event > lp_non-event) with lp ~ Normal(−1.7, 1) and P(event | lp) = expit(lp), by the
// trapezoid rule on a fine grid.
double trueCStatistic()
{
    const int points = 200001;
    const double lo = -10.7, hi = 7.3, dx = (hi - lo) / (points - 1);
    std::vector<double> eventDensity(points), nonEventDensity(points);
    double eventMass = 0.0, nonEventMass = 0.0;
    for (int i = 0; i < points; ++i) {
        const double x = lo + i * dx;
        const double normal = std::exp(-0.5 * (x + 1.7) * (x + 1.7));
        eventDensity[i] = normal * expit(x);
        nonEventDensity[i] = normal * (1.0 - expit(x));
        eventMass += eventDensity[i];
        nonEventMass += nonEventDensity[i];
    }
    double below = 0.0, c = 0.0;
    for (int i = 0; i < points; ++i) {
        c += eventDensity[i] / eventMass * (below + 0.5 * nonEventDensity[i] / nonEventMass);
        below += nonEventDensity[i] / nonEventMass;
    }
    return c;
}

Cohort simulate(std::size_t n, RandomStream& random)
{
    Cohort cohort;
    cohort.models.push_back({"model", {}});
    for (std::size_t i = 0; i < n; ++i) {
        const double lp = -1.7 + random.normal();
        cohort.outcome.push_back(random.uniform() < expit(lp) ? 1 : 0);
        cohort.models[0].values.push_back(expit(-0.2 + 1.25 * lp));
    }
    return cohort;
}

} // namespace

TEST_CASE("95 percent bootstrap intervals of C and of the calibration slope cover the truth 92 to 98 percent of the time", "[coverage]")
{
    const double trueC = trueCStatistic();
    const double trueSlope = 0.8;

    const int cohorts = 1000;
    int coverC = 0, coverSlope = 0;
    for (int k = 0; k < cohorts; ++k) {
        RandomStream random(20261202, static_cast<std::uint64_t>(k)); // cohort k: its own stream
        const Cohort cohort = simulate(2000, random);
        ValidationResult result = runValidation(cohort, PanelSettings{});
        BootstrapSettings settings;
        settings.replicates = 500;
        settings.seed = 5000 + k;
        settings.smoothedCurve = false;
        const auto bootstrap = runBootstrap(cohort, result, settings, {}, {});
        REQUIRE(bootstrap);
        applyBootstrap(result, *bootstrap);
        const Estimate& c = result.models[0].metrics[CStatistic].estimate;
        const Estimate& slope = result.models[0].metrics[CalibrationSlope].estimate;
        coverC += *c.lower <= trueC && trueC <= *c.upper ? 1 : 0;
        coverSlope += *slope.lower <= trueSlope && trueSlope <= *slope.upper ? 1 : 0;
    }
    const double c = double(coverC) / cohorts, s = double(coverSlope) / cohorts;
    CHECK_THAT(trueC, Catch::Matchers::WithinAbs(0.7449150041, 1e-8));
    INFO("true C " << trueC << "; coverage of C " << c << ", of the slope " << s);
    WARN("coverage of C " << c << ", of the calibration slope " << s << " over " << cohorts << " cohorts");
    CHECK(c >= 0.92);
    CHECK(c <= 0.98);
    CHECK(s >= 0.92);
    CHECK(s <= 0.98);
}
