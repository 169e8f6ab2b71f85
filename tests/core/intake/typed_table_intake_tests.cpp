#include "intake/typed_table_intake.hpp"
#include "intake/xlsx_table.hpp"

#include "support/intake_test_support.hpp"
#include "intake/delimited_table.hpp"
#include "intake/field_values.hpp"
#include "support/memory_table.hpp"
#include "test_paths.hpp"

#include <catch2/catch.hpp>

#include <chrono>
#include <fstream>
#include <sstream>

using namespace plumbline;
using namespace plumbline::test;

namespace {

std::int64_t daysOf(int y, unsigned m, unsigned d)
{
    return std::chrono::sys_days{std::chrono::year{y} / m / d}.time_since_epoch().count();
}

// The cells a typed source would give for a delimited field: numbers as numbers, ISO dates as
// dates, empty as missing, the rest as text (the readers' own tests check their typing).
MemoryTable::Cell cellOf(std::string_view field)
{
    if (field.empty())
        return MemoryTable::missing();
    if (field.size() == 10 && field[4] == '-' && field[7] == '-')
        return MemoryTable::date(daysOf(std::stoi(std::string(field.substr(0, 4))), static_cast<unsigned>(std::stoi(std::string(field.substr(5, 2)))),
                                        static_cast<unsigned>(std::stoi(std::string(field.substr(8, 2))))));
    if (const auto number = parseNumber(field, false))
        return MemoryTable::number(*number);
    return MemoryTable::text(std::string(field));
}

// A delimited file's records as a typed table, each row at its text line.
MemoryTable tableOf(const std::string& path)
{
    auto file = TextFile::load(path);
    REQUIRE(file);
    auto table = DelimitedTable::open(std::move(*file), std::nullopt);
    REQUIRE(table);
    std::vector<TypedColumn> columns;
    for (const auto& name : table->header())
        columns.push_back({name, {}});
    MemoryTable memory(path + " (typed)", columns);
    const auto visited = table->forEachRecord([&](const CsvScanner& scanner) {
        std::vector<MemoryTable::Cell> cells;
        for (const auto field : scanner.fields())
            cells.push_back(cellOf(field));
        memory.addRow(std::move(cells), scanner.line());
    });
    REQUIRE(visited);
    return memory;
}

IntakeSettings sampleSettings()
{
    IntakeSettings settings;
    settings.cohortFile = std::string(sampleDataDir) + "/readmissions.csv";
    settings.outcomeColumn = "readmitted_30d";
    settings.scoreColumns = {"supplier_score", "local_score"};
    settings.groupColumns = {"hospital", "payer"};
    settings.periodColumn = "discharge_date";
    settings.idColumn = "encounter_id";
    return settings;
}

IntakeSettings memorySettings()
{
    auto settings = settingsFor({"p"});
    settings.cohortFile = "cohort.dta";
    return settings;
}

} // namespace

