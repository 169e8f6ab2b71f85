// The bootstrap checked against values it does not compute itself: every replicate is rebuilt
// here from explicitly resampled rows (the draw protocol the engine documents, written again
// independently), each metric and curve recomputed on those rows by the textbook formulas, and
// the engine's SEs, percentile intervals and bands compared with them exactly. Speed work on the
// engine's inner loops (weighted sweeps, warm starts) must keep these equalities.
//
// Sources: percentile interval and bootstrap SE as defined by Efron & Tibshirani (1993), An
// Introduction to the Bootstrap, ch. 6 and 13; quantiles by linear interpolation (Hyndman & Fan
// 1996 type 7, numpy's default); C as the Mann–Whitney probability (Hanley & McNeil 1982); net
// benefit as in Vickers & Elkin (2006); the jackknife acceleration as in Efron (1987), JASA
// 82:171, eq. 6.6. See docs/methods.md (bootstrap section).
#include "analyses/bootstrap_engine.hpp"
#include "metrics/loess_calibration.hpp"
#include "resampling/panel_acceleration.hpp"
#include "resampling/random_stream.hpp"
#include "metrics/score_order.hpp"
#include "analyses/validation.hpp"
#include "resampling/weighted_panel.hpp"

#include <catch2/catch.hpp>

#include <algorithm>
#include <cmath>
#include <functional>
#include <map>
#include <numeric>

using namespace plumbline;
using Catch::Matchers::WithinAbs;
using Catch::Matchers::WithinRel;

