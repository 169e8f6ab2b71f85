#include "support/check_datasets.hpp"
#include "metrics/discrimination.hpp"
#include "resampling/random_stream.hpp"

#include <catch2/catch.hpp>

using namespace plumbline;
using namespace plumbline::test;
using Catch::Matchers::WithinAbs;

// Check values: docs/methods.md §3-§4, computed with scikit-learn 1.2.1 roc_auc_score, numpy,
// scipy 1.10 and R 4.2.2; DeLong, DeLong & Clarke-Pearson 1988 (S10/S01 components from memory);
// HM-109 data: Hanley & McNeil 1982, Table 1, as commonly reprinted (not re-checked against the paper).
TEST_CASE("C statistic matches the Toy-20 HM-109 and Gen-1000 check values", "[discrimination]")
{
    const auto a = toy20A(), b = toy20B(), hm = hm109(), gen = gen1000();
    CHECK_THAT(*cStatistic(a.y, a.p, CStatisticScale::Logit, 0.95).value, WithinAbs(45.0 / 64.0, 1e-15));
    CHECK_THAT(*cStatistic(b.y, b.p, CStatisticScale::Logit, 0.95).value, WithinAbs(76.0 / 96.0, 1e-15));
    CHECK_THAT(*cStatistic(hm.y, hm.p, CStatisticScale::Logit, 0.95).value, WithinAbs(1321.0 / 1479.0, 1e-15));
    CHECK_THAT(*cStatistic(gen.y, gen.p, CStatisticScale::Logit, 0.95).value, WithinAbs(151818.0 / (299.0 * 701.0), 1e-15));
}

TEST_CASE("DeLong placements and SE match the Toy-20 check values", "[discrimination]")
{
    const auto a = toy20A();
    const Placements placements = delongPlacements(a.y, a.p);
    const std::vector<double> v10{0.2083333, 0.4583333, 0.625, 0.75, 0.8333333, 0.9166667, 0.9166667, 0.9166667};
    const std::vector<double> v01{1, 1, 0.9375, 0.875, 0.875, 0.8125, 0.75, 0.6875, 0.625, 0.5, 0.375, 0};
    REQUIRE(placements.eventPlacements.size() == v10.size());
    for (std::size_t i = 0; i < v10.size(); ++i)
        CHECK_THAT(placements.eventPlacements[i], WithinAbs(v10[i], 1e-7));
    for (std::size_t j = 0; j < v01.size(); ++j)
        CHECK_THAT(placements.nonEventPlacements[j], WithinAbs(v01[j], 1e-7));
    CHECK_THAT(delongVariance(placements), WithinAbs(0.0155637006, 1e-10));
}

namespace {
void checkInterval(const Estimate& e, double lower, double upper)
{
    REQUIRE(e.lower);
    REQUIRE(e.upper);
    CHECK_THAT(*e.lower, WithinAbs(lower, 1e-7));
    CHECK_THAT(*e.upper, WithinAbs(upper, 1e-7));
}
} // namespace

TEST_CASE("DeLong intervals on the logit and plain scales match the check values", "[discrimination]")
{
    const auto a = toy20A(), hm = hm109(), gen = gen1000();
    const Estimate toyLogit = cStatistic(a.y, a.p, CStatisticScale::Logit, 0.95);
    CHECK_THAT(*toyLogit.se, WithinAbs(0.1247546, 1e-7));
    checkInterval(toyLogit, 0.4233203, 0.8842805);
    checkInterval(cStatistic(a.y, a.p, CStatisticScale::Plain, 0.95), 0.4586106, 0.9476394);
    const Estimate hmLogit = cStatistic(hm.y, hm.p, CStatisticScale::Logit, 0.95);
    CHECK_THAT(*hmLogit.se, WithinAbs(0.0307244, 1e-7));
    checkInterval(hmLogit, 0.8164435, 0.9401762);
    checkInterval(cStatistic(hm.y, hm.p, CStatisticScale::Plain, 0.95), 0.8329524, 0.9533898);
    const Estimate genLogit = cStatistic(gen.y, gen.p, CStatisticScale::Logit, 0.95);
    CHECK_THAT(*genLogit.se, WithinAbs(0.0173344, 1e-7));
    checkInterval(genLogit, 0.6890912, 0.7569759);
    checkInterval(cStatistic(gen.y, gen.p, CStatisticScale::Plain, 0.95), 0.6903511, 0.7583008);
    CHECK(genLogit.ciMethod == CiMethod::DeLongLogit);
}