TEST_CASE("The sample cohort as typed cells gives the cohort and audit its delimited file gives", "[intake][typed]")
{
    const IntakeSettings settings = sampleSettings();
    const auto fromText = runIntake(settings);
    REQUIRE(fromText);
    MemoryTable typed = tableOf(settings.cohortFile);
    IntakeSettings typedSettings = settings;
    typedSettings.cohortFile = "readmissions.dta";
    const auto fromCells = runIntake(typedSettings, typed);
    REQUIRE(fromCells);
    const Cohort& a = fromText->cohort;
    const Cohort& b = fromCells->cohort;
    CHECK(a.outcome == b.outcome);
    REQUIRE(a.models.size() == b.models.size());
    for (std::size_t m = 0; m < a.models.size(); ++m)
        CHECK(a.models[m].values == b.models[m].values);
    CHECK(a.ids == b.ids);
    CHECK(a.sourceLines == b.sourceLines);
    REQUIRE(a.groups.size() == b.groups.size());
    for (std::size_t g = 0; g < a.groups.size(); ++g) {
        CHECK(a.groups[g].levels == b.groups[g].levels);
        CHECK(a.groups[g].codes == b.groups[g].codes);
    }
    REQUIRE(a.period);
    REQUIRE(b.period);
    CHECK(a.period->levels == b.period->levels);
    CHECK(a.period->codes == b.period->codes);
    const IntakeAudit& x = fromText->audit;
    const IntakeAudit& y = fromCells->audit;
    CHECK(x.rowsRead == y.rowsRead);
    CHECK(x.rowsUsed == y.rowsUsed);
    CHECK(x.events == y.events);
    CHECK(x.eventValue == y.eventValue);
    REQUIRE(x.exclusions.size() == y.exclusions.size());
    for (std::size_t i = 0; i < x.exclusions.size(); ++i) {
        CHECK(x.exclusions[i].reason == y.exclusions[i].reason);
        CHECK(x.exclusions[i].column == y.exclusions[i].column);
        CHECK(x.exclusions[i].rows == y.exclusions[i].rows);
        CHECK(x.exclusions[i].firstLines == y.exclusions[i].firstLines);
        CHECK(y.exclusions[i].file == typed.sourceName());
    }
    CHECK(y.lineNoun == "row");
    CHECK(y.balances());
    REQUIRE(fromCells->inputs.size() == 1);
    CHECK(fromCells->inputs[0].kind == "statistical file");
}

TEST_CASE("A value label names the event and labels name the groups", "[intake][typed]")
{
    MemoryTable table("cohort.dta", {{"y", {{1.0, "Readmitted"}, {0.0, "Not readmitted"}}}, {"p", {}}, {"site", {{7.0, "Ashford"}, {9.0, "Harbour"}}}});
    table.addRow({MemoryTable::number(0), MemoryTable::number(0.2), MemoryTable::number(7)}, 1);
    table.addRow({MemoryTable::number(1), MemoryTable::number(0.7), MemoryTable::number(9)}, 2);
    table.addRow({MemoryTable::number(0), MemoryTable::number(0.1), MemoryTable::number(8)}, 3);
    auto settings = memorySettings();
    settings.groupColumns = {"site"};
    SECTION("the label, in any case, as the event value")
    {
        settings.eventValue = "readmitted";
        const auto result = runIntake(settings, table);
        REQUIRE(result);
        CHECK(result->cohort.outcome == std::vector<std::uint8_t>{0, 1, 0});
        CHECK(result->audit.eventValue == "1");
        CHECK(result->cohort.groups[0].levels == std::vector<std::string>{"Ashford", "Harbour", "8"});
    }
    SECTION("the code as the event value")
    {
        settings.eventValue = "0";
        const auto result = runIntake(settings, table);
        REQUIRE(result);
        CHECK(result->cohort.outcome == std::vector<std::uint8_t>{1, 0, 1});
    }
}

