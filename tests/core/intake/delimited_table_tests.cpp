#include "intake/delimited_table.hpp"
#include "intake/sha256.hpp"

#include "support/intake_test_support.hpp"
#include "support/temp_files.hpp"

#include <catch2/catch.hpp>

#include <algorithm>
#include <filesystem>
#include <fstream>

using namespace plumbline;
using namespace plumbline::test;

namespace {

// Several 4 KiB pages of rows with quoted fields that hold line breaks and delimiters, CRLF line
// ends, blank lines, rows of the wrong width and multi-byte characters, so that the blocks the
// records are released in end inside quoted fields, between CR and LF and inside characters.
std::string messyCohort()
{
    std::string text = "\xEF\xBB\xBFid,y,p,site\r\n";
    for (int row = 0; text.size() < 12 * 4096; ++row) {
        const std::string id = std::to_string(row);
        const std::string outcome = std::to_string(row % 3 == 0 ? 1 : 0);
        const std::string score = std::to_string(row % 89 + 10);
        if (row % 5 == 0)
            text += "\"r" + id + "\nsecond line, with a comma\"," + outcome + ",0." + score + ",\"A \"\"quoted\"\" ward\"\r\n";
        else if (row % 11 == 0)
            text += "r" + id + "," + outcome + "\r\n\r\n"; // too few fields, then a blank line
        else
            text += "r" + id + "," + outcome + ",0." + score + (row % 2 ? ",Z\xC3\xBCrich\n" : ",\xE2\x82\xAC" "ward\r\n");
    }
    return text;
}

IntakeSettings groupedSettings(const std::filesystem::path& path)
{
    IntakeSettings settings = settingsFor({"p"});
    settings.cohortFile = path.string();
    settings.groupColumns = {"site"};
    return settings;
}

} // namespace

TEST_CASE("Records released in tiny blocks read exactly like the file held in memory", "[intake][blocks]")
{
    const std::string bytes = messyCohort();
    const auto path = writtenFile("plumbline-messy-blocks.csv", bytes);
    const IntakeSettings settings = groupedSettings(path);
    const auto expected = runIntake(settings, *TextFile::fromBytes(settings.cohortFile, bytes), std::nullopt);
    REQUIRE(expected);
    REQUIRE(expected->audit.blankLinesSkipped > 0);
    REQUIRE_FALSE(expected->audit.exclusions.empty());
    for (const std::size_t block : {std::size_t{1}, std::size_t{7}, std::size_t{4096}, defaultBlockBytes}) {
        const auto result = runIntake(settings, *TextFile::load(path.string(), 1 << 20, block), std::nullopt);
        REQUIRE(result);
        CHECK(result->cohort.outcome == expected->cohort.outcome);
        CHECK(result->cohort.models[0].values == expected->cohort.models[0].values);
        CHECK(result->cohort.sourceLines == expected->cohort.sourceLines);
        CHECK(result->cohort.groups[0].levels == expected->cohort.groups[0].levels);
        CHECK(result->cohort.groups[0].codes == expected->cohort.groups[0].codes);
        CHECK(result->audit.rowsRead == expected->audit.rowsRead);
        CHECK(result->audit.blankLinesSkipped == expected->audit.blankLinesSkipped);
        REQUIRE(result->audit.exclusions.size() == expected->audit.exclusions.size());
        for (std::size_t i = 0; i < result->audit.exclusions.size(); ++i)
            CHECK(result->audit.exclusions[i].firstLines == expected->audit.exclusions[i].firstLines);
        CHECK(result->inputs[0].sha256 == sha256Hex(bytes));
        CHECK(result->audit.balances());
    }
    std::filesystem::remove(path);
}

TEST_CASE("A quote left open in a later block is reported on its own line", "[intake][blocks][errors]")
{
    const std::string good = messyCohort();
    const std::size_t cut = good.find("\nr", 9 * 4096) + 1; // a record start in the tenth page
    const std::size_t line = 1 + std::size_t(std::count(good.begin(), good.begin() + std::ptrdiff_t(cut), '\n'));
    // Rows without quotes follow, so that nothing closes the quote.
    std::string bytes = good.substr(0, cut) + "r,1,0.5,\"never closed\n";
    for (int row = 0; row < 400; ++row) {
        bytes += 't';
        bytes += std::to_string(row) + ",0,0.25,plain\n";
    }
    const auto path = writtenFile("plumbline-open-quote-blocks.csv", bytes);
    const IntakeSettings settings = groupedSettings(path);
    const auto expected = runIntake(settings, *TextFile::fromBytes(settings.cohortFile, bytes), std::nullopt);
    REQUIRE_FALSE(expected);
    CHECK(expected.error().line == line);
    for (const std::size_t block : {std::size_t{1}, std::size_t{4096}}) {
        const auto result = runIntake(settings, *TextFile::load(path.string(), 1 << 20, block), std::nullopt);
        REQUIRE_FALSE(result);
        CHECK(result.error().message() == expected.error().message());
        CHECK(result.error().line == line);
        CHECK(result.error().column == "site");
    }
    std::filesystem::remove(path);
}

TEST_CASE("A file shortened by another program while it is read is an error and not a crash", "[intake][blocks][errors]")
{
    const std::string bytes = messyCohort();
    const auto path = writtenFile("plumbline-shortened-blocks.csv", bytes);
    const IntakeSettings settings = groupedSettings(path);
    for (const std::size_t cut : {bytes.size() / 2, std::size_t{0}}) {
        // Checked and opened whole; then cut before its records are read.
        auto file = TextFile::load(path.string(), 1 << 20, 4096);
        REQUIRE(file);
        std::filesystem::resize_file(path, cut);
        const auto result = runIntake(settings, std::move(*file), std::nullopt);
        REQUIRE_FALSE(result);
        CHECK(result.error().file == path.string());
        CHECK(result.error().problem.find("became shorter while it was read") != std::string::npos);
        CHECK(result.error().remedy.find("no other program is writing") != std::string::npos);
        std::ofstream(path, std::ios::binary) << bytes;
    }
    std::filesystem::remove(path);
}
