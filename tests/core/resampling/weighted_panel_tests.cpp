#include "support/check_datasets.hpp"
#include "analyses/model_validation.hpp"
#include "resampling/random_stream.hpp"
#include "resampling/weighted_panel.hpp"

#include <catch2/catch.hpp>

using namespace plumbline;
using namespace plumbline::test;
using Catch::Matchers::WithinAbs;

namespace {

PanelValues weightedOf(const CheckData& d, const std::vector<std::uint16_t>& counts)
{
    const ModelSupport support = buildModelSupport(d.p, ascendingOrder(d.p), true);
    SupportCounts c;
    countRows(support, d.y, counts, c);
    const LoessOptions loess;
    return weightedPanel(support, c, FitStart{}, &loess);
}

// The panel computed the ordinary way on explicitly resampled rows.
PanelValues expandedOf(const CheckData& d, const std::vector<std::uint16_t>& counts)
{
    CheckData expanded;
    for (std::size_t i = 0; i < d.y.size(); ++i)
        for (int k = 0; k < counts[i]; ++k) {
            expanded.y.push_back(d.y[i]);
            expanded.p.push_back(d.p[i]);
        }
    const ModelValidation m = validateModel(expanded.y, {"m", expanded.p}, ScoreScale::Probability, PanelSettings{});
    PanelValues out{};
    for (std::size_t k = 0; k < PanelMetricCount; ++k)
        out[k] = m.metric(panelKeys[k])->value;
    return out;
}

} // namespace

TEST_CASE("Weighted Toy-20 C and Brier match the check values of the methods reference", "[bootstrap][weighted]")
{
    // docs/methods.md §15, computed with scikit-learn 1.2.1 roc_auc_score(sample_weight=c), numpy
    // and statsmodels 0.13.5 (frequency weights): C 0.6333333, Brier 0.235125; recalibration
    // (a, b) = (−0.9669542, 0.2015165).
    const std::vector<std::uint16_t> c{2, 0, 1, 1, 0, 3, 1, 0, 1, 2, 1, 0, 1, 1, 0, 2, 1, 1, 0, 2};
    const PanelValues v = weightedOf(toy20A(), c);
    CHECK_THAT(*v[CStatistic], WithinAbs(0.6333333, 1e-7));
    CHECK_THAT(*v[Brier], WithinAbs(0.235125, 1e-12));
    CHECK_THAT(*v[RecalibrationIntercept], WithinAbs(-0.9669542, 1e-7));
    CHECK_THAT(*v[CalibrationSlope], WithinAbs(0.2015165, 1e-7));
}

TEST_CASE("Every weighted metric equals the metric on the explicitly resampled rows", "[bootstrap][weighted]")
{
    RandomStream random(5150);
    // The third set has an event at a risk of 0 and a non-event at a risk of 1: both are left out
    // of the calibration fits, in a replicate as in the rows (the weighted and expanded panels agree).
    CheckData contradicted = toy20B();
    for (std::size_t i = 0, events = 0, nonEvents = 0; i < contradicted.y.size(); ++i) {
        if (contradicted.y[i] && events++ == 0)
            contradicted.p[i] = 0.0;
        if (!contradicted.y[i] && nonEvents++ == 0)
            contradicted.p[i] = 1.0;
    }
    const std::vector<CheckData> datasets{toy20A(), toy20B(), contradicted, gen1000()};
    for (const CheckData& d : datasets) {
        for (int trial = 0; trial < 4; ++trial) {
            std::vector<std::uint16_t> counts(d.y.size(), 0);
            for (std::size_t k = 0; k < d.y.size(); ++k)
                ++counts[random.below(d.y.size())];
            const PanelValues weighted = weightedOf(d, counts);
            const PanelValues expanded = expandedOf(d, counts);
            for (std::size_t k = 0; k < PanelMetricCount; ++k) {
                INFO(panelKeys[k]);
                REQUIRE(weighted[k].has_value() == expanded[k].has_value());
                if (weighted[k]) {
                    // Fits converge to 1e-10 from different starts; sums and ranks agree to rounding.
                    const bool fitted = k == CalibrationIntercept || k == CalibrationSlope || k == RecalibrationIntercept;
                    CHECK_THAT(*weighted[k], WithinAbs(*expanded[k], fitted ? 1e-9 : 1e-12));
                }
            }
        }
    }
}

TEST_CASE("Sensitivity at fixed false-positive rates follows the ROC polyline", "[bootstrap][weighted]")
{
    const auto a = toy20A();
    const ModelSupport support = buildModelSupport(a.p, ascendingOrder(a.p), true);
    const SupportCounts c = sampleCounts(support, a.y);
    const auto roc = rocCurve(a.y, a.p);
    std::vector<double> ascendingRates; // every attainable false-positive rate: k of 12 non-events
    for (int k = 0; k <= 12; ++k)
        ascendingRates.push_back(k / 12.0);
    const auto sens = sensitivityAtFalsePositiveRates(support, c, ascendingRates);
    // At each vertex rate, the highest sensitivity reached at that rate.
    for (std::size_t i = 0; i < ascendingRates.size(); ++i) {
        double best = -1.0;
        for (const auto& point : roc)
            if (std::abs((1.0 - point.specificity) - ascendingRates[i]) < 1e-12)
                best = std::max(best, point.sensitivity);
        REQUIRE(best >= 0.0); // Toy-20's twelve non-events have distinct risks: every k/12 is a vertex
        CHECK_THAT(sens[i], WithinAbs(best, 1e-12));
    }
    // Between two vertices the sensitivity lies between theirs.
    const std::vector<double> mid{0.5 * (ascendingRates[1] + ascendingRates[2])};
    const auto between = sensitivityAtFalsePositiveRates(support, c, mid);
    CHECK(between[0] >= sens[1]);
    CHECK(between[0] <= sens[2]);
}
