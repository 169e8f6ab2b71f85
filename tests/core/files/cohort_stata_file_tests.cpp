#include "files/cohort_stata_file.hpp"
#include "intake/statistical_file_table.hpp"

#include <catch2/catch.hpp>

#include <cstdlib>
#include <ctime>
#include <filesystem>
#include <fstream>

using namespace plumbline;
namespace fs = std::filesystem;

namespace {

CohortCells smallCohort()
{
    CohortCells cells;
    cells.columns = {"id", "score", "risk", "outcome", "discharged"};
    cells.rows.push_back({CohortCell::ofText("A1"), CohortCell::ofNumber(0.25), CohortCell::ofNumber(0.6922), CohortCell::ofText("yes"), CohortCell::ofDate(19723)});
    cells.rows.push_back({CohortCell::ofText("A2"), CohortCell::ofText("#VALUE!"), CohortCell::missing(), CohortCell::missing(), CohortCell::ofDate(-1)});
    cells.rows.push_back({CohortCell::ofText("A3"), CohortCell::missing(), CohortCell::ofNumber(1.5), CohortCell::ofText("no"), CohortCell::missing()});
    return cells;
}

struct ReadCell {
    CellKind kind;
    double number;
    std::string text;
    std::int64_t day;
};

std::vector<std::vector<ReadCell>> readBack(const std::string& bytes, std::vector<std::string>& columns, std::vector<std::size_t>& positions)
{
    const fs::path path = fs::temp_directory_path() / "plumbline-cohort-stata.dta";
    std::ofstream(path, std::ios::binary) << bytes;
    auto table = openStatisticalFile(path.string());
    REQUIRE(table);
    for (const auto& column : (*table)->columns())
        columns.push_back(column.name);
    std::vector<std::vector<ReadCell>> read;
    REQUIRE((*table)->forEachRecord([&](std::span<const TypedCell> cells, std::size_t position) {
        positions.push_back(position);
        auto& row = read.emplace_back();
        for (const auto& cell : cells)
            row.push_back({cell.kind, cell.number, std::string(cell.text), cell.day});
        return true;
    }));
    fs::remove(path);
    return read;
}

} // namespace

TEST_CASE("A cohort Stata file reads back: doubles, %td dates, text columns and missing values", "[files][stata]")
{
    const auto bytes = cohortStataFileBytes(smallCohort(), "cohort.dta");
    REQUIRE(bytes);
    std::vector<std::string> columns;
    std::vector<std::size_t> positions;
    const auto read = readBack(*bytes, columns, positions);
    CHECK(columns == smallCohort().columns);
    CHECK(positions == std::vector<std::size_t>{1, 2, 3}); // observation numbers
    REQUIRE(read.size() == 3);
    // The score column holds a text cell, so it is a str column: its numbers are written in
    // their shortest exact form and its missing cell as "", read back as missing.
    CHECK(read[0][1].kind == CellKind::Text);
    CHECK(read[0][1].text == "0.25");
    CHECK(read[1][1].text == "#VALUE!");
    CHECK(read[2][1].kind == CellKind::Missing);
    // An all-number column stays numbers, the missing one Stata's `.`.
    CHECK(read[0][2].kind == CellKind::Number);
    CHECK(read[0][2].number == 0.6922);
    CHECK(read[1][2].kind == CellKind::Missing);
    CHECK(read[2][2].number == 1.5);
    // Text with a missing cell: "" read back as missing.
    CHECK(read[0][3].text == "yes");
    CHECK(read[1][3].kind == CellKind::Missing);
    // Dates are %td days, before and after 1970.
    CHECK(read[0][4].kind == CellKind::Date);
    CHECK(read[0][4].day == 19723);
    CHECK(read[1][4].day == -1);
    CHECK(read[2][4].kind == CellKind::Missing);
}

TEST_CASE("The same cells give the same Stata bytes in every time zone", "[files][stata]")
{
    const char* previous = std::getenv("TZ");
    const std::string saved = previous ? previous : "";
    ::setenv("TZ", "UTC", 1);
    ::tzset();
    const auto utc = cohortStataFileBytes(smallCohort(), "cohort.dta");
    ::setenv("TZ", "Pacific/Auckland", 1);
    ::tzset();
    const auto auckland = cohortStataFileBytes(smallCohort(), "cohort.dta");
    if (previous)
        ::setenv("TZ", saved.c_str(), 1);
    else
        ::unsetenv("TZ");
    ::tzset();
    REQUIRE(utc);
    REQUIRE(auckland);
    CHECK(*utc == *auckland);
    CHECK(utc->find("01 Jan 2024 00:00") != std::string::npos); // the fixed time stamp, as Stata writes it
}

TEST_CASE("Text longer than a Stata str column holds is an error naming the column", "[files][stata]")
{
    CohortCells cells;
    cells.columns = {"note"};
    cells.rows.push_back({CohortCell::ofText(std::string(2046, 'x'))});
    const auto bytes = cohortStataFileBytes(cells, "cohort.dta");
    REQUIRE_FALSE(bytes);
    CHECK(bytes.error().file == "cohort.dta");
    CHECK(bytes.error().column == "note");
    CHECK_FALSE(bytes.error().remedy.empty());
}

TEST_CASE("A column name Stata refuses is an error, not a damaged file", "[files][stata]")
{
    CohortCells cells;
    cells.rows.push_back({CohortCell::ofNumber(1.0)});
    for (const std::string& name : std::vector<std::string>{"two words", "1st", "if", "str12", std::string(33, 'a'), ""}) {
        INFO(name);
        cells.columns = {name};
        const auto bytes = cohortStataFileBytes(cells, "cohort.dta");
        REQUIRE_FALSE(bytes);
        CHECK(bytes.error().file == "cohort.dta");
        CHECK(bytes.error().column == name);
    }
    cells.columns = {std::string(32, 'a')};
    CHECK(cohortStataFileBytes(cells, "cohort.dta")); // 32 characters are allowed
}