namespace {

// Twelve distinct risks, forty patients each, outcomes spread so the event rate follows the
// risk roughly (generated test input). With forty patients per risk every risk is drawn in
// every replicate (a risk is missed with probability about e^-40), so loess on the explicit rows
// is evaluated at the same risks as the engine's curve.
Cohort tiedCohort()
{
    Cohort cohort;
    std::vector<double> risks;
    for (int k = 0; k < 12; ++k) {
        const double risk = 0.05 * (k + 1);
        const int events = int(std::lround(40 * risk * 0.9));
        for (int j = 0; j < 40; ++j) {
            cohort.outcome.push_back(j < events ? 1 : 0);
            risks.push_back(risk);
        }
    }
    cohort.models.push_back({"model", risks});
    return cohort;
}

// The draw protocol of runBootstrap (bootstrap_engine.hpp), written again: replicate r reads
// RandomStream(seed, r + 1). Ordinary: n draws of below(n), all drawn again from the same stream
// while the draw lacks events or non-events. Stratified: n1 draws over the event rows in row
// order, then n0 draws over the non-event rows.
std::vector<std::size_t> explicitRows(const std::vector<std::uint8_t>& y, std::uint64_t seed, std::size_t r, bool stratified)
{
    RandomStream random(seed, r + 1);
    std::vector<std::size_t> rows;
    if (stratified) {
        std::vector<std::size_t> events, nonEvents;
        for (std::size_t i = 0; i < y.size(); ++i)
            (y[i] ? events : nonEvents).push_back(i);
        for (std::size_t k = 0; k < events.size(); ++k)
            rows.push_back(events[random.below(events.size())]);
        for (std::size_t k = 0; k < nonEvents.size(); ++k)
            rows.push_back(nonEvents[random.below(nonEvents.size())]);
        return rows;
    }
    for (;;) {
        rows.clear();
        std::size_t events = 0;
        for (std::size_t k = 0; k < y.size(); ++k) {
            rows.push_back(random.below(y.size()));
            events += y[rows.back()];
        }
        if (events > 0 && events < y.size())
            return rows;
    }
}

// Type-7 quantile of unsorted values.
double quantile7(std::vector<double> v, double q)
{
    std::sort(v.begin(), v.end());
    const double h = (double(v.size()) - 1.0) * q;
    const auto lo = static_cast<std::size_t>(std::floor(h));
    const std::size_t hi = std::min(lo + 1, v.size() - 1);
    return v[lo] + (h - double(lo)) * (v[hi] - v[lo]);
}

double sampleSd(const std::vector<double>& v)
{
    const double mean = std::accumulate(v.begin(), v.end(), 0.0) / double(v.size());
    double s = 0.0;
    for (double x : v)
        s += (x - mean) * (x - mean);
    return std::sqrt(s / double(v.size() - 1));
}

// Mann–Whitney C with ties counted half, by all pairs.
double mannWhitney(const std::vector<std::uint8_t>& y, const std::vector<double>& p)
{
    double wins = 0.0, pairs = 0.0;
    for (std::size_t i = 0; i < y.size(); ++i)
        if (y[i])
            for (std::size_t j = 0; j < y.size(); ++j)
                if (!y[j]) {
                    wins += p[i] > p[j] ? 1.0 : p[i] == p[j] ? 0.5 : 0.0;
                    pairs += 1.0;
                }
    return wins / pairs;
}

// Sensitivity at a false-positive rate on the ROC polyline of thresholds "risk >= t": the highest
// sensitivity among vertices at exactly that rate, else linear interpolation between the
// vertices either side.
double sensitivityAt(const std::vector<std::uint8_t>& y, const std::vector<double>& p, double rate)
{
    std::vector<double> cuts(p);
    std::sort(cuts.begin(), cuts.end(), std::greater<>());
    cuts.erase(std::unique(cuts.begin(), cuts.end()), cuts.end());
    const double events = double(std::count(y.begin(), y.end(), 1)), nonEvents = double(y.size()) - events;
    std::vector<std::pair<double, double>> vertices{{0.0, 0.0}};
    for (double t : cuts) {
        double tp = 0, fp = 0;
        for (std::size_t i = 0; i < y.size(); ++i)
            if (p[i] >= t)
                (y[i] ? tp : fp) += 1;
        vertices.push_back({fp / nonEvents, tp / events});
    }
    double best = -1.0;
    for (const auto& [fpr, tpr] : vertices)
        if (fpr == rate)
            best = std::max(best, tpr);
    if (best >= 0.0)
        return best;
    for (std::size_t k = 1; k < vertices.size(); ++k)
        if (vertices[k - 1].first < rate && rate < vertices[k].first) {
            const double share = (rate - vertices[k - 1].first) / (vertices[k].first - vertices[k - 1].first);
            return vertices[k - 1].second + share * (vertices[k].second - vertices[k - 1].second);
        }
    return 1.0;
}

struct Explicit {
    std::vector<double> c, brier, ici;
    std::map<double, std::vector<double>> curve;       // risk -> loess value per replicate
    std::vector<std::vector<double>> roc, netBenefit;  // [point][replicate]
};

Explicit explicitReplicates(const Cohort& cohort, const BootstrapResult& engine, std::size_t replicates, std::uint64_t seed,
                            bool stratified)
{
    Explicit out;
    const auto& y = cohort.outcome;
    const auto& p = cohort.models[0].values;
    const ModelBootstrap& m = engine.models.at(0);
    out.roc.resize(m.rocBand.x.size());
    out.netBenefit.resize(m.decisionBand.x.size());
    for (std::size_t r = 0; r < replicates; ++r) {
        std::vector<std::uint8_t> ry;
        std::vector<double> rp;
        for (std::size_t row : explicitRows(y, seed, r, stratified)) {
            ry.push_back(y[row]);
            rp.push_back(p[row]);
        }
        out.c.push_back(mannWhitney(ry, rp));
        double squares = 0.0;
        for (std::size_t i = 0; i < ry.size(); ++i)
            squares += (rp[i] - ry[i]) * (rp[i] - ry[i]);
        out.brier.push_back(squares / double(ry.size()));
        const auto loess = loessCalibration(ry, rp);
        REQUIRE(loess);
        out.ici.push_back(loess->ici);
        for (std::size_t i = 0; i < rp.size(); ++i)
            if (out.curve[rp[i]].size() == r)
                out.curve[rp[i]].push_back(loess->fitted[i]);
        for (std::size_t j = 0; j < m.rocBand.x.size(); ++j)
            out.roc[j].push_back(sensitivityAt(ry, rp, m.rocBand.x[j]));
        for (std::size_t j = 0; j < m.decisionBand.x.size(); ++j) {
            const double t = m.decisionBand.x[j];
            double tp = 0, fp = 0;
            for (std::size_t i = 0; i < ry.size(); ++i)
                if (rp[i] >= t)
                    (ry[i] ? tp : fp) += 1;
            const double n = double(ry.size());
            out.netBenefit[j].push_back(tp / n - fp / n * t / (1.0 - t));
        }
    }
    return out;
}

void compareBand(const CurveBand& band, const std::function<std::vector<double>(std::size_t)>& replicatesAt, double confidence,
                 const char* what)
{
    REQUIRE_FALSE(band.x.empty());
    const double alpha = 1.0 - confidence;
    for (std::size_t j = 0; j < band.x.size(); ++j) {
        const std::vector<double> values = replicatesAt(j);
        INFO(what << " at " << band.x[j]);
        CHECK_THAT(band.lower[j], WithinAbs(quantile7(values, alpha / 2), 1e-9));
        CHECK_THAT(band.upper[j], WithinAbs(quantile7(values, 1 - alpha / 2), 1e-9));
    }
}

void checkAgainstExplicitRows(bool stratified, double confidence)
{
    const Cohort cohort = tiedCohort();
    PanelSettings panel;
    panel.confidence = confidence;
    const ValidationResult full = runValidation(cohort, panel);
    BootstrapSettings settings;
    settings.replicates = 200;
    settings.seed = 4242;
    settings.stratified = stratified;
    const auto engine = runBootstrap(cohort, full, settings, {}, {});
    REQUIRE(engine);
    const Explicit ex = explicitReplicates(cohort, *engine, settings.replicates, settings.seed, stratified);
    const double alpha = 1.0 - confidence;
    const ModelBootstrap& m = engine->models.at(0);
    auto metric = [&](PanelMetric k, const std::vector<double>& values, const char* name) {
        INFO(name);
        REQUIRE(m.metrics[k]);
        CHECK(m.metrics[k]->replicatesUsed == values.size());
        CHECK_THAT(m.metrics[k]->se, WithinRel(sampleSd(values), 1e-9));
        CHECK_THAT(m.metrics[k]->percentile.first, WithinAbs(quantile7(values, alpha / 2), 1e-12));
        CHECK_THAT(m.metrics[k]->percentile.second, WithinAbs(quantile7(values, 1 - alpha / 2), 1e-12));
    };
    metric(CStatistic, ex.c, "C statistic");
    metric(Brier, ex.brier, "Brier");
    metric(Ici, ex.ici, "ICI");
    // Every band at the requested level, not a fixed one.
    compareBand(m.calibrationBand, [&](std::size_t j) { return ex.curve.at(m.calibrationBand.x[j]); }, confidence, "calibration band");
    compareBand(m.rocBand, [&](std::size_t j) { return ex.roc[j]; }, confidence, "ROC band");
    compareBand(m.decisionBand, [&](std::size_t j) { return ex.netBenefit[j]; }, confidence, "net benefit band");
}

} // namespace

