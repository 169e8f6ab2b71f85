#include "intake/single_file_intake.hpp"

#include "support/intake_test_support.hpp"
#include "support/temp_files.hpp"

#include <catch2/catch.hpp>

#include <filesystem>
#include <fstream>

using namespace plumbline;
using namespace plumbline::test;

namespace {

// Rows whose second half brings what a reader of that half alone numbers differently: quoted
// fields holding line breaks (so a guessed start can fall inside one), CRLF and LF line ends,
// blank lines, rows of the wrong width, missing ids, outcome spellings (and a third value, which
// the staging counts and the coding refuses later) and sites first seen late.
std::string splitCohort()
{
    std::string text = "id,y,p,site\r\n";
    for (int row = 0; text.size() < 24 * 1024; ++row) {
        const bool late = row > 300;
        const std::string id = row % 17 == 0 ? "" : "r" + std::to_string(row);
        const std::string outcome = row % 23 == 0 ? "NA" : late && row % 29 == 0 ? "maybe" : row % 3 == 0 ? (late && row % 2 ? "YES" : "yes") : (late ? "No" : "no");
        const std::string score = "0." + std::to_string(row % 89 + 10);
        const std::string site = late && row % 4 == 0 ? "late site " + std::to_string(row % 3) : "site " + std::to_string(row % 5);
        if (row % 7 == 0)
            text += id + "," + outcome + "," + score + ",\"" + site + "\nwith a second line, and a comma\"\r\n";
        else if (row % 19 == 0)
            text += id + "," + outcome + "\n\n"; // too few fields, then a blank line
        else
            text += id + "," + outcome + "," + score + "," + site + (row % 2 ? "\n" : "\r\n");
    }
    return text;
}

IntakeSettings splitSettings(const std::filesystem::path& path)
{
    IntakeSettings settings = settingsFor({"p"});
    settings.cohortFile = path.string();
    settings.groupColumns = {"site"};
    settings.idColumn = "id";
    return settings;
}

struct Staged {
    std::expected<StagedFile, InputError> file;
    ExclusionCounter exclusions;
    IntakeAudit audit;
};

Staged staged(const DelimitedTable& table, const IntakeSettings& settings, std::optional<std::size_t> splitNear)
{
    Staged out{std::unexpected(InputError{}), {}, {}};
    out.file = stageSingleFile(table, settings, out.exclusions, out.audit, splitNear);
    return out;
}

void checkSame(const Staged& two, const Staged& one)
{
    REQUIRE(two.file);
    const StagedRows& a = two.file->rows;
    const StagedRows& b = one.file->rows;
    // Compared as booleans: Catch would print million-element columns that differ.
    CHECK(bool(a.lines == b.lines));
    CHECK(bool(a.outcomeLines == b.outcomeLines));
    CHECK(bool(a.outcomeLevel == b.outcomeLevel));
    CHECK(bool(a.rawScores == b.rawScores));
    CHECK(bool(a.scoreStatus == b.scoreStatus));
    CHECK(bool(a.groupCodes == b.groupCodes));
    CHECK(a.groupLevels == b.groupLevels);
    CHECK(bool(a.ids == b.ids));
    const auto& levelsA = two.file->outcomeLevels.levels();
    const auto& levelsB = one.file->outcomeLevels.levels();
    REQUIRE(levelsA.size() == levelsB.size());
    for (std::size_t i = 0; i < levelsA.size(); ++i) {
        CHECK(levelsA[i].text == levelsB[i].text);
        CHECK(levelsA[i].count == levelsB[i].count);
        CHECK(levelsA[i].firstLine == levelsB[i].firstLine);
    }
    CHECK(two.audit.rowsRead == one.audit.rowsRead);
    CHECK(two.audit.blankLinesSkipped == one.audit.blankLinesSkipped);
    const auto talliesA = two.exclusions.tallies();
    const auto talliesB = one.exclusions.tallies();
    REQUIRE(talliesA.size() == talliesB.size());
    for (std::size_t i = 0; i < talliesA.size(); ++i) {
        CHECK(talliesA[i].reason == talliesB[i].reason);
        CHECK(talliesA[i].rows == talliesB[i].rows);
        CHECK(talliesA[i].firstLines == talliesB[i].firstLines);
    }
    CHECK(two.exclusions.total() == one.exclusions.total());
}

} // namespace

