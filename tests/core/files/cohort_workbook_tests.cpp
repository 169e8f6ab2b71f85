#include "files/cohort_workbook.hpp"
#include "intake/xlsx_table.hpp"

#include <catch2/catch.hpp>

#include <filesystem>
#include <fstream>
#include <sstream>

using namespace plumbline;
namespace fs = std::filesystem;

namespace {

CohortCells smallCohort()
{
    CohortCells cells;
    cells.columns = {"id", "score", "outcome", "discharged"};
    cells.rows.push_back({CohortCell::ofText("A1"), CohortCell::ofNumber(0.6922), CohortCell::ofText("yes"), CohortCell::ofDate(19723)});
    cells.rows.push_back({CohortCell::ofText("A2"), CohortCell::ofText("#VALUE!"), CohortCell::missing(), CohortCell::ofDate(-1)});
    cells.rows.push_back({CohortCell::ofText("=1+1"), CohortCell::missing(), CohortCell::ofText("no"), CohortCell::missing()});
    return cells;
}

std::string bytesOf(const fs::path& path)
{
    std::ifstream in(path, std::ios::binary);
    std::ostringstream bytes;
    bytes << in.rdbuf();
    return bytes.str();
}

struct ReadCell {
    CellKind kind;
    double number;
    std::string text;
    std::int64_t day;
    std::size_t position;
};

} // namespace

TEST_CASE("A cohort workbook reads back cell for cell: numbers, text, dates and empty cells", "[files][xlsx]")
{
    const fs::path dir = fs::temp_directory_path() / "plumbline-cohort-workbook";
    fs::create_directories(dir);
    const std::string path = (dir / "cohort.xlsx").string();
    REQUIRE(writeCohortWorkbook(smallCohort(), path));
    const auto names = xlsxSheetNames(path);
    REQUIRE(names);
    CHECK(*names == std::vector<std::string>{"Cohort"});
    auto table = openXlsxTable(path, std::nullopt);
    REQUIRE(table);
    std::vector<std::string> columns;
    for (const auto& column : (*table)->columns())
        columns.push_back(column.name);
    CHECK(columns == smallCohort().columns);
    std::vector<std::vector<ReadCell>> read;
    REQUIRE((*table)->forEachRecord([&](std::span<const TypedCell> cells, std::size_t position) {
        auto& row = read.emplace_back();
        for (const auto& cell : cells)
            row.push_back({cell.kind, cell.number, std::string(cell.text), cell.day, position});
        return true;
    }));
    const CohortCells expected = smallCohort();
    REQUIRE(read.size() == expected.rows.size());
    for (std::size_t r = 0; r < read.size(); ++r) {
        REQUIRE(read[r].size() == expected.rows[r].size());
        for (std::size_t c = 0; c < read[r].size(); ++c) {
            INFO("row " << r << ", column " << c);
            const CohortCell& want = expected.rows[r][c];
            CHECK(read[r][c].position == r + 2); // the header is sheet row 1
            CHECK(read[r][c].kind == want.kind);
            if (want.kind == CellKind::Number)
                CHECK(read[r][c].number == want.number); // the double itself, not a rounded text
            if (want.kind == CellKind::Text)
                CHECK(read[r][c].text == want.text); // "=1+1" stays text, no formula
            if (want.kind == CellKind::Date)
                CHECK(read[r][c].day == want.day);
        }
    }
    fs::remove_all(dir);
}

TEST_CASE("The same cells give the same workbook bytes, and no temporary file stays behind", "[files][xlsx]")
{
    const fs::path dir = fs::temp_directory_path() / "plumbline-cohort-workbook-bytes";
    fs::create_directories(dir);
    REQUIRE(writeCohortWorkbook(smallCohort(), (dir / "a.xlsx").string()));
    REQUIRE(writeCohortWorkbook(smallCohort(), (dir / "b.xlsx").string()));
    CHECK(bytesOf(dir / "a.xlsx") == bytesOf(dir / "b.xlsx"));
    CHECK(std::distance(fs::directory_iterator(dir), fs::directory_iterator()) == 2);
    fs::remove_all(dir);
}

TEST_CASE("More records than a worksheet holds are refused before anything is written", "[files][xlsx]")
{
    const fs::path dir = fs::temp_directory_path() / "plumbline-cohort-workbook-limit";
    fs::create_directories(dir);
    CohortCells cells;
    cells.columns = {"id"};
    cells.rows.resize(workbookMaxRecords + 1);
    const std::string path = (dir / "big.xlsx").string();
    const auto written = writeCohortWorkbook(cells, path);
    REQUIRE_FALSE(written);
    CHECK(written.error().file == path);
    CHECK(written.error().problem.find("1048575") != std::string::npos);
    CHECK_FALSE(written.error().remedy.empty());
    CHECK(fs::is_empty(dir));
    fs::remove_all(dir);
}

TEST_CASE("A workbook that cannot be written is an error naming the path", "[files][xlsx]")
{
    const std::string path = (fs::temp_directory_path() / "plumbline-no-such-folder" / "cohort.xlsx").string();
    const auto written = writeCohortWorkbook(smallCohort(), path);
    REQUIRE_FALSE(written);
    CHECK(written.error().file == path);
    CHECK_FALSE(written.error().remedy.empty());
}
