#include "reporting/disclosure_plan.hpp"
#include "reporting/small_cell_protection.hpp"
#include "analyses/validation.hpp"

#include <catch2/catch.hpp>

#include <algorithm>
#include <array>
#include <cmath>

using namespace plumbline;

// The rules checked here are the usual ones of statistical disclosure control (primary and
// complementary suppression; Hundepool et al., Statistical Disclosure Control, Wiley 2012, ch. 7 -
// from memory). Every example is worked by hand.

TEST_CASE("A small cell in a column that adds up to a published total takes the next smallest with it", "[disclosure]")
{
    SmallCellProtection cells;
    const auto total = cells.published(505);
    const std::array parts{cells.printed(5), cells.printed(200), cells.printed(300)};
    cells.sumOf(parts, total);
    cells.protect(11);
    CHECK(cells.suppressed(parts[0]));
    CHECK(cells.primary(parts[0]));
    CHECK(cells.suppressed(parts[1])); // 505 - 300 - 5 would otherwise give it back
    CHECK_FALSE(cells.primary(parts[1]));
    CHECK_FALSE(cells.suppressed(parts[2]));
}

TEST_CASE("Zero is shown and a count at the minimum is not small", "[disclosure]")
{
    SmallCellProtection cells;
    const auto total = cells.published(11);
    const std::array parts{cells.printed(0), cells.printed(11)};
    cells.sumOf(parts, total);
    cells.protect(11);
    CHECK_FALSE(cells.suppressed(parts[0]));
    CHECK_FALSE(cells.suppressed(parts[1]));
}

TEST_CASE("A two-by-two table with published margins loses all four cells to one small one", "[disclosure]")
{
    // a b | 105      a = 5: with the margins, any one cell gives the other three.
    // c d | 400
    SmallCellProtection cells;
    const auto a = cells.printed(5), b = cells.printed(100), c = cells.printed(150), d = cells.printed(250);
    cells.sumOf(std::array{a, b}, cells.published(105));
    cells.sumOf(std::array{c, d}, cells.published(400));
    cells.sumOf(std::array{a, c}, cells.published(155));
    cells.sumOf(std::array{b, d}, cells.published(350));
    cells.protect(11);
    for (auto cell : {a, b, c, d})
        CHECK(cells.suppressed(cell));
    CHECK(cells.unprotectable() == 0);
}

TEST_CASE("A small count that is not printed but is a difference of printed ones is protected", "[disclosure]")
{
    // A risk group of 500 patients with 495 events has 5 non-events: printing both counts shows them.
    SmallCellProtection cells;
    const auto patients = cells.printed(500), events = cells.printed(495), nonEvents = cells.unprinted(5);
    cells.sumOf(std::array{events, nonEvents}, patients);
    cells.protect(11);
    CHECK(cells.primary(nonEvents));
    CHECK(cells.suppressed(events) != cells.suppressed(patients)); // one of them, the smaller
    CHECK(cells.suppressed(events));
}

TEST_CASE("Suppression looks at every relation together, not one at a time", "[disclosure]")
{
    // x + y = 40 (y printed through z): relations x + y = 40, y + z = 130, x + z = 100 (all published)
    // determine all three cells: no suppression can protect x = 5, and the rule says so.
    SmallCellProtection cells;
    const auto x = cells.printed(5), y = cells.printed(35), z = cells.printed(95);
    cells.sumOf(std::array{x, y}, cells.published(40));
    cells.sumOf(std::array{y, z}, cells.published(130));
    cells.sumOf(std::array{x, z}, cells.published(100));
    cells.protect(11);
    CHECK(cells.unprotectable() > 0);

    // A printed subtotal: x + y + z = 145 (published) and y + z = 140 (printed) give x = 5 even
    // after y and z are suppressed, so the subtotal must go too (it is reached through y and z).
    SmallCellProtection chained;
    const auto x2 = chained.printed(5), y2 = chained.printed(40), z2 = chained.printed(100), w2 = chained.printed(60);
    chained.sumOf(std::array{x2, y2, z2}, chained.published(145));
    chained.sumOf(std::array{y2, z2}, chained.printed(140));
    chained.sumOf(std::array{z2, w2}, chained.published(160));
    chained.protect(11);
    CHECK(chained.suppressed(x2));
    CHECK(chained.unprotectable() == 0);
}

