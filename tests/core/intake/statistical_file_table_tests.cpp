#include "intake/statistical_date_format.hpp"
#include "intake/statistical_file_table.hpp"

#include "intake/sha256.hpp"
#include "support/temp_files.hpp"
#include "test_paths.hpp"

#include <catch2/catch.hpp>
#include <nlohmann/json.hpp>

#include <filesystem>
#include <fstream>
#include <iterator>
#include <sstream>
#include <string>
#include <vector>

using namespace plumbline;

namespace {

std::string fixturePath(const std::string& name)
{
    return std::string(test::statisticalDataDir) + "/" + name;
}

std::string bytesOf(const std::string& path)
{
    std::ifstream in(path, std::ios::binary);
    return {std::istreambuf_iterator<char>(in), std::istreambuf_iterator<char>()};
}

// A visited cell in the JSON's terms: ["number", x], ["text", s], ["date", days], ["missing"].
nlohmann::json asJson(const TypedCell& cell)
{
    switch (cell.kind) {
    case CellKind::Number:
        return {"number", cell.number};
    case CellKind::Text:
        return {"text", std::string(cell.text)};
    case CellKind::Date:
        return {"date", cell.day};
    case CellKind::Missing:
        break;
    }
    return {"missing"};
}

struct Visited {
    std::vector<std::vector<nlohmann::json>> rows;
    std::vector<std::size_t> positions;
};

std::expected<Visited, InputError> visitAll(TypedTable& table)
{
    Visited visited;
    const auto done = table.forEachRecord([&](std::span<const TypedCell> cells, std::size_t position) {
        std::vector<nlohmann::json> row;
        for (const TypedCell& cell : cells)
            row.push_back(asJson(cell));
        visited.rows.push_back(std::move(row));
        visited.positions.push_back(position);
        return true;
    });
    if (!done)
        return std::unexpected(done.error());
    return visited;
}

// Opens and visits a file whole: the first InputError of either step, or the rows.
std::expected<Visited, InputError> readWhole(const std::string& path)
{
    auto table = openStatisticalFile(path);
    if (!table)
        return std::unexpected(table.error());
    return visitAll(**table);
}

} // namespace

// Check values: the JSON beside each fixture, written by tests/reference/make_statistical_fixtures.py
// from pandas 1.5.3 (read_stata for the .dta; read_sas for the .sas7bdat; read_stata of the
// source .dta, as stored, for the .xpt; read_csv of the source for the .sav, which pandas cannot
// read without pyreadstat). ctest re-runs that reading with --check, so the values are pandas'.
TEST_CASE("Every cell missing code label and date of each fixture equals pandas' reading", "[statistical]")
{
    for (const std::string name : {"cohort.dta", "cohort.sav", "cohort.sas7bdat", "cohort.xpt"}) {
        INFO(name);
        const auto expected = nlohmann::json::parse(bytesOf(fixturePath(name + ".json")));
        auto table = openStatisticalFile(fixturePath(name));
        REQUIRE(table);
        CHECK((*table)->sourceName() == fixturePath(name));

        const auto& columns = (*table)->columns();
        REQUIRE(columns.size() == expected["columns"].size());
        for (std::size_t c = 0; c < columns.size(); ++c) {
            CHECK(columns[c].name == expected["columns"][c].get<std::string>());
            const auto labels = expected["labels"].value(columns[c].name, nlohmann::json::array());
            REQUIRE(columns[c].labels.size() == labels.size());
            for (std::size_t l = 0; l < labels.size(); ++l) {
                CHECK(columns[c].labels[l].value == labels[l][0].get<double>()); // pandas 1.5.3 value_labels()
                CHECK(columns[c].labels[l].label == labels[l][1].get<std::string>());
            }
        }

        const auto visited = visitAll(**table);
        REQUIRE(visited);
        REQUIRE(visited->rows.size() == expected["rows"].size());
        for (std::size_t r = 0; r < visited->rows.size(); ++r) {
            CHECK(visited->positions[r] == r + 1);
            for (std::size_t c = 0; c < columns.size(); ++c) {
                INFO("row " << r + 1 << " column " << columns[c].name);
                const auto& want = expected["rows"][r][c];
                const auto& got = visited->rows[r][c];
                // Every missing code (., .a, .z, SPSS user-missing 9, an empty text) is Missing.
                if (want[0] == "missing")
                    CHECK(got == nlohmann::json{"missing"});
                else
                    CHECK(got == want); // pandas 1.5.3: numbers to the bit, texts, days since 1970
            }
        }
    }
}