TEST_CASE("The paired DeLong covariance matches the Toy-20 check values", "[discrimination]")
{
    // DeLong et al. 1988 covariance (from memory), computed with numpy (docs/methods.md §4):
    // S = [[0.0155637006, 0.0128968254], [0.0128968254, 0.0122316919]].
    const auto a = toy20A(), b = toy20B();
    const Placements pa = delongPlacements(a.y, a.p), pb = delongPlacements(b.y, b.p);
    CHECK_THAT(delongCovariance(pa, pb), WithinAbs(0.0128968254, 1e-10));
    CHECK_THAT(delongVariance(pb), WithinAbs(0.0122316919, 1e-10));
}

TEST_CASE("The fast DeLong agrees with a brute-force O(n^2) computation on data with many ties", "[discrimination]")
{
    RandomStream random(31);
    for (int trial = 0; trial < 20; ++trial) {
        const std::size_t n = 30 + random.below(200);
        std::vector<std::uint8_t> y(n);
        std::vector<double> p(n);
        for (std::size_t i = 0; i < n; ++i) {
            y[i] = random.uniform() < 0.3 ? 1 : 0;
            p[i] = double(random.below(8)) / 8.0 + (y[i] ? 0.05 * double(random.below(3)) : 0.0);
        }
        y[0] = 1;
        y[1] = 0;
        // Brute force: ψ over all event/non-event pairs (DeLong 1988 definitions).
        std::vector<double> xs, ys;
        for (std::size_t i = 0; i < n; ++i)
            (y[i] ? xs : ys).push_back(p[i]);
        auto psi = [](double a, double b) { return a > b ? 1.0 : a == b ? 0.5 : 0.0; };
        std::vector<double> v10(xs.size(), 0.0), v01(ys.size(), 0.0);
        double c = 0.0;
        for (std::size_t i = 0; i < xs.size(); ++i)
            for (std::size_t j = 0; j < ys.size(); ++j) {
                const double s = psi(xs[i], ys[j]);
                v10[i] += s / double(ys.size());
                v01[j] += s / double(xs.size());
                c += s;
            }
        c /= double(xs.size() * ys.size());
        const Placements fast = delongPlacements(y, p);
        CHECK_THAT(fast.c, WithinAbs(c, 1e-12));
        for (std::size_t i = 0; i < xs.size(); ++i)
            CHECK_THAT(fast.eventPlacements[i], WithinAbs(v10[i], 1e-12));
        for (std::size_t j = 0; j < ys.size(); ++j)
            CHECK_THAT(fast.nonEventPlacements[j], WithinAbs(v01[j], 1e-12));
    }
}

TEST_CASE("C is undefined with one class and 0.5 when all scores are equal", "[discrimination]")
{
    const std::vector<std::uint8_t> oneClass{0, 0, 0};
    const std::vector<double> p{0.1, 0.2, 0.3};
    CHECK_FALSE(cStatistic(oneClass, p, CStatisticScale::Logit, 0.95).value);
    const std::vector<std::uint8_t> y{0, 1, 0, 1};
    const std::vector<double> equal(4, 0.3);
    CHECK(*cStatistic(y, equal, CStatisticScale::Logit, 0.95).value == 0.5);
    const std::vector<double> perfect{0.1, 0.9, 0.2, 0.8};
    const Estimate c1 = cStatistic(y, perfect, CStatisticScale::Logit, 0.95);
    CHECK(*c1.value == 1.0);
    CHECK_FALSE(c1.lower); // the logit interval does not exist at C = 1
}

