// Checks written because a mutation of tests/mutants/mutations.txt survived the other tests
// (`./plumbline.sh mutants`): each names the mutation it kills and the source of its expected
// value. Rules of thumb of the project are marked "common practice" as in docs/methods.md.
#include "resampling/interval_choice.hpp"
#include "support/intake_test_support.hpp"
#include "intake/score_scale.hpp"
#include "analyses/subgroup_analysis.hpp"

#include <catch2/catch.hpp>

#include <optional>
#include <string>
#include <vector>

using namespace plumbline;
using namespace plumbline::test;

TEST_CASE("A BCa interval that misses its estimate gives way to the percentile interval", "[intervals][mutants]")
{
    // Kills V4. The rule of docs/methods.md §17 (common practice): an interval that does not hold
    // its own estimate is not reported; the percentile interval is the first fallback.
    MetricBootstrap b;
    b.replicatesUsed = 1000;
    b.percentile = {0.15, 0.5};
    b.bca = std::pair{0.2, 0.3}; // misses 0.175
    b.z0 = 0.4;                  // a moderate bias correction: not the extreme-z0 rule
    const BootstrapEvidence plenty{100, 100, 0, 1000};
    const ChosenInterval chosen = chooseInterval(Estimate::point(0.175), b, BootstrapCi::Bca, plenty);
    CHECK(chosen.estimate.ciMethod == CiMethod::BootstrapPercentile);
    CHECK(*chosen.estimate.lower == 0.15);
    CHECK(*chosen.estimate.upper == 0.5);
    CHECK(chosen.note.find("the BCa interval misses the estimate") != std::string::npos);
}

TEST_CASE("Under the default scale 2 percent of scores outside 0-1 stops the run", "[intake][mutants]")
{
    // Kills I7. README, Input format: "If more than 1 % of the scores fall outside 0–1 under the
    // default scale, the run stops" (the 1 % is common practice). 2 of 100 scores here.
    std::string text = "y,p\n";
    for (int i = 0; i < 98; ++i)
        text += std::to_string(i % 2) + ",0." + std::to_string(i % 9 + 1) + "\n";
    text += "1,37\n0,45\n";
    const auto result = intakeOf(settingsFor({"p"}), text);
    REQUIRE_FALSE(result);
    CHECK(result.error().column == "p");
    CHECK(result.error().line == 100);
}

TEST_CASE("A row excluded for its second score is counted under that score's own reason", "[intake][mutants]")
{
    // Kills I9. README, Input format: "Every excluded row is counted under one reason"; the field
    // 'abc' in column b is not a number, so the row counts as "score is not a number" under b,
    // whatever column a holds.
    const auto result = intakeOf(settingsFor({"a", "b"}), "y,a,b\n1,0.5,0.4\n0,0.2,abc\n1,0.3,0.6\n0,0.1,0.2\n");
    REQUIRE(result);
    const auto* tally = findTally(result->audit, ExclusionReason::ScoreNotANumber, "b");
    REQUIRE(tally);
    CHECK(tally->rows == 1);
    CHECK(tally->firstLines == std::vector<std::size_t>{3});
    CHECK(findTally(result->audit, ExclusionReason::MissingScore, "b") == nullptr);
    CHECK(result->audit.balances());
}

TEST_CASE("A percent score of exactly 100 is a risk of 1 not an out-of-range value", "[intake][scale][mutants]")
{
    // Kills I3. README, Input format: the percent scale runs over 0-100, both ends included.
    CHECK(convertScore(100.0, ScoreScale::Percent) == std::optional<double>(1.0));
    CHECK(convertScore(0.0, ScoreScale::Percent) == std::optional<double>(0.0));
    CHECK_FALSE(convertScore(100.5, ScoreScale::Percent));
    auto settings = settingsFor({"p"});
    settings.scale = ScoreScale::Percent;
    settings.scaleGiven = true;
    const auto result = intakeOf(settings, "y,p\n1,100\n0,20\n1,65\n0,0\n");
    REQUIRE(result);
    CHECK(result->audit.rowsUsed == 4);
    CHECK(result->cohort.models[0].values == std::vector<double>{1.0, 0.2, 0.65, 0.0});
}

TEST_CASE("A subgroup level with too few non-events is flagged and left out of the funnel", "[subgroups][mutants]")
{
    // Kills G3. docs/methods.md §20: a level with fewer than --min-cell (default 11, common
    // practice) patients, events OR non-events is flagged and left out of the tests and the funnel.
    // Level "a": 60 patients, 50 events, 10 non-events; level "b": 60 patients, 20 events.
    Cohort cohort;
    CategoricalColumn site{"site", {"a", "b"}, {}};
    std::vector<double> risks;
    for (int i = 0; i < 120; ++i) {
        const bool inA = i < 60;
        const int j = inA ? i : i - 60;
        cohort.outcome.push_back(inA ? (j < 50 ? 1 : 0) : (j < 20 ? 1 : 0));
        site.codes.push_back(inA ? 0 : 1);
        risks.push_back(0.1 + 0.8 * double((j * 7) % 60) / 60.0);
    }
    cohort.models.push_back({"model", risks});
    cohort.groups.push_back(site);
    const SubgroupAnalysis subgroups = analyseSubgroups(cohort, PanelSettings{}, 11);
    REQUIRE(subgroups.results.size() == 2);
    CHECK(subgroups.results[0].level == "a");
    CHECK(subgroups.results[0].tooSmall);
    CHECK(subgroups.results[1].level == "b");
    CHECK_FALSE(subgroups.results[1].tooSmall);
    REQUIRE(subgroups.funnel.size() == 1);
    CHECK(subgroups.funnel[0].level == "b");
}
