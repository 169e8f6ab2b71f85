#include "support/check_datasets.hpp"
#include "analyses/model_validation.hpp"
#include "resampling/random_stream.hpp"
#include "resampling/weighted_panel.hpp"

#include <catch2/catch.hpp>

#include <bit>
#include <cstdint>

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

// A bootstrap draw: n rows drawn with replacement, as counts per row.
std::vector<std::uint16_t> drawnCounts(RandomStream& random, std::size_t n)
{
    std::vector<std::uint16_t> counts(n, 0);
    for (std::size_t k = 0; k < n; ++k)
        ++counts[random.below(n)];
    return counts;
}

// The rows of a resample written out: row i repeated counts[i] times.
CheckData expandedRows(const CheckData& d, const std::vector<std::uint16_t>& counts)
{
    CheckData expanded;
    for (std::size_t i = 0; i < d.y.size(); ++i)
        for (int k = 0; k < counts[i]; ++k) {
            expanded.y.push_back(d.y[i]);
            expanded.p.push_back(d.p[i]);
        }
    return expanded;
}

// The panel computed the ordinary way on explicitly resampled rows.
PanelValues expandedOf(const CheckData& d, const std::vector<std::uint16_t>& counts)
{
    const CheckData expanded = expandedRows(d, counts);
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
            const std::vector<std::uint16_t> counts = drawnCounts(random, d.y.size());
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

namespace {

// The walk as first written: FPR and TPR divided out at every vertex. The walk in the library
// compares counts instead and must give the same bits.
std::vector<double> sensitivityDividingEverywhere(const ModelSupport& s, const SupportCounts& c, std::span<const double> rates)
{
    double events = 0.0, nonEvents = 0.0;
    for (std::size_t k = 0; k < s.x.size(); ++k) {
        events += c.events[k];
        nonEvents += c.nonEvents[k];
    }
    std::vector<double> out(rates.size(), 1.0);
    double tp = 0.0, fp = 0.0, lastFpr = 0.0, lastTpr = 0.0;
    std::size_t next = 0;
    for (std::size_t k = s.x.size(); k > 0 && next < rates.size(); --k) {
        tp += c.events[k - 1];
        fp += c.nonEvents[k - 1];
        const double fpr = fp / nonEvents, tpr = tp / events;
        while (next < rates.size() && rates[next] < fpr) {
            const double share = (rates[next] - lastFpr) / (fpr - lastFpr);
            out[next++] = lastTpr + share * (tpr - lastTpr);
        }
        lastFpr = fpr;
        lastTpr = tpr;
    }
    return out;
}

} // namespace

TEST_CASE("The ROC walk that compares counts gives the same bits as dividing at every vertex", "[bootstrap][weighted]")
{
    RandomStream random(4242);
    for (int trial = 0; trial < 200; ++trial) {
        const std::size_t rows = 5 + random.below(400);
        CheckData d;
        for (std::size_t i = 0; i < rows; ++i) {
            d.p.push_back(double(1 + random.below(trial % 2 ? 30 : 100000)) / 100001.0); // ties on odd trials
            d.y.push_back(static_cast<std::uint8_t>(random.below(3) == 0));
        }
        std::vector<std::uint16_t> counts(rows, 0);
        for (std::size_t k = 0; k < rows; ++k)
            ++counts[random.below(rows)];
        const ModelSupport support = buildModelSupport(d.p, ascendingOrder(d.p), true);
        SupportCounts c;
        countRows(support, d.y, counts, c);
        double nonEvents = 0.0;
        for (const double f : c.nonEvents)
            nonEvents += f;
        // The band's grid, every attainable rate k/N exactly (the boundaries the comparison must
        // get right), and rates a hair either side of them.
        std::vector<double> rates;
        for (int j = 0; j <= 100; ++j)
            rates.push_back(j / 100.0);
        for (double k = 0.0; k <= nonEvents; ++k) {
            rates.push_back(k / nonEvents);
            rates.push_back(std::nextafter(k / nonEvents, 0.0));
            rates.push_back(std::nextafter(k / nonEvents, 2.0));
        }
        std::sort(rates.begin(), rates.end());
        const auto walked = sensitivityAtFalsePositiveRates(support, c, rates);
        const auto divided = sensitivityDividingEverywhere(support, c, rates);
        REQUIRE(walked.size() == divided.size());
        for (std::size_t j = 0; j < rates.size(); ++j) {
            INFO("trial " << trial << " rate " << rates[j]);
            REQUIRE(std::bit_cast<std::uint64_t>(walked[j]) == std::bit_cast<std::uint64_t>(divided[j]));
        }
    }
}

TEST_CASE("Fits whose first pass reads the start risks give the fits that compute them", "[bootstrap][weighted]")
{
    // The support carries expit(α + lp) and expit(a + b·lp) at the full-sample fits; a replicate
    // starting there skips its first Newton pass. Held to the full passes (to 1e-13: the same
    // numbers but for the last bit of a vector exp at an array's ends); a start the risks were
    // not computed for is not mistaken for theirs (bit for bit the plain fit).
    RandomStream random(909);
    for (const CheckData& d : {toy20A(), toy20B(), gen1000()}) {
        const ModelSupport plain = buildModelSupport(d.p, ascendingOrder(d.p), true);
        const PanelValues full = weightedPanel(plain, sampleCounts(plain, d.y), FitStart{}, nullptr);
        const FitStart start{*full[CalibrationIntercept], *full[RecalibrationIntercept], *full[CalibrationSlope]};
        ModelSupport prepared = plain;
        addStartRisks(prepared, start);
        const FitStart other{start.calibrationIntercept + 0.01, start.recalibrationIntercept, start.slope};
        for (int trial = 0; trial < 20; ++trial) {
            const std::vector<std::uint16_t> counts = drawnCounts(random, d.y.size());
            SupportCounts c;
            countRows(plain, d.y, counts, c);
            const PanelValues a = weightedPanel(plain, c, start, nullptr), b = weightedPanel(prepared, c, start, nullptr);
            for (const PanelMetric k : {CalibrationIntercept, CalibrationSlope, RecalibrationIntercept}) {
                INFO(panelKeys[k]);
                REQUIRE(a[k].has_value() == b[k].has_value());
                if (a[k])
                    CHECK_THAT(*b[k], WithinAbs(*a[k], 1e-13));
            }
            const PanelValues e = weightedPanel(plain, c, other, nullptr), f = weightedPanel(prepared, c, other, nullptr);
            for (std::size_t k = 0; k < PanelMetricCount; ++k)
                CHECK(e[k] == f[k]);
        }
    }
}

TEST_CASE("Counting from packed rows gives the counts of the lookups, and only for the outcome it was packed with",
          "[bootstrap][weighted]")
{
    // Over 32,768 points, where counting walks the rows in score order; ties make points of
    // several rows.
    RandomStream random(31);
    const std::size_t rows = 60000;
    std::vector<double> p(rows);
    std::vector<std::uint8_t> y(rows), otherY(rows);
    for (std::size_t i = 0; i < rows; ++i) {
        p[i] = double(1 + random.below(50000)) / 50001.0;
        y[i] = static_cast<std::uint8_t>(random.below(5) == 0);
        otherY[i] = static_cast<std::uint8_t>(random.below(2) == 0);
    }
    const ModelSupport plain = buildModelSupport(p, ascendingOrder(p), true);
    REQUIRE(plain.x.size() > 32768);
    ModelSupport packed = plain;
    packRowsInOrder(packed, y);
    REQUIRE(packed.packedRows.size() == rows);
    std::vector<std::uint16_t> counts(rows, 0);
    for (std::size_t k = 0; k < rows; ++k)
        ++counts[random.below(rows)];
    auto same = [](const SupportCounts& a, const SupportCounts& b) {
        return a.events == b.events && a.nonEvents == b.nonEvents;
    };
    SupportCounts looked, read;
    countRows(plain, y, counts, looked);
    countRows(packed, y, counts, read);
    CHECK(same(looked, read));
    // Another outcome vector, even with the same size: the packed outcomes are not used.
    countRows(plain, otherY, counts, looked);
    countRows(packed, otherY, counts, read);
    CHECK(same(looked, read));
    double events = 0.0;
    for (const double e : read.events)
        events += e;
    double expected = 0.0;
    for (std::size_t i = 0; i < rows; ++i)
        expected += otherY[i] * counts[i];
    CHECK(events == expected);
}

TEST_CASE("A points score's replicate has the C and average precision of its resampled rows, nothing else",
          "[bootstrap][weighted]")
{
    // Hanley & McNeil's 109 ratings (Radiology 1982): C 1321/1479 on the sample itself (the check
    // value of the panel's tests); a replicate's C and AP equal the ordinary computation on the
    // explicitly resampled rows, and no risk metric is formed from a points score.
    const CheckData d = hm109();
    const ModelSupport support = buildModelSupport(d.p, ascendingOrder(d.p), false);
    const PanelValues sample = weightedPanel(support, sampleCounts(support, d.y), FitStart{}, nullptr);
    CHECK_THAT(*sample[CStatistic], WithinAbs(1321.0 / 1479.0, 1e-12));
    RandomStream random(109);
    for (int trial = 0; trial < 10; ++trial) {
        const std::vector<std::uint16_t> counts = drawnCounts(random, d.y.size());
        SupportCounts c;
        countRows(support, d.y, counts, c);
        const PanelValues v = weightedPanel(support, c, FitStart{}, nullptr);
        const CheckData expanded = expandedRows(d, counts);
        const ModelValidation m = validateModel(expanded.y, {"m", expanded.p}, ScoreScale::Points, PanelSettings{});
        CHECK_THAT(*v[CStatistic], WithinAbs(*m.metric("c_statistic")->value, 1e-12));
        CHECK_THAT(*v[Auprc], WithinAbs(*m.metric(panelKeys[Auprc])->value, 1e-12));
        for (const PanelMetric k : {Brier, CalibrationSlope, CalibrationIntercept, OeRatio, Ici})
            CHECK_FALSE(v[k]);
    }
}
