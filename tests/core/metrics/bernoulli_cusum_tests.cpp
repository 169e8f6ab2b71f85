#include "metrics/bernoulli_cusum.hpp"
#include "metrics/chart_path.hpp"
#include "metrics/observed_minus_expected.hpp"

#include <catch2/catch.hpp>

#include <algorithm>
#include <cmath>

using namespace plumbline;
using Catch::Matchers::WithinAbs;

namespace {

// Twenty patients in sequence, written here: risk and outcome.
const std::vector<double> risks{0.10, 0.25, 0.05, 0.40, 0.15, 0.30, 0.08, 0.20, 0.12, 0.50,
                                0.06, 0.35, 0.22, 0.18, 0.09, 0.45, 0.28, 0.11, 0.07, 0.33};
const std::vector<std::uint8_t> outcomes{0, 1, 0, 1, 1, 0, 1, 0, 0, 1, 1, 1, 0, 1, 0, 0, 1, 0, 0, 0};

} // namespace

TEST_CASE("The cumulative expected-minus-observed chart follows Lovegrove's recursion on 20 patients", "[monitoring]")
{
    // Lovegrove et al. 1997 (Lancet 350:1128): V_t = V_{t-1} + (p_t - y_t), V_0 = 0, computed here by hand.
    const auto path = cumulativeExpectedMinusObserved(risks, outcomes);
    REQUIRE(path.size() == 20);
    double v = 0.0;
    for (std::size_t t = 0; t < 20; ++t) {
        v += risks[t] - outcomes[t];
        CHECK_THAT(path[t], WithinAbs(v, 1e-12));
    }
    // Σp = 4.29, Σy = 9: 4.71 more events than predicted after 20 patients.
    CHECK_THAT(path.back(), WithinAbs(4.29 - 9.0, 1e-12));
}

TEST_CASE("The Bernoulli CUSUM follows Steiner et al.'s recursion on 20 patients, restarting after a signal", "[monitoring]")
{
    // Steiner, Cook, Farewell & Treasure 2000 (Biostatistics 1:441): W = y log R - log(1 - p + R p),
    // S_t = max(0, S_{t-1} + W_t), signal when S_t >= h, then S restarts at 0. Computed here by hand.
    for (const double odds : {2.0, 0.5}) {
        for (const double h : {0.8, 1.5, 100.0}) {
            const CusumRun run = runCusum(risks, outcomes, odds, h);
            double s = 0.0;
            std::size_t since = 0;
            std::vector<std::size_t> signals, sinceReset;
            for (std::size_t t = 0; t < 20; ++t) {
                const double w = outcomes[t] * std::log(odds) - std::log(1.0 - risks[t] + odds * risks[t]);
                s = std::max(0.0, s + w);
                ++since;
                CHECK_THAT(run.values[t], WithinAbs(s, 1e-12));
                if (s >= h) {
                    signals.push_back(t);
                    sinceReset.push_back(since);
                    s = 0.0;
                    since = 0;
                }
            }
            CHECK(run.signals == signals);
            CHECK(run.sinceReset == sinceReset);
        }
    }
    // The worse chart (R = 2) signals on these twenty (nine events against 4.29 predicted) at h = 0.8, at patients 5 and 11;
    // the better chart (R = 0.5) stays below 0.8 throughout.
    CHECK(runCusum(risks, outcomes, 2.0, 0.8).signals == std::vector<std::size_t>{4, 10});
    CHECK(runCusum(risks, outcomes, 0.5, 0.8).signals.empty());
    // First weight by hand: y = 0, p = 0.1, R = 2 → −log(1.1).
    CHECK_THAT(cusumWeight(0.1, false, 2.0), WithinAbs(-std::log(1.1), 1e-15));
    CHECK_THAT(cusumWeight(0.25, true, 2.0), WithinAbs(std::log(2.0) - std::log(1.25), 1e-15));
}

TEST_CASE("A thinned chart keeps the extremes, the ends and at most the points asked for", "[monitoring]")
{
    std::vector<double> values(100000);
    for (std::size_t i = 0; i < values.size(); ++i)
        values[i] = std::sin(double(i) / 900.0) * 10.0;
    values[31337] = 50.0;  // a single patient's peak
    values[77777] = -60.0; // and trough
    const auto thin = thinPath(values, 2000);
    CHECK(thin.size() <= 2000);
    CHECK(thin.size() >= 1500);
    CHECK(thin.front().patient == 1);
    CHECK(thin.back().patient == values.size());
    CHECK(std::is_sorted(thin.begin(), thin.end(), [](const PathPoint& a, const PathPoint& b) { return a.patient < b.patient; }));
    auto has = [&](std::size_t patient, double value) {
        return std::any_of(thin.begin(), thin.end(), [&](const PathPoint& p) { return p.patient == patient && p.value == value; });
    };
    CHECK(has(31338, 50.0));
    CHECK(has(77778, -60.0));
    for (const auto& point : thin)
        CHECK(values[point.patient - 1] == point.value);
    // A short path is kept whole.
    CHECK(thinPath({1.0, 2.0, 3.0}, 2000).size() == 3);
}