TEST_CASE("Typed cells are excluded under the reasons and positions a delimited field would be", "[intake][typed]")
{
    MemoryTable table("cohort.xlsx, sheet 'Cohort'", {{"id", {}}, {"y", {}}, {"p", {}}});
    table.addRow({MemoryTable::text("a"), MemoryTable::number(1), MemoryTable::number(0.8)}, 2);
    table.addRow({MemoryTable::missing(), MemoryTable::number(0), MemoryTable::number(0.1)}, 3);
    table.addRow({MemoryTable::text("c"), MemoryTable::number(0), MemoryTable::missing()}, 5);
    table.addRow({MemoryTable::text("d"), MemoryTable::number(0), MemoryTable::text("NA")}, 6);
    table.addRow({MemoryTable::text("e"), MemoryTable::number(0), MemoryTable::text("high")}, 7);
    table.addRow({MemoryTable::text("f"), MemoryTable::number(1), MemoryTable::date(19000)}, 8);
    table.addRow({MemoryTable::text("g"), MemoryTable::missing(), MemoryTable::number(0.4)}, 9);
    table.addRow({MemoryTable::text("h"), MemoryTable::number(0), MemoryTable::text(" 0.25 ")}, 10);
    table.addRow({MemoryTable::number(42), MemoryTable::number(0), MemoryTable::number(1e-310)}, 11);
    table.addRow({MemoryTable::text("j"), MemoryTable::number(0), MemoryTable::number(1.5)}, 12);
    auto settings = memorySettings();
    settings.idColumn = "id";
    settings.scaleGiven = true; // probability chosen: the 1.5 is excluded, not a sign of another scale
    const auto result = runIntake(settings, table);
    REQUIRE(result);
    const IntakeAudit& audit = result->audit;
    CHECK(audit.rowsRead == 10);
    CHECK(audit.balances());
    const auto* missingId = findTally(audit, ExclusionReason::MissingId, "id");
    REQUIRE(missingId);
    CHECK(missingId->firstLines == std::vector<std::size_t>{3});
    const auto* missingScore = findTally(audit, ExclusionReason::MissingScore, "p");
    REQUIRE(missingScore);
    CHECK(missingScore->firstLines == std::vector<std::size_t>{5, 6});
    const auto* notNumber = findTally(audit, ExclusionReason::ScoreNotANumber, "p");
    REQUIRE(notNumber);
    CHECK(notNumber->firstLines == std::vector<std::size_t>{7, 8});
    const auto* missingOutcome = findTally(audit, ExclusionReason::MissingOutcome, "y");
    REQUIRE(missingOutcome);
    CHECK(missingOutcome->firstLines == std::vector<std::size_t>{9});
    const auto* outOfRange = findTally(audit, ExclusionReason::ScoreOutOfRange, "p");
    REQUIRE(outOfRange);
    CHECK(outOfRange->firstLines == std::vector<std::size_t>{12});
    CHECK(result->cohort.models[0].values == std::vector<double>{0.8, 0.25, 0.0});
    CHECK(result->cohort.ids == std::vector<std::string>{"a", "h", "42"});
    CHECK(result->cohort.sourceLines == std::vector<std::uint32_t>{2, 10, 11});
    CHECK(audit.lineNoun == "row");
    // The same values as delimited text: the same exclusions, counted at the lines.
    const auto text = intakeOf([] {
        auto s = settingsFor({"p"});
        s.idColumn = "id";
        s.scaleGiven = true;
        return s;
    }(), "id,y,p\na,1,0.8\n,0,0.1\nc,0,\nd,0,NA\ne,0,high\nf,1,2022-01-08\ng,,0.4\nh,0, 0.25 \n42,0,1e-310\nj,0,1.5\n");
    REQUIRE(text);
    REQUIRE(text->audit.exclusions.size() == audit.exclusions.size());
    for (std::size_t i = 0; i < audit.exclusions.size(); ++i) {
        CHECK(text->audit.exclusions[i].reason == audit.exclusions[i].reason);
        CHECK(text->audit.exclusions[i].rows == audit.exclusions[i].rows);
    }
    CHECK(text->cohort.models[0].values == result->cohort.models[0].values);
}

TEST_CASE("A source that fails part-way gives its error and no cohort", "[intake][typed]")
{
    MemoryTable table("query result", {{"y", {}}, {"p", {}}});
    for (std::size_t i = 1; i <= 10; ++i)
        table.addRow({MemoryTable::number(double(i % 2)), MemoryTable::number(0.1 * double(i % 9 + 1))}, i);
    InputError dropped;
    dropped.file = "postgresql://analyst@warehouse/quality";
    dropped.line = 7;
    dropped.lineNoun = "row of the result";
    dropped.problem = "the connection was lost while the result was read.";
    table.failAfter(6, dropped);
    auto settings = memorySettings();
    const auto result = runIntake(settings, table);
    REQUIRE_FALSE(result);
    CHECK(result.error().message().find("row of the result 7") != std::string::npos);
    CHECK(table.rowsVisited() == 6);
}