TEST_CASE("Bootstrap SEs percentile intervals and bands equal those of explicitly resampled rows", "[bootstrap][known-answer]")
{
    SECTION("ordinary resampling at 80 percent") { checkAgainstExplicitRows(false, 0.80); }
    SECTION("stratified resampling at 95 percent") { checkAgainstExplicitRows(true, 0.95); }
}

TEST_CASE("Every row is drawn equally often and stratified draws keep both class sizes", "[bootstrap][known-answer]")
{
    // Over R replicates each of n rows is drawn R times on average (multinomial with equal
    // probabilities); Pearson's chi-square of the totals against R has n - 1 degrees of freedom.
    // n = 97 and R = 400: the 0.1 % critical value of chi-square(96) is 144.0 (scipy 1.10:
    // scipy.stats.chi2.ppf(0.999, 96) = 143.96), so a fair draw fails this with probability 0.001
    // and the fixed seed makes it deterministic. A draw that never reaches the last row, or that
    // takes non-events only from the first rows, fails by hundreds.
    std::vector<std::uint8_t> y(97);
    for (std::size_t i = 0; i < y.size(); ++i)
        y[i] = i % 4 == 0 ? 1 : 0; // 25 events, 72 non-events
    const std::size_t R = 400;
    for (const bool stratified : {false, true}) {
        std::vector<double> totals(y.size(), 0.0);
        for (std::size_t r = 0; r < R; ++r) {
            std::size_t events = 0;
            for (std::size_t row : explicitRows(y, 99, r, stratified)) {
                totals[row] += 1.0;
                events += y[row];
            }
            if (stratified)
                CHECK(events == 25);
        }
        double chi = 0.0;
        for (double total : totals)
            chi += (total - double(R)) * (total - double(R)) / double(R);
        INFO("stratified " << stratified << " chi-square " << chi);
        CHECK(chi < 143.96);
        CHECK(totals.back() > 0.0);
    }
}