TEST_CASE("The fixtures hold the cases the comparison is meant to cover", "[statistical]")
{
    // Guards the comparison above against fixtures that lost their hard cases.
    const auto dta = nlohmann::json::parse(bytesOf(fixturePath("cohort.dta.json")));
    const std::string text = dta.dump();
    CHECK(text.find(R"(["missing",".a"])") != std::string::npos);
    CHECK(text.find(R"(["missing",".z"])") != std::string::npos);
    CHECK(text.find(R"(["date",-1])") != std::string::npos); // 1959-12-31, before both epochs' 1960
    const auto sav = nlohmann::json::parse(bytesOf(fixturePath("cohort.sav.json")));
    CHECK(sav.dump().find(R"(["missing","user"])") != std::string::npos);
    CHECK(sav.dump().find(R"(["date",0])") != std::string::npos);
}

TEST_CASE("A visit stops when the visit says so and a second visit reads again from the start", "[statistical]")
{
    auto table = openStatisticalFile(fixturePath("cohort.dta"));
    REQUIRE(table);
    std::vector<std::size_t> positions;
    const auto done = (*table)->forEachRecord([&](std::span<const TypedCell>, std::size_t position) {
        positions.push_back(position);
        return position < 3;
    });
    REQUIRE(done);
    CHECK(positions == std::vector<std::size_t>{1, 2, 3});
    const auto again = visitAll(**table);
    REQUIRE(again);
    CHECK(again->rows.size() == 12);
}

TEST_CASE("The fingerprint is the SHA-256 of the file's bytes", "[statistical]")
{
    for (const std::string name : {"cohort.dta", "cohort.sav"}) {
        auto table = openStatisticalFile(fixturePath(name));
        REQUIRE(table);
        const auto fingerprint = (*table)->fingerprint();
        REQUIRE(fingerprint);
        CHECK(*fingerprint == sha256Hex(bytesOf(fixturePath(name))));
    }
}

TEST_CASE("Statistical files are told by their extension in any case", "[statistical]")
{
    for (const char* path : {"a.sas7bdat", "A.XPT", "dir.v2/b.Dta", "c.sav", "d.ZSAV"})
        CHECK(isStatisticalFile(path));
    for (const char* path : {"a.csv", "dta", "x.dta/y", "a.dta.csv", "a.sas7bcat", "a.por"})
        CHECK_FALSE(isStatisticalFile(path));
}

TEST_CASE("A truncated copy of each fixture is an InputError naming the file", "[statistical]")
{
    for (const std::string name : {"cohort.dta", "cohort.sav", "cohort.sas7bdat", "cohort.xpt"}) {
        const std::string bytes = bytesOf(fixturePath(name));
        REQUIRE(bytes.size() > 100);
        for (std::size_t keep : {std::size_t{0}, std::size_t{20}, bytes.size() / 4, bytes.size() / 2, bytes.size() * 3 / 4,
                                 bytes.size() - 81, bytes.size() - 9, bytes.size() - 1}) {
            INFO(name << " cut to " << keep << " bytes");
            const auto path = test::writtenFile("truncated-" + name, bytes.substr(0, keep)).string();
            const auto read = readWhole(path);
            REQUIRE_FALSE(read);
            CHECK(read.error().kind == ErrorKind::UnusableInput);
            CHECK(read.error().file == path);
            CHECK(read.error().message().find(path) == 0);
            CHECK_FALSE(read.error().remedy.empty());
        }
    }
}

