#include "support/intake_test_support.hpp"

#include <catch2/catch.hpp>

#include <cmath>

using namespace plumbline;
using namespace plumbline::test;

TEST_CASE("A clean comma file is read whole and the audit balances", "[intake]")
{
    const auto result = intakeOf(settingsFor({"p"}), "id,y,p\na,1,0.8\nb,0,0.1\nc,0,0.3\n");
    REQUIRE(result);
    CHECK(result->audit.rowsRead == 3);
    CHECK(result->audit.rowsUsed == 3);
    CHECK(result->audit.events == 1);
    CHECK(result->audit.balances());
    CHECK(result->cohort.outcome == std::vector<std::uint8_t>{1, 0, 0});
    CHECK(result->cohort.models[0].values == std::vector<double>{0.8, 0.1, 0.3});
    CHECK(result->cohort.sourceLines == std::vector<std::uint32_t>{2, 3, 4});
}

TEST_CASE("BOM CRLF quoted fields and trailing blank lines read like the plain file", "[intake]")
{
    const auto plain = intakeOf(settingsFor({"p"}), "id,y,p\na,1,0.8\nb,0,0.1\n");
    const auto messy = intakeOf(settingsFor({"p"}), "\xEF\xBB\xBFid,\"y\",p\r\n\"a, the first\",1,\"0.8\"\r\n\"b\nline\",0,0.1\r\n\r\n\r\n");
    REQUIRE(plain);
    REQUIRE(messy);
    CHECK(messy->cohort.outcome == plain->cohort.outcome);
    CHECK(messy->cohort.models[0].values == plain->cohort.models[0].values);
    CHECK(messy->audit.rowsRead == 2);
    CHECK(messy->cohort.sourceLines == std::vector<std::uint32_t>{2, 3});
}

TEST_CASE("Semicolon files with a decimal comma read 0 25 as 0.25", "[intake]")
{
    auto settings = settingsFor({"p"});
    settings.decimalComma = true;
    const auto result = intakeOf(settings, "y;p\n1;0,25\n0;0,5\n");
    REQUIRE(result);
    CHECK(result->audit.delimiter == ';');
    CHECK(result->cohort.models[0].values == std::vector<double>{0.25, 0.5});
}

TEST_CASE("Tab and pipe files are sniffed and an explicit delimiter overrides the sniffer", "[intake]")
{
    CHECK(intakeOf(settingsFor({"p"}), "y\tp\n1\t0.2\n0\t0.1\n")->audit.delimiter == '\t');
    CHECK(intakeOf(settingsFor({"p"}), "y|p\n1|0.2\n0|0.1\n")->audit.delimiter == '|');
    auto settings = settingsFor({"p"});
    settings.delimiter = ';';
    const auto result = intakeOf(settings, "y;p;n\n1;0.2;a,b,c\n0;0.1;d,e,f\n");
    REQUIRE(result);
    CHECK_FALSE(result->audit.delimiterSniffed);
}

TEST_CASE("Missing-value tokens exclude the row under 'missing' counted with their lines", "[intake]")
{
    const auto result = intakeOf(settingsFor({"p"}), "y,p\n1,0.5\nNA,0.2\n0,n/a\n0,NULL\n1,.\n0,NaN\n,0.3\n0,0.4\n");
    REQUIRE(result);
    const IntakeAudit& audit = result->audit;
    CHECK(audit.rowsRead == 8);
    CHECK(audit.rowsUsed == 2);
    const auto* missingOutcome = findTally(audit, ExclusionReason::MissingOutcome, "y");
    REQUIRE(missingOutcome);
    CHECK(missingOutcome->rows == 2);
    CHECK(missingOutcome->firstLines == std::vector<std::size_t>{3, 8});
    const auto* missingScore = findTally(audit, ExclusionReason::MissingScore, "p");
    REQUIRE(missingScore);
    CHECK(missingScore->rows == 4);
    CHECK(missingScore->firstLines == std::vector<std::size_t>{4, 5, 6, 7});
    CHECK(audit.balances());
}

TEST_CASE("Only the first five lines of a reason are kept the count is complete", "[intake]")
{
    std::string text = "y,p\n1,0.5\n0,0.5\n";
    for (int i = 0; i < 12; ++i)
        text += "0,bad\n";
    const auto result = intakeOf(settingsFor({"p"}), text);
    REQUIRE(result);
    const auto* tally = findTally(result->audit, ExclusionReason::ScoreNotANumber, "p");
    REQUIRE(tally);
    CHECK(tally->rows == 12);
    CHECK(tally->firstLines == std::vector<std::size_t>{4, 5, 6, 7, 8});
}