TEST_CASE("A column that is not in a typed source is named with the closest ones", "[intake][typed]")
{
    MemoryTable table("cohort.sav", {{"readmitted", {}}, {"score", {}}});
    table.addRow({MemoryTable::number(1), MemoryTable::number(0.5)}, 1);
    auto settings = memorySettings();
    settings.outcomeColumn = "readmited";
    settings.scoreColumns = {"score"};
    const auto result = runIntake(settings, table);
    REQUIRE_FALSE(result);
    CHECK(result.error().file == "cohort.sav");
    CHECK(result.error().remedy.find("'readmitted'") != std::string::npos);
    settings.outcomeColumn = "readmitted";
    settings.periodColumn = "discharged";
    const auto noPeriod = runIntake(settings, table);
    REQUIRE_FALSE(noPeriod);
    CHECK(noPeriod.error().problem == "there is no period column of that name.");
}

TEST_CASE("Typed cells read as text the way a delimited file writes them", "[intake][typed]")
{
    CHECK(typedCellText(TypedCell::ofNumber(1.0)) == "1");
    CHECK(typedCellText(TypedCell::ofNumber(0.1234)) == "0.1234");
    CHECK(typedCellText(TypedCell::ofNumber(-2.5e-7)) == "-2.5e-07");
    CHECK(typedCellText(TypedCell::ofDate(daysOf(2024, 2, 29))) == "2024-02-29");
    CHECK(typedCellText(TypedCell::ofDate(daysOf(1899, 12, 31))) == "1899-12-31");
    CHECK(typedCellText(TypedCell::missing()).empty());
    const std::vector<ValueLabel> labels{{1.0, "Readmitted"}};
    CHECK(typedCellText(TypedCell::ofNumber(1.0), &labels) == "Readmitted");
    CHECK(typedCellText(TypedCell::ofNumber(2.0), &labels) == "2");
}

TEST_CASE("Settings that mix sources are refused with what to do", "[intake][typed]")
{
    auto settings = settingsFor({"p"});
    settings.database = "sqlite:cohort.db";
    settings.query = "SELECT y, p FROM cohort";
    CHECK(runIntake(settings).error().problem == "both a cohort file and a database were given.");
    settings.cohortFile.clear();
    settings.query = "  ";
    CHECK(runIntake(settings).error().problem == "a database was given without a query.");
    settings.database.reset();
    settings.cohortFile = "cohort.csv";
    settings.query = "SELECT 1";
    CHECK(runIntake(settings).error().problem == "a query was given without a database.");
    settings.query.reset();
    settings.sheet = "Cohort";
    CHECK(runIntake(settings).error().problem == "a sheet was chosen but the cohort is not a spreadsheet (.xlsx).");
    settings.sheet.reset();
    settings.cohortFile = "cohort.DTA";
    settings.outcomesFile = "outcomes.csv";
    settings.idColumn = "id";
    CHECK(runIntake(settings).error().problem == "outcomes in a second file can be joined to a delimited text cohort only.");
}

TEST_CASE("A query's rows that leave nothing to analyse name the database", "[intake][typed]")
{
    // Every score a word: the rows are read, all excluded, and the analysis is impossible.
    MemoryTable table("sqlite:cohort.db", {{"y", {}}, {"p", {}}});
    for (std::size_t i = 1; i <= 3; ++i)
        table.addRow({MemoryTable::number(double(i % 2)), MemoryTable::text("high")}, i);
    auto settings = memorySettings();
    settings.cohortFile.clear();
    settings.database = "sqlite:cohort.db";
    settings.query = "SELECT y, p FROM cohort";
    const auto result = runIntake(settings, table);
    REQUIRE_FALSE(result);
    CHECK(result.error().kind == ErrorKind::ImpossibleAnalysis);
    CHECK(result.error().file == "sqlite:cohort.db");
    CHECK(result.error().message().starts_with("sqlite:cohort.db, column 'y': after exclusions 0 of 3 rows remain"));
}