TEST_CASE("A file cut inside its rows names the observation reached", "[statistical]")
{
    // cohort.xpt's 12 rows of 37 bytes (id 4, risk 8, died 3, two dates 8 each, ward 6) start at
    // byte 1600, after twenty 80-byte header records: a copy of 1690 bytes holds rows 1 and 2
    // whole and stops inside row 3.
    const std::string bytes = bytesOf(fixturePath("cohort.xpt"));
    REQUIRE(bytes.substr(1520, 25) == "HEADER RECORD*******OBSV8");
    const auto path = test::writtenFile("cut-rows.xpt", bytes.substr(0, 1690)).string();
    const auto read = readWhole(path);
    REQUIRE_FALSE(read);
    CHECK(read.error().line == 3);
    CHECK(read.error().message().find(", row 3: ") != std::string::npos);
    CHECK(read.error().problem.find("ends before its last row") != std::string::npos);
}

TEST_CASE("A text file named dta an empty file and a folder are refused with a message", "[statistical]")
{
    const auto text = readWhole(test::writtenFile("not-stata.dta", "y,p\n1,0.5\n").string());
    REQUIRE_FALSE(text);
    CHECK(text.error().problem.find("not a readable Stata data file") != std::string::npos);

    const auto empty = readWhole(test::writtenFile("empty.sav", "").string());
    REQUIRE_FALSE(empty);
    CHECK(empty.error().problem.find("empty") != std::string::npos);

    const auto folder = std::filesystem::temp_directory_path() / "a-folder.sas7bdat";
    std::filesystem::create_directories(folder);
    const auto notFile = readWhole(folder.string());
    REQUIRE_FALSE(notFile);
    CHECK(notFile.error().problem.find("not a regular file") != std::string::npos);

    const auto other = openStatisticalFile("cohort.csv");
    REQUIRE_FALSE(other);
    CHECK(other.error().problem.find("not a SAS, Stata or SPSS data file") != std::string::npos);
}

TEST_CASE("Latin-1 text in a file that names no encoding is refused at its row and column", "[statistical]")
{
    // SAS transport files carry no encoding: bytes that are not UTF-8 must not reach a cell.
    std::string bytes = bytesOf(fixturePath("cohort.xpt"));
    const auto at = bytes.find("north");
    REQUIRE(at != std::string::npos);
    bytes[at + 1] = '\xF6'; // "n\xF6rth": o with diaeresis in Latin-1
    const auto path = test::writtenFile("latin1.xpt", bytes).string();
    const auto read = readWhole(path);
    REQUIRE_FALSE(read);
    CHECK(read.error().line == 1);
    CHECK(read.error().column == "ward");
    CHECK(read.error().problem.find("not UTF-8") != std::string::npos);
    CHECK(read.error().message().find("\\xF6") != std::string::npos);
}