TEST_CASE("A file staged on two threads from any guessed start reads exactly as on one", "[intake][two threads]")
{
    const std::string bytes = splitCohort();
    const auto path = writtenFile("plumbline-two-thread-intake.csv", bytes);
    const IntakeSettings settings = splitSettings(path);
    for (const std::size_t block : {std::size_t{4096}, std::size_t{61}}) {
        auto table = DelimitedTable::open(*TextFile::load(path.string(), 1 << 20, block), std::nullopt);
        REQUIRE(table);
        const Staged one = staged(*table, settings, std::nullopt);
        REQUIRE(one.file);
        // The cohort has what the join must renumber: levels and sites first seen late, and
        // exclusions and blank lines on both sides of most splits.
        REQUIRE(one.file->outcomeLevels.levels().size() == 3);
        REQUIRE(one.exclusions.tallies().size() == 2);
        REQUIRE(one.audit.blankLinesSkipped > 0);
        // Every 37th byte: starts at line starts, inside quoted fields, between CR and LF, in
        // the header and past the last line.
        for (std::size_t near = 0; near < bytes.size() + 10; near += block == 61 ? 401 : 37) {
            INFO("split near byte " << near << ", blocks of " << block);
            checkSame(staged(*table, settings, near), one);
        }
    }
    std::filesystem::remove(path);
}

TEST_CASE("An error in either half is the one a single pass reports, on its own line", "[intake][two threads][errors]")
{
    const std::string good = splitCohort();
    for (const double where : {0.25, 0.75}) {
        const std::size_t cut = good.find("\nr", std::size_t(double(good.size()) * where)) + 1;
        const std::string bytes = good.substr(0, cut) + "r,yes,0.5,\"never closed\n" + std::string(2000, 'x') + "\n";
        const auto path = writtenFile("plumbline-two-thread-error.csv", bytes);
        const IntakeSettings settings = splitSettings(path);
        auto table = DelimitedTable::open(*TextFile::load(path.string(), 1 << 20, 4096), std::nullopt);
        REQUIRE(table);
        const Staged one = staged(*table, settings, std::nullopt);
        REQUIRE_FALSE(one.file);
        const std::size_t line = 1 + std::size_t(std::count(bytes.begin(), bytes.begin() + std::ptrdiff_t(cut), '\n'));
        REQUIRE(one.file.error().line == line);
        for (const std::size_t near : {bytes.size() / 4, bytes.size() / 2, cut - 3, cut + 5}) {
            INFO("quote opened at " << where << " of the file, split near byte " << near);
            const Staged two = staged(*table, settings, near);
            REQUIRE_FALSE(two.file);
            CHECK(two.file.error().message() == one.file.error().message());
            CHECK(two.file.error().line == line);
        }
        std::filesystem::remove(path);
    }
}

TEST_CASE("Large files are split in the middle and read like a single pass", "[intake][two threads]")
{
    // Above the size at which the intake uses two threads by itself.
    std::string bytes = "id,y,p,site\n";
    for (int row = 0; bytes.size() < twoThreadIntakeBytes + 4096; ++row)
        bytes += "r" + std::to_string(row) + "," + (row % 4 == 0 ? "1" : "0") + ",0." + std::to_string(row % 997 + 1) + ","
                 + (row > 900000 ? "new site" : "site") + "\n";
    const auto path = writtenFile("plumbline-two-thread-large.csv", bytes);
    IntakeSettings settings = splitSettings(path);
    settings.outcomeColumn = "y";
    auto table = DelimitedTable::open(*TextFile::load(path.string()), std::nullopt);
    REQUIRE(table);
    const Staged one = staged(*table, settings, std::nullopt);
    Staged two{std::unexpected(InputError{}), {}, {}};
    two.file = stageSingleFile(*table, settings, two.exclusions, two.audit);
    checkSame(two, one);
    std::filesystem::remove(path);
}