TEST_CASE("A workbook's sheet chosen by number is recorded by name, and a column not on it names the other sheets", "[intake][typed]")
{
    // The sheets openpyxl 3.0.9 lists for the fixture (tests/data/spreadsheets/openpyxl_cohort.json).
    auto settings = memorySettings();
    settings.cohortFile = std::string(spreadsheetsDir) + "/openpyxl_cohort.xlsx";
    settings.outcomeColumn = "no such outcome";
    const auto missing = runIntake(settings);
    REQUIRE_FALSE(missing);
    CHECK(missing.error().remedy.find("This is sheet 'Cohort' of 3: 'Cohort', 'Notes' or '2'; choose another with --sheet") != std::string::npos);
    settings.sheet = "1";
    auto table = openXlsxTable(settings.cohortFile, settings.sheet);
    REQUIRE(table);
    CHECK((*table)->sheetName() == std::optional<std::string>("Cohort"));
    // A spreadsheet program allows no two sheets differing in case only: "notes" is 'Notes'.
    auto anyCase = openXlsxTable(settings.cohortFile, std::optional<std::string>("nOTES"));
    REQUIRE(anyCase);
    CHECK((*anyCase)->sheetName() == std::optional<std::string>("Notes"));
}

TEST_CASE("A query without ORDER BY is warned about: its rows may come back in another order", "[intake][typed]")
{
    auto run = [](const std::string& query) {
        MemoryTable table("query result (sqlite:cohort.db)", {{"y", {}}, {"p", {}}});
        table.addRow({MemoryTable::number(1), MemoryTable::number(0.8)}, 1);
        table.addRow({MemoryTable::number(0), MemoryTable::number(0.2)}, 2);
        auto settings = memorySettings();
        settings.cohortFile.clear();
        settings.database = "sqlite:cohort.db";
        settings.query = query;
        auto result = runIntake(settings, table);
        REQUIRE(result);
        return result->audit.warnings;
    };
    const auto unordered = run("SELECT y, p FROM cohort");
    REQUIRE(unordered.size() == 1);
    CHECK(unordered[0].starts_with("The query has no ORDER BY"));
    CHECK(run("SELECT y, p FROM cohort\n  Order\t By id").empty());
    CHECK(run("SELECT y, p FROM cohort ORDER BY id").empty());
}

TEST_CASE("Codes labelled as a recognised pair take the event from their labels", "[intake][typed]")
{
    // 1 = No, 2 = Yes: codes a delimited file would not recognise (an outside review's case).
    MemoryTable table("cohort.sav", {{"y", {{1.0, "No"}, {2.0, "Yes"}}}, {"p", {}}});
    table.addRow({MemoryTable::number(2), MemoryTable::number(0.7)}, 1);
    table.addRow({MemoryTable::number(1), MemoryTable::number(0.2)}, 2);
    table.addRow({MemoryTable::number(1), MemoryTable::number(0.3)}, 3);
    auto settings = memorySettings();
    settings.cohortFile = "cohort.sav";
    const auto result = runIntake(settings, table);
    REQUIRE(result);
    CHECK(result->cohort.outcome == std::vector<std::uint8_t>{1, 0, 0});
    CHECK(result->audit.eventValue == "2");
}

TEST_CASE("A query that returns no rows says so, not that a file has only a header", "[intake][typed]")
{
    struct EmptyResult final : MemoryTable {
        using MemoryTable::MemoryTable;
        std::string positionNoun() const override { return "row of the result"; }
    };
    EmptyResult table("query result (sqlite:cohort.db)", {{"y", {}}, {"p", {}}});
    auto settings = memorySettings();
    settings.cohortFile.clear();
    settings.database = "sqlite:cohort.db";
    settings.query = "SELECT y, p FROM cohort WHERE 0 ORDER BY y";
    const auto result = runIntake(settings, table);
    REQUIRE_FALSE(result);
    CHECK(result.error().problem == "the query returned no rows.");
}