TEST_CASE("The ROC curve's trapezoidal area equals C and thinning keeps it within 1e-3", "[discrimination]")
{
    const auto gen = gen1000();
    const auto curve = rocCurve(gen.y, gen.p);
    auto area = [](const std::vector<RocPoint>& c) {
        double sum = 0.0;
        for (std::size_t k = 1; k < c.size(); ++k)
            sum += (c[k - 1].specificity - c[k].specificity) * (c[k].sensitivity + c[k - 1].sensitivity) / 2.0;
        return sum;
    };
    const double c = *cStatistic(gen.y, gen.p, CStatisticScale::Logit, 0.95).value;
    CHECK_THAT(area(curve), WithinAbs(c, 1e-12));
    const auto thin = thinRocCurve(curve, 200);
    CHECK(thin.size() <= 200);
    CHECK_THAT(area(thin), WithinAbs(c, 1e-3));
    const auto hm = hm109();
    CHECK_THAT(area(rocCurve(hm.y, hm.p)), WithinAbs(1321.0 / 1479.0, 1e-12));
}

TEST_CASE("Discrimination slope matches the check values", "[discrimination]")
{
    // Yates 1982 (from memory), computed with numpy (docs/methods.md §5): Toy-20 A 0.1583333,
    // B 0.2433333, Gen-1000 0.1613398.
    const auto a = toy20A(), b = toy20B(), gen = gen1000();
    CHECK_THAT(*discriminationSlope(a.y, a.p), WithinAbs(0.1583333, 1e-7));
    CHECK_THAT(*discriminationSlope(b.y, b.p), WithinAbs(0.2433333, 1e-7));
    CHECK_THAT(*discriminationSlope(gen.y, gen.p), WithinAbs(0.1613398, 1e-7));
}

TEST_CASE("Average precision matches the scikit-learn documentation example", "[discrimination]")
{
    // scikit-learn 1.2 documentation of average_precision_score (docs/methods.md §5): y = [0,0,1,1],
    // scores = [0.1,0.4,0.35,0.8] gives 0.83 (exactly (1/2)(1) + (1/2)(2/3) = 5/6).
    const std::vector<std::uint8_t> y{0, 0, 1, 1};
    const std::vector<double> s{0.1, 0.4, 0.35, 0.8};
    CHECK_THAT(*averagePrecision(y, s), WithinAbs(5.0 / 6.0, 1e-15));
}

TEST_CASE("The ROC summary walked twice equals the thinned stored curve and its average precision", "[discrimination]")
{
    // Risks with many ties (a coarse grid) and without (continuous), so that collinear runs,
    // tie blocks and the even spread are all exercised; every maximum from 2 to above the size.
    RandomStream random(11);
    std::vector<std::uint8_t> y;
    std::vector<double> coarse, fine;
    for (int i = 0; i < 3000; ++i) {
        fine.push_back(random.uniform());
        coarse.push_back(double(random.below(60)) / 60.0);
        y.push_back(random.uniform() < 0.3 + 0.4 * fine.back() ? 1 : 0);
    }
    for (const auto* p : {&coarse, &fine}) {
        const ScoreOrder order = ascendingOrder(*p);
        const auto curve = rocCurve(y, *p, order);
        const auto events = static_cast<std::size_t>(std::count(y.begin(), y.end(), std::uint8_t{1}));
        for (const std::size_t maxPoints : {std::size_t{0}, std::size_t{2}, std::size_t{3}, std::size_t{50}, std::size_t{200},
                                            curve.size() - 1, curve.size(), std::size_t{100000}}) {
            const RocSummary summary = rocSummary(y, *p, order, maxPoints);
            const auto thinned = thinRocCurve(curve, maxPoints);
            REQUIRE(summary.thinned.size() == thinned.size());
            for (std::size_t k = 0; k < thinned.size(); ++k) {
                CHECK(summary.thinned[k].threshold == thinned[k].threshold);
                CHECK(summary.thinned[k].sensitivity == thinned[k].sensitivity);
                CHECK(summary.thinned[k].specificity == thinned[k].specificity);
            }
            REQUIRE(summary.averagePrecision);
            CHECK(*summary.averagePrecision == *averagePrecision(curve, events, y.size() - events));
        }
    }
    const std::vector<std::uint8_t> oneClass(10, 1);
    const std::vector<double> scores{0.1, 0.2, 0.3, 0.4, 0.5, 0.6, 0.7, 0.8, 0.9, 0.95};
    const RocSummary none = rocSummary(oneClass, scores, ascendingOrder(scores), 200);
    CHECK(none.thinned.empty());
    CHECK_FALSE(none.averagePrecision);
}