TEST_CASE("Non-numbers non-finite and out-of-range scores are excluded under their own reasons", "[intake]")
{
    std::string text = "y,p\n";
    for (int i = 0; i < 200; ++i)
        text += (i % 2 ? "1,0.6\n" : "0,0.3\n");
    text += "1,0.2x\n0,inf\n1,1.5\n";
    const auto result = intakeOf(settingsFor({"p"}), text);
    REQUIRE(result);
    CHECK(findTally(result->audit, ExclusionReason::ScoreNotANumber, "p")->firstLines == std::vector<std::size_t>{202});
    CHECK(findTally(result->audit, ExclusionReason::ScoreNotFinite, "p")->firstLines == std::vector<std::size_t>{203});
    CHECK(findTally(result->audit, ExclusionReason::ScoreOutOfRange, "p")->firstLines == std::vector<std::size_t>{204});
    CHECK(result->audit.rowsUsed == 200);
    CHECK(result->audit.balances());
}

TEST_CASE("Rows with the wrong number of fields are excluded never shifted", "[intake]")
{
    const auto result = intakeOf(settingsFor({"p"}), "y,p\n1,0.5\n0\n0,0.2,extra\n0,0.1\n");
    REQUIRE(result);
    const auto* tally = findTally(result->audit, ExclusionReason::WrongFieldCount);
    REQUIRE(tally);
    CHECK(tally->firstLines == std::vector<std::size_t>{3, 4});
    CHECK(result->audit.rowsUsed == 2);
}

TEST_CASE("Outcome spellings are recognised in any case", "[intake]")
{
    for (const char* pair : {"Yes,No", "TRUE,false", "y,N", "1,0"}) {
        const std::string text(pair);
        const std::string event = text.substr(0, text.find(','));
        const std::string nonEvent = text.substr(text.find(',') + 1);
        const auto result = intakeOf(settingsFor({"p"}), "y,p\n" + event + ",0.6\n" + nonEvent + ",0.2\n" + nonEvent + ",0.1\n");
        REQUIRE(result);
        CHECK(result->cohort.outcome == std::vector<std::uint8_t>{1, 0, 0});
    }
}

TEST_CASE("The --event names the event of any two-valued outcome option", "[intake]")
{
    auto settings = settingsFor({"p"});
    settings.eventValue = "readmitted";
    const auto result = intakeOf(settings, "y,p\nhome,0.2\nreadmitted,0.6\n");
    REQUIRE(result);
    CHECK(result->cohort.outcome == std::vector<std::uint8_t>{0, 1});
}

TEST_CASE("An outcome with three values is refused and the values are listed", "[intake]")
{
    const auto result = intakeOf(settingsFor({"p"}), "y,p\nyes,0.2\nno,0.6\nunknown,0.5\n");
    REQUIRE_FALSE(result);
    CHECK(result.error().message().find("'unknown' (1 rows, first on line 4)") != std::string::npos);
}

TEST_CASE("One outcome class is an impossible analysis (exit 3) also after exclusions", "[intake]")
{
    const auto single = intakeOf(settingsFor({"p"}), "y,p\n0,0.2\n0,0.6\n");
    REQUIRE_FALSE(single);
    CHECK(single.error().kind == ErrorKind::ImpossibleAnalysis);
    const auto afterExclusion = intakeOf(settingsFor({"p"}), "y,p\n1,NA\n0,0.2\n0,0.6\n");
    REQUIRE_FALSE(afterExclusion);
    CHECK(afterExclusion.error().kind == ErrorKind::ImpossibleAnalysis);
    CHECK(afterExclusion.error().problem.find("missing score") != std::string::npos);
}

TEST_CASE("Percent logit and points scales convert scores", "[intake]")
{
    auto settings = settingsFor({"p"});
    settings.scale = ScoreScale::Percent;
    settings.scaleGiven = true;
    CHECK(intakeOf(settings, "y,p\n1,25\n0,50\n")->cohort.models[0].values == std::vector<double>{0.25, 0.5});
    settings.scale = ScoreScale::Logit;
    CHECK(intakeOf(settings, "y,p\n1,0\n0,0\n")->cohort.models[0].values == std::vector<double>{0.5, 0.5});
    settings.scale = ScoreScale::Points;
    CHECK(intakeOf(settings, "y,p\n1,17\n0,3\n")->cohort.models[0].values == std::vector<double>{17.0, 3.0});
}

TEST_CASE("Under the default scale >1 % of scores outside 0-1 stops the run with a fitting scale", "[intake]")
{
    std::string text = "y,p\n";
    for (int i = 0; i < 100; ++i)
        text += std::to_string(i % 2) + "," + std::to_string(i % 50) + ".5\n";
    const auto result = intakeOf(settingsFor({"p"}), text);
    REQUIRE_FALSE(result);
    CHECK(result.error().remedy.find("--scale percent") != std::string::npos);
    CHECK(result.error().line == 3);
    CHECK(result.error().column == "p");
}

