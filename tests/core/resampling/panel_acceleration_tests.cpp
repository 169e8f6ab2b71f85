#include "resampling/bootstrap_interval.hpp"
#include "support/check_datasets.hpp"
#include "metrics/logistic_recalibration.hpp"
#include "analyses/model_validation.hpp"
#include "resampling/panel_acceleration.hpp"

#include <catch2/catch.hpp>

using namespace plumbline;
using namespace plumbline::test;
using Catch::Matchers::WithinAbs;

namespace {

struct Prepared {
    ModelSupport support;
    SupportCounts counts;
    PanelValues full;
    FullSampleFits fits;
};

Prepared prepare(const CheckData& d, const LoessOptions& loess)
{
    Prepared p;
    p.support = buildModelSupport(d.p, ascendingOrder(d.p), true);
    p.counts = sampleCounts(p.support, d.y);
    p.full = weightedPanel(p.support, p.counts, FitStart{}, &loess);
    const auto lp = clampedLogits(d.p);
    const auto slope = fitCalibrationSlope(d.y, lp);
    p.fits.start = {*p.full[CalibrationIntercept], slope->intercept, slope->slope};
    std::copy(std::begin(slope->information), std::end(slope->information), p.fits.slopeInformation);
    p.fits.hasSlope = true;
    return p;
}

// Brute force: the acceleration from the n leave-one-out panels (what the closed forms avoid).
PanelValues leaveOneOutAccelerations(const CheckData& d)
{
    std::array<std::vector<double>, PanelMetricCount> values;
    for (std::size_t i = 0; i < d.y.size(); ++i) {
        CheckData without = d;
        without.y.erase(without.y.begin() + static_cast<long>(i));
        without.p.erase(without.p.begin() + static_cast<long>(i));
        const auto m = validateModel(without.y, {"m", without.p}, ScoreScale::Probability, PanelSettings{});
        for (std::size_t k = 0; k < PanelMetricCount; ++k)
            values[k].push_back(m.metric(panelKeys[k])->value.value_or(0.0));
    }
    PanelValues out{};
    for (std::size_t k = 0; k < PanelMetricCount; ++k)
        out[k] = accelerationFromJackknife(values[k]);
    return out;
}

} // namespace

TEST_CASE("Closed-form jackknife accelerations equal the leave-one-out ones exactly", "[bootstrap][acceleration]")
{
    const LoessOptions loess;
    for (const CheckData& d : {toy20A(), gen1000()}) {
        const Prepared p = prepare(d, loess);
        const PanelAccelerations fast = panelAccelerations(p.support, p.counts, p.full, p.fits, d.y, &loess);
        const PanelValues slow = leaveOneOutAccelerations(d);
        for (PanelMetric k : {CStatistic, Brier, ScaledBrier, LogLoss, NagelkerkeR2, OeRatio, DiscriminationSlope}) {
            INFO(panelKeys[k]);
            REQUIRE(fast[k]);
            CHECK(fast[k]->method == "closed-form jackknife");
            CHECK_THAT(fast[k]->value, WithinAbs(*slow[k], 1e-10));
        }
    }
    // Computed with numpy and scipy 1.10 (docs/methods.md §16): Toy-20 AUC jackknife acceleration
    // −0.0393253.
    const Prepared toy = prepare(toy20A(), loess);
    CHECK_THAT(panelAccelerations(toy.support, toy.counts, toy.full, toy.fits, toy20A().y, &loess)[CStatistic]->value,
               WithinAbs(-0.0393253, 1e-7));
}

TEST_CASE("Influence-function accelerations approximate the leave-one-out ones", "[bootstrap][acceleration]")
{
    // The influence function is the first-order term of the jackknife: on 1,000 patients the two
    // accelerations agree closely (both are small numbers of order 1/sqrt(n)).
    const LoessOptions loess;
    const CheckData d = gen1000();
    const Prepared p = prepare(d, loess);
    const PanelAccelerations fast = panelAccelerations(p.support, p.counts, p.full, p.fits, d.y, &loess);
    const PanelValues slow = leaveOneOutAccelerations(d);
    for (PanelMetric k : {Auprc, CalibrationIntercept, CalibrationSlope, RecalibrationIntercept}) {
        INFO(panelKeys[k] << ": influence " << fast[k]->value << " vs jackknife " << *slow[k]);
        CHECK(fast[k]->method == "influence function");
        CHECK_THAT(fast[k]->value, WithinAbs(*slow[k], 0.1 * std::abs(*slow[k]) + 1e-3));
    }
    for (PanelMetric k : {Ici, E50, E90, Emax}) {
        REQUIRE(fast[k]);
        CHECK(fast[k]->method == "grouped jackknife (20 groups)");
        CHECK(std::isfinite(fast[k]->value));
    }
}