namespace {

// 400 patients at three sites (300, 90 and 10), risks rising with the row, every fourth patient
// an event at the first site and at the third only the first two.
Cohort threeSites()
{
    Cohort cohort;
    CategoricalColumn site{"site", {"North", "South", "Tiny"}, {}};
    std::vector<double> risk;
    for (std::size_t i = 0; i < 400; ++i) {
        const std::uint32_t level = i < 300 ? 0 : i < 390 ? 1 : 2;
        site.codes.push_back(level);
        risk.push_back(0.05 + 0.6 * double(i % 100) / 100.0);
        const bool event = level == 2 ? i < 392 : (i % 4 == 0) || (i % 100 > 80);
        cohort.outcome.push_back(event ? 1 : 0);
    }
    cohort.models.push_back({"score", risk});
    cohort.groups.push_back(site);
    return cohort;
}

} // namespace

TEST_CASE("A report's plan leaves no site's events to subtraction and empties what it withholds", "[disclosure]")
{
    const Cohort cohort = threeSites();
    PanelSettings settings;
    settings.thresholds = {0.2, 0.4};
    const ValidationResult result = runValidation(cohort, settings, 1);
    REQUIRE(result.subgroups);
    const DisclosurePlan plan = planDisclosure(cohort, result, 0.2, 11);

    // The tiny site (10 patients, 2 events) is small; another site's counts go with it.
    std::size_t suppressedEvents = 0;
    for (std::size_t r = 0; r < result.subgroups->results.size(); ++r) {
        const auto& level = result.subgroups->results[r];
        if (level.level == "Tiny") {
            CHECK(plan.subgroups[r][0].primary);
            CHECK(plan.subgroups[r][1].primary);
        }
        suppressedEvents += plan.subgroups[r][1].suppressed ? 1 : 0;
    }
    CHECK(suppressedEvents >= 2);

    const ValidationResult shown = redactedForReport(result, plan);
    for (std::size_t r = 0; r < shown.subgroups->results.size(); ++r)
        if (plan.subgroupWithheld(r))
            for (const auto& metric : shown.subgroups->results[r].panel.metrics)
                CHECK_FALSE(metric.estimate.value.has_value());
    for (const auto& f : shown.subgroups->funnel)
        CHECK(f.level != "Tiny");
    // Net benefit is withheld exactly where a count behind it is small.
    const auto& curve = result.models[0].decisionCurve;
    for (std::size_t k = 0; k < curve.size(); ++k) {
        std::size_t tp = 0, fp = 0;
        for (std::size_t i = 0; i < cohort.rows(); ++i)
            if (cohort.models[0].values[i] >= curve[k].threshold)
                (cohort.outcome[i] ? tp : fp) += 1;
        const std::size_t events = cohort.events(), tn = cohort.rows() - events - fp, fn = events - tp;
        const std::array counts{tp, fp, tn, fn};
        const bool small = std::any_of(counts.begin(), counts.end(), [](std::size_t c) { return c > 0 && c < 11; });
        if (small)
            CHECK(plan.decisionCurveWithheld[0][k]);
    }
    CHECK(shown.models[0].decisionCurve.size() < curve.size());
    // The ROC curve as a report draws it: consecutive vertices at least the minimum apart in
    // both counts, so no vertex pair brackets a small group.
    const auto& roc = shown.models[0].roc;
    REQUIRE(roc.size() >= 2);
    CHECK(roc.size() < result.models[0].roc.size());
    const double events = double(cohort.events()), nonEvents = double(cohort.rows()) - events;
    for (std::size_t k = 1; k < roc.size(); ++k) {
        CHECK(std::abs(roc[k].sensitivity - roc[k - 1].sensitivity) * events >= 11.0 - 1e-9);
        CHECK(std::abs(roc[k].specificity - roc[k - 1].specificity) * nonEvents >= 11.0 - 1e-9);
    }
}