TEST_CASE("Under the default scale at most 1 % outside 0-1 is excluded and counted", "[intake]")
{
    std::string text = "y,p\n";
    for (int i = 0; i < 100; ++i)
        text += std::to_string(i % 2) + ",0." + std::to_string(i % 9 + 1) + "\n";
    text += "1,37\n";
    const auto result = intakeOf(settingsFor({"p"}), text);
    REQUIRE(result);
    CHECK(findTally(result->audit, ExclusionReason::ScoreOutOfRange, "p")->rows == 1);
}

TEST_CASE("An explicit probability scale excludes out-of-range scores and warns", "[intake]")
{
    auto settings = settingsFor({"p"});
    settings.scaleGiven = true;
    const auto result = intakeOf(settings, "y,p\n1,0.5\n0,0.2\n1,40\n0,60\n");
    REQUIRE(result);
    CHECK(result->audit.rowsUsed == 2);
    REQUIRE(result->audit.warnings.size() == 1);
}

TEST_CASE("Several scores are read as complete cases and each column's cost is reported", "[intake]")
{
    const auto result = intakeOf(settingsFor({"a", "b"}), "y,a,b\n1,0.5,0.4\n0,NA,0.2\n0,0.1,NA\n1,NA,NA\n0,0.3,0.3\n");
    REQUIRE(result);
    const IntakeAudit& audit = result->audit;
    CHECK(audit.rowsUsed == 2);
    REQUIRE(audit.scoreColumns.size() == 2);
    CHECK(audit.scoreColumns[0].unusable == 2);
    CHECK(audit.scoreColumns[0].onlyThisColumn == 1);
    CHECK(audit.scoreColumns[1].unusable == 2);
    CHECK(audit.scoreColumns[1].onlyThisColumn == 1);
    // A row missing both is counted once, under the first column.
    CHECK(findTally(audit, ExclusionReason::MissingScore, "a")->rows == 2);
    CHECK(findTally(audit, ExclusionReason::MissingScore, "b")->rows == 1);
    CHECK(result->cohort.models[1].values == std::vector<double>{0.4, 0.3});
    CHECK(audit.balances());
}

TEST_CASE("Group columns are dictionary-coded over the rows used missing as its own level", "[intake]")
{
    auto settings = settingsFor({"p"});
    settings.groupColumns = {"site"};
    const auto result = intakeOf(settings, "y,p,site\n1,0.5,A\n0,NA,Z\n0,0.2,B\n1,0.4,\n0,0.1,A\n");
    REQUIRE(result);
    const CategoricalColumn& site = result->cohort.groups[0];
    CHECK(site.levels == std::vector<std::string>{"A", "B", "(missing)"});
    CHECK(site.codes == std::vector<std::uint32_t>{0, 1, 2, 0});
}

TEST_CASE("The period column's dates are read once at intake one per distinct text", "[intake][periods]")
{
    auto settings = settingsFor({"p"});
    settings.periodColumn = "d";
    const auto result = intakeOf(settings, "y,p,d\n1,0.5,2025-03-31\n0,0.2,03/04/2025\n0,0.1,2025-03-31\n1,0.4,soon\n0,0.3,\n");
    REQUIRE(result);
    REQUIRE(result->cohort.period);
    const DateColumn& dates = *result->cohort.period;
    CHECK(result->cohort.groups.empty()); // a period column is not also a group unless asked
    CHECK(dates.levels == std::vector<std::string>{"2025-03-31", "03/04/2025", "soon", "(missing)"});
    CHECK(dates.codes == std::vector<std::uint32_t>{0, 1, 0, 2, 3});
    REQUIRE(dates.written.size() == dates.levels.size());
    using Shape = WrittenDate::Shape;
    CHECK((dates.written[0].shape == Shape::Iso && dates.written[0].year == 2025 && dates.written[0].first == 3 && dates.written[0].second == 31));
    CHECK((dates.written[1].shape == Shape::Slashed && dates.written[1].year == 2025 && dates.written[1].first == 3 && dates.written[1].second == 4));
    CHECK(dates.written[2].shape == Shape::Unreadable);
    CHECK(dates.written[3].shape == Shape::Unreadable);
}

TEST_CASE("A missing column names the closest columns", "[intake][errors]")
{
    const auto result = intakeOf(settingsFor({"supplier_scor"}, "readmitted"), "readmitted,supplier_score,local_score\n1,0.2,0.3\n");
    REQUIRE_FALSE(result);
    CHECK(result.error().message().find("cohort.csv, line 1, column 'supplier_scor'") == 0);
    CHECK(result.error().remedy.find("'supplier_score'") != std::string::npos);
}

