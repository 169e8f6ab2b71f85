#include "support/intake_test_support.hpp"

#include <catch2/catch.hpp>

using namespace plumbline;
using namespace plumbline::test;

namespace {

IntakeSettings joinSettings()
{
    IntakeSettings settings = settingsFor({"p"}, "y");
    settings.cohortFile = "scores.csv";
    settings.outcomesFile = "outcomes.csv";
    settings.idColumn = "id";
    settings.outcomesIdColumn = "patient";
    return settings;
}

std::expected<IntakeResult, InputError> join(const std::string& scores, const std::string& outcomes)
{
    const IntakeSettings settings = joinSettings();
    return runIntake(settings, *TextFile::fromBytes("scores.csv", scores), *TextFile::fromBytes("outcomes.csv", outcomes));
}

} // namespace

TEST_CASE("Two files join on trimmed ids and the cohort follows the scores file's order", "[join]")
{
    const auto result = join("id,p\n a ,0.8\nb,0.1\nc,0.3\n", "patient,y\nc,0\na,1\nb,0\n");
    REQUIRE(result);
    CHECK(result->cohort.ids == std::vector<std::string>{"a", "b", "c"});
    CHECK(result->cohort.outcome == std::vector<std::uint8_t>{1, 0, 0});
    REQUIRE(result->audit.join);
    CHECK(result->audit.join->matched == 3);
    CHECK(result->audit.balances());
    REQUIRE(result->inputs.size() == 2);
    CHECK(result->inputs[1].role == "outcomes");
    CHECK(result->inputs[1].rows == 3);
}

TEST_CASE("Ids are compared exactly: case and inner spaces matter", "[join]")
{
    const auto result = join("id,p\nA,0.8\nb,0.1\nc c,0.3\nd,0.2\n", "patient,y\na,1\nb,0\ncc,0\nd,1\n");
    REQUIRE(result);
    CHECK(result->audit.join->matched == 2);
    CHECK(result->audit.join->scoresWithoutOutcome == 2);
    CHECK(result->audit.join->outcomesWithoutScore == 2);
}

TEST_CASE("A duplicated id excludes every copy on its side and the partner row is accounted for", "[join]")
{
    const std::string scores = "id,p\na,0.8\nb,0.1\nb,0.2\nc,0.3\nd,0.4\ne,0.5\nf,0.6\n";
    const std::string outcomes = "patient,y\na,1\nb,0\nc,0\nc,1\nd,0\ng,1\n,0\nf\n";
    const auto result = join(scores, outcomes);
    REQUIRE(result);
    const IntakeAudit& audit = result->audit;
    const JoinSummary& j = *audit.join;
    CHECK(audit.rowsRead == 7);
    CHECK(findTally(audit, ExclusionReason::DuplicateId, "id")->firstLines == std::vector<std::size_t>{3, 4});
    CHECK(findTally(audit, ExclusionReason::OutcomeIdDuplicated, "id")->firstLines == std::vector<std::size_t>{5});
    CHECK(findTally(audit, ExclusionReason::NoMatchingOutcome, "id")->firstLines == std::vector<std::size_t>{7, 8});
    CHECK(audit.rowsUsed == 2); // a and d
    CHECK(j.outcomeRows == 8);
    CHECK(j.matched == 2);
    CHECK(j.scoresWithoutOutcome == 2); // e, f (f's outcome row is malformed)
    CHECK(j.outcomesWithoutScore == 1); // g
    std::size_t outcomeExcluded = 0;
    for (const auto& tally : j.outcomeFileExclusions)
        outcomeExcluded += tally.rows;
    CHECK(outcomeExcluded == 5); // b (scores duplicated), c twice, missing id, malformed f
    CHECK(audit.balances());
}

TEST_CASE("A missing outcome in the outcomes file is excluded with the outcomes file's line", "[join]")
{
    const auto result = join("id,p\na,0.8\nb,0.1\nc,0.3\n", "patient,y\nc,0\na,1\nb,NA\n");
    REQUIRE(result);
    const auto* tally = findTally(result->audit, ExclusionReason::MissingOutcome, "y");
    REQUIRE(tally);
    CHECK(tally->file == "outcomes.csv");
    CHECK(tally->firstLines == std::vector<std::size_t>{4});
}

TEST_CASE("The outcomes file's own columns are checked with its name in the message", "[join][errors]")
{
    const auto result = join("id,p\na,0.8\n", "pat,y\na,1\n");
    REQUIRE_FALSE(result);
    CHECK(result.error().file == "outcomes.csv");
    CHECK(result.error().column == "patient");
}

TEST_CASE("A join where every score id is duplicated says why no row is left", "[join][errors]")
{
    const auto result = join("id,p\na,0.8\na,0.1\nb,0.3\nb,0.2\n", "patient,y\na,1\nb,0\n");
    REQUIRE_FALSE(result);
    CHECK(result.error().problem.find("none of the 4 rows can be used") != std::string::npos);
    CHECK(result.error().problem.find("outcome column holds no values") == std::string::npos);
    CHECK(result.error().remedy.find("each patient's id must appear once") != std::string::npos);
}