TEST_CASE("Grouped jackknife accelerations of the loess metrics equal a brute-force leave-group-out jackknife", "[bootstrap][known-answer]")
{
    // Efron (1987) eq. 6.6: a = sum(u^3) / (6 (sum(u^2))^1.5), u_g = mean of the leave-out values
    // minus the value without group g; groups are rows i with i mod 20 = g. Recomputed here from
    // twenty explicit refits of the loess calibration curve on the rows kept.
    const Cohort cohort = tiedCohort();
    const auto& y = cohort.outcome;
    const auto& p = cohort.models[0].values;
    std::array<std::vector<double>, 4> leaveOut;
    for (std::size_t g = 0; g < 20; ++g) {
        std::vector<std::uint8_t> ky;
        std::vector<double> kp;
        for (std::size_t i = 0; i < y.size(); ++i)
            if (i % 20 != g) {
                ky.push_back(y[i]);
                kp.push_back(p[i]);
            }
        const auto loess = loessCalibration(ky, kp);
        REQUIRE(loess);
        leaveOut[0].push_back(loess->ici);
        leaveOut[1].push_back(loess->e50);
        leaveOut[2].push_back(loess->e90);
        leaveOut[3].push_back(loess->emax);
    }
    auto acceleration = [](const std::vector<double>& v) {
        const double mean = std::accumulate(v.begin(), v.end(), 0.0) / double(v.size());
        double s2 = 0.0, s3 = 0.0;
        for (double x : v) {
            s2 += (mean - x) * (mean - x);
            s3 += (mean - x) * (mean - x) * (mean - x);
        }
        return s3 / (6.0 * std::pow(s2, 1.5));
    };
    const LoessOptions loess;
    const ModelSupport support = buildModelSupport(p, ascendingOrder(p), true);
    const SupportCounts counts = sampleCounts(support, y);
    const PanelValues full = weightedPanel(support, counts, FitStart{}, &loess);
    FullSampleFits fits;
    const PanelAccelerations fast = panelAccelerations(support, counts, full, fits, y, &loess);
    const std::array<PanelMetric, 4> metrics{Ici, E50, E90, Emax};
    bool someSkewed = false;
    for (std::size_t k = 0; k < 4; ++k) {
        INFO(panelKeys[metrics[k]]);
        REQUIRE(fast[metrics[k]]);
        const double want = acceleration(leaveOut[k]);
        someSkewed = someSkewed || std::abs(want) > 1e-3;
        CHECK_THAT(fast[metrics[k]]->value, WithinAbs(want, 1e-9));
    }
    CHECK(someSkewed); // a sign error would show: at least one acceleration is far from 0
}

TEST_CASE("Draws that lack a class are redrawn from the same stream and counted", "[bootstrap][known-answer]")
{
    // Four patients, three with the event: a draw of four rows has no non-event with probability
    // (3/4)^4 = 0.32, so about a third of the draws must be redrawn. The engine's Brier replicates
    // and its redraw count equal those of the protocol written out here.
    Cohort cohort;
    cohort.outcome = {1, 1, 1, 0};
    cohort.models.push_back({"model", {0.9, 0.6, 0.3, 0.2}});
    const ValidationResult full = runValidation(cohort, PanelSettings{});
    BootstrapSettings settings;
    settings.replicates = 300;
    settings.seed = 5;
    settings.smoothedCurve = false;
    const auto engine = runBootstrap(cohort, full, settings, {}, {});
    REQUIRE(engine);
    std::size_t redrawn = 0;
    std::vector<double> brier;
    for (std::size_t r = 0; r < settings.replicates; ++r) {
        RandomStream random(settings.seed, r + 1);
        for (;;) {
            std::vector<std::size_t> rows;
            std::size_t events = 0;
            for (std::size_t k = 0; k < 4; ++k) {
                rows.push_back(random.below(4));
                events += cohort.outcome[rows.back()];
            }
            if (events > 0 && events < 4) {
                double squares = 0.0;
                for (std::size_t row : rows)
                    squares += std::pow(cohort.models[0].values[row] - cohort.outcome[row], 2.0);
                brier.push_back(squares / 4.0);
                break;
            }
            ++redrawn;
        }
    }
    CHECK(redrawn > 50);
    CHECK(engine->redrawn == redrawn);
    REQUIRE(engine->models[0].metrics[Brier]);
    CHECK_THAT(engine->models[0].metrics[Brier]->se, WithinRel(sampleSd(brier), 1e-9));
    // The ROC band is read at false-positive rates 0, 0.01, ..., 1 (BootstrapSettings::rocBandPoints).
    const CurveBand& band = engine->models[0].rocBand;
    REQUIRE(band.x.size() == 101);
    for (std::size_t j = 0; j < band.x.size(); ++j)
        CHECK_THAT(band.x[j], WithinAbs(double(j) / 100.0, 1e-15));
}