TEST_CASE("A wrong delimiter is named as the likely cause", "[intake][errors]")
{
    auto settings = settingsFor({"p"});
    settings.delimiter = ';';
    const auto result = intakeOf(settings, "y,p\n1,0.2\n0,0.3\n");
    REQUIRE_FALSE(result);
    CHECK(result.error().problem.find("delimiter") != std::string::npos);
    CHECK(result.error().remedy.find("comma") != std::string::npos);
}

TEST_CASE("A file without a header row is refused", "[intake][errors]")
{
    const auto result = intakeOf(settingsFor({"p"}), "1,0.2\n0,0.3\n");
    REQUIRE_FALSE(result);
    CHECK(result.error().problem.find("no header row") != std::string::npos);
    CHECK(result.error().line == 1);
}

TEST_CASE("A file that is not UTF-8 is refused naming line and column", "[intake][errors]")
{
    const auto result = intakeOf(settingsFor({"p"}), "y,p,town\n1,0.2,Bern\n0,0.3,Z\xFCrich\n");
    REQUIRE_FALSE(result);
    CHECK(result.error().line == 3);
    CHECK(result.error().column == "town");
    CHECK(result.error().remedy.find("UTF-8") != std::string::npos);
}

TEST_CASE("An unclosed quote is refused with its line and column", "[intake][errors]")
{
    const auto result = intakeOf(settingsFor({"p"}), "y,p,note\n1,0.2,\"open\n0,0.3,x\n");
    REQUIRE_FALSE(result);
    CHECK(result.error().line == 2);
    CHECK(result.error().column == "note");
}

TEST_CASE("Settings that cannot work are refused before reading", "[intake][errors]")
{
    CHECK_FALSE(intakeOf(settingsFor({}), "y,p\n1,0.2\n"));
    CHECK_FALSE(intakeOf(settingsFor({"p", "p"}), "y,p\n1,0.2\n"));
    CHECK_FALSE(intakeOf(settingsFor({"y"}), "y,p\n1,0.2\n"));
    const auto ambiguous = intakeOf(settingsFor({"p"}), "y,p,p\n1,0.2,0.3\n0,0.1,0.1\n");
    REQUIRE_FALSE(ambiguous);
    CHECK(ambiguous.error().problem.find("ambiguous") != std::string::npos);
}

TEST_CASE("A header without data rows is named as such", "[intake][errors]")
{
    const auto result = intakeOf(settingsFor({"p"}), "y,p\n");
    REQUIRE_FALSE(result);
    CHECK(result.error().problem == "the file has a header row but no data rows.");
}

TEST_CASE("Scores nearer to 0 than a double holds are read as 0 whatever their sign and counted", "[intake]")
{
    // 1e-400 underflows when read; -1e-310 is a subnormal: one rule for both (read as 0).
    const auto result = intakeOf(settingsFor({"p"}), "y,p\n1,1e-400\n0,-1e-310\n1,0.5\n0,0.25\n");
    REQUIRE(result);
    CHECK(result->audit.rowsUsed == 4);
    CHECK(result->cohort.models[0].values[0] == 0.0);
    CHECK(result->cohort.models[0].values[1] == 0.0);
    CHECK_FALSE(std::signbit(result->cohort.models[0].values[1]));
    bool counted = false;
    for (const auto& w : result->audit.warnings)
        counted = counted || (w.find("2 scores are nearer to 0") != std::string::npos && w.find("first on line 2") != std::string::npos);
    CHECK(counted);
}

TEST_CASE("Ids stay with their rows when rows between them are excluded", "[intake]")
{
    // Long ids live on the heap: the first row stays where it is while later ones move down.
    IntakeSettings settings = settingsFor({"p"});
    settings.idColumn = "id";
    const std::string first = "first-patient-with-a-long-identifier-0001";
    const std::string third = "third-patient-with-a-long-identifier-0003";
    const auto result = intakeOf(settings, "id,y,p\n" + first + ",1,0.2\nb,0,\n" + third + ",0,0.3\nd,1,0.4\n");
    REQUIRE(result);
    CHECK(result->cohort.ids == std::vector<std::string>{first, third, "d"});
    CHECK(result->cohort.sourceLines == std::vector<std::uint32_t>{2, 4, 5});
    CHECK(result->cohort.models[0].values == std::vector<double>{0.2, 0.3, 0.4});
    CHECK(result->cohort.outcome == std::vector<std::uint8_t>{1, 0, 1});
}