TEST_CASE("C and its DeLong SE read off the order a tie block at a time match the check values", "[discrimination]")
{
    // Same check values as above (docs/methods.md §3-§4: scikit-learn 1.2.1, scipy 1.10, R 4.2.2).
    const auto a = toy20A(), hm = hm109(), gen = gen1000();
    const Estimate toy = cStatistic(a.y, a.p, ascendingOrder(a.p), CStatisticScale::Logit, 0.95);
    CHECK_THAT(*toy.value, WithinAbs(45.0 / 64.0, 1e-15));
    CHECK_THAT(*toy.se, WithinAbs(0.1247546, 1e-7));
    checkInterval(toy, 0.4233203, 0.8842805);
    checkInterval(cStatistic(a.y, a.p, ascendingOrder(a.p), CStatisticScale::Plain, 0.95), 0.4586106, 0.9476394);
    const Estimate hmLogit = cStatistic(hm.y, hm.p, ascendingOrder(hm.p), CStatisticScale::Logit, 0.95);
    CHECK_THAT(*hmLogit.se, WithinAbs(0.0307244, 1e-7));
    checkInterval(hmLogit, 0.8164435, 0.9401762);
    const Estimate genLogit = cStatistic(gen.y, gen.p, ascendingOrder(gen.p), CStatisticScale::Logit, 0.95);
    CHECK_THAT(*genLogit.se, WithinAbs(0.0173344, 1e-7));
    checkInterval(genLogit, 0.6890912, 0.7569759);
    CHECK(genLogit.ciMethod == CiMethod::DeLongLogit);
}

TEST_CASE("Read off the order, C equals the placements' C to the bit and its SE to rounding, ties and small classes included", "[discrimination]")
{
    RandomStream random(77);
    for (int trial = 0; trial < 40; ++trial) {
        const std::size_t n = 2 + random.below(300);
        std::vector<std::uint8_t> y(n);
        std::vector<double> p(n);
        const double eventShare = trial % 5 == 0 ? 0.01 : 0.3; // some trials with one event or none
        for (std::size_t i = 0; i < n; ++i) {
            y[i] = random.uniform() < eventShare ? 1 : 0;
            p[i] = double(random.below(trial % 2 ? 6 : 1000)) / 997.0 + (y[i] ? 0.01 : 0.0);
        }
        for (const auto scale : {CStatisticScale::Logit, CStatisticScale::Plain}) {
            const Estimate placed = cStatistic(delongPlacements(y, p), scale, 0.9);
            const Estimate walked = cStatistic(y, p, ascendingOrder(p), scale, 0.9);
            REQUIRE(placed.value.has_value() == walked.value.has_value());
            if (!placed.value)
                continue;
            CHECK(*walked.value == *placed.value);
            REQUIRE(placed.se.has_value() == walked.se.has_value());
            REQUIRE(placed.lower.has_value() == walked.lower.has_value());
            if (placed.se)
                CHECK_THAT(*walked.se, WithinAbs(*placed.se, 1e-14 * std::max(1.0, *placed.se)));
            if (placed.lower) {
                CHECK_THAT(*walked.lower, WithinAbs(*placed.lower, 1e-13));
                CHECK_THAT(*walked.upper, WithinAbs(*placed.upper, 1e-13));
                CHECK(walked.ciMethod == placed.ciMethod);
            }
        }
    }
}

TEST_CASE("A score that equals nothing (NaN) ends its own tie block in both DeLong walks", "[discrimination]")
{
    // Not reachable from a file (the intake refuses such a score), but a computed risk may be NaN:
    // the walk must end, and agree with the placements' walk.
    const std::vector<std::uint8_t> y{1, 0, 1, 0, 0, 1};
    const std::vector<double> p{0.8, std::nan(""), 0.3, 0.2, 0.3, 0.6};
    const Estimate walked = cStatistic(y, p, ascendingOrder(p), CStatisticScale::Plain, 0.95);
    const Estimate placed = cStatistic(delongPlacements(y, p), CStatisticScale::Plain, 0.95);
    REQUIRE(walked.value);
    CHECK(*walked.value == *placed.value);
}