// Check values: Python 3.11 datetime (date(1970,1,1) - date(1960,1,1) = 3653 days,
// date(1970,1,1) - date(1582,10,14) = 141428 days); the ReadStat 1.1.8 tool writes 1970-01-01 into
// an SPSS DATE column as 12219379200 s.
TEST_CASE("Stored dates count from each package's epoch to days since 1970", "[statistical]")
{
    CHECK(daysSince1970(DateScale::DaysSince1960, 0.0) == -3653);
    CHECK(daysSince1970(DateScale::DaysSince1960, 3653.0) == 0);
    CHECK(daysSince1970(DateScale::DaysSince1960, -1.0) == -3654);
    CHECK(daysSince1970(DateScale::MillisecondsSince1960, -1000.0) == -3654); // 1959-12-31 23:59:59
    CHECK(daysSince1970(DateScale::MillisecondsSince1960, 3653.0 * 86'400'000 + 43'200'000) == 0);
    CHECK(daysSince1970(DateScale::SecondsSince1960, 3653.0 * 86'400 - 1) == -1);
    CHECK(daysSince1970(DateScale::SecondsSince1582, 12'219'379'200.0) == 0);
    CHECK(daysSince1970(DateScale::SecondsSince1582, 12'219'379'200.0 - 1) == -1);
    CHECK(daysSince1970(DateScale::SecondsSince1582, 0.0) == -141428);
    CHECK_FALSE(daysSince1970(DateScale::DaysSince1960, 1e300));
    CHECK_FALSE(daysSince1970(DateScale::DaysSince1960, std::numeric_limits<double>::infinity()));
    CHECK_FALSE(daysSince1970(DateScale::SecondsSince1582, -1e15));
    CHECK_FALSE(daysSince1970(DateScale::None, 0.0));
}

TEST_CASE("Date formats are read in the package that wrote the file", "[statistical]")
{
    using P = StatisticalPackage;
    CHECK(dateScaleOfFormat(P::Stata, "%td") == DateScale::DaysSince1960);
    CHECK(dateScaleOfFormat(P::Stata, "%-tdCCYY-NN-DD") == DateScale::DaysSince1960);
    CHECK(dateScaleOfFormat(P::Stata, "%d") == DateScale::DaysSince1960);
    CHECK(dateScaleOfFormat(P::Stata, "%tc") == DateScale::MillisecondsSince1960);
    CHECK(dateScaleOfFormat(P::Stata, "%tCDDmonCCYY_HH:MM:SS") == DateScale::MillisecondsSince1960);
    CHECK(dateScaleOfFormat(P::Stata, "%tm") == DateScale::None); // months, not days
    CHECK(dateScaleOfFormat(P::Stata, "%9.0g") == DateScale::None);
    CHECK(dateScaleOfFormat(P::Sas, "DATE9.") == DateScale::DaysSince1960);
    CHECK(dateScaleOfFormat(P::Sas, "mmddyy10") == DateScale::DaysSince1960);
    CHECK(dateScaleOfFormat(P::Sas, "YYMMDD") == DateScale::DaysSince1960);
    CHECK(dateScaleOfFormat(P::Sas, "E8601DA") == DateScale::DaysSince1960);
    CHECK(dateScaleOfFormat(P::Sas, "DATETIME20.") == DateScale::SecondsSince1960);
    CHECK(dateScaleOfFormat(P::Sas, "BEST12.") == DateScale::None);
    CHECK(dateScaleOfFormat(P::Sas, "") == DateScale::None);
    CHECK(dateScaleOfFormat(P::Sas, "%td") == DateScale::None); // a Stata format means nothing to SAS
    CHECK(dateScaleOfFormat(P::Spss, "DATE11") == DateScale::SecondsSince1582);
    CHECK(dateScaleOfFormat(P::Spss, "ADATE10") == DateScale::SecondsSince1582);
    CHECK(dateScaleOfFormat(P::Spss, "DATETIME20") == DateScale::SecondsSince1582);
    CHECK(dateScaleOfFormat(P::Spss, "DTIME") == DateScale::None); // a duration
    CHECK(dateScaleOfFormat(P::Spss, "F8.2") == DateScale::None);
}

// Check value: SAS technical report TS-140 (the transport format) stores a missing value as '.',
// '_' or a letter A to Z followed by zero bytes; each of SAS's missing codes is Missing.
TEST_CASE("SAS special missing codes in a transport file are Missing cells", "[statistical]")
{
    std::string bytes = bytesOf(fixturePath("cohort.xpt"));
    // Row 3's risk (rows of 37 bytes from byte 1600, risk after the 4-byte id) holds '.'.
    constexpr std::size_t risk3 = 1600 + 2 * 37 + 4;
    REQUIRE(bytes.substr(risk3, 8) == std::string(".\0\0\0\0\0\0\0", 8));
    for (const char code : {'A', 'Z', '_'}) {
        INFO("code ." << code);
        bytes[risk3] = code;
        const auto read = readWhole(test::writtenFile("special-missing.xpt", bytes).string());
        REQUIRE(read);
        CHECK(read->rows[2][1] == nlohmann::json{"missing"});
        CHECK(read->rows[1][1] == nlohmann::json{"number", 0.12}); // its neighbours stay numbers
        CHECK(read->rows[3][1] == nlohmann::json{"number", 0.123456789012345});
    }
}
