#include "intake/record_reader.hpp"

#include "intake/text_file.hpp"
#include "support/temp_files.hpp"

#include <catch2/catch.hpp>

#include <filesystem>
#include <fstream>
#include <string>
#include <vector>

using namespace plumbline;
using namespace plumbline::test;

namespace {

// What a reader reports of each record, for comparing one read whole with one read in blocks.
struct SeenRecord {
    std::vector<std::string> fields;
    std::size_t line;
    bool strayQuote;
    bool unclosedQuote;
    bool operator==(const SeenRecord&) const = default;
};

template <typename Records>
std::vector<SeenRecord> seen(Records& records)
{
    std::vector<SeenRecord> out;
    while (records.next()) {
        const CsvScanner& s = [&]() -> const CsvScanner& {
            if constexpr (std::is_same_v<Records, CsvScanner>)
                return records;
            else
                return records.scanner();
        }();
        out.push_back({{s.fields().begin(), s.fields().end()}, s.line(), s.strayQuote(), s.unclosedQuote()});
    }
    return out;
}

// Every way a block's end can cut a record: inside a field, between CR and LF, inside a quoted
// field with a line break, between the two quotes of a doubled pair, right after a closing
// quote, inside text after a closing quote, inside a run of blank lines (CR-only and CRLF),
// and a last record without a line break.
const std::string trickyText = "id,note,y\r\n"
                               "1,\"two\r\nlines, and a comma\",0\r\n"
                               "\r\n\r\r\n\n"
                               "2,\"say \"\"hi\"\"\",1\n"
                               "3,\"closed\"tail,0\r"
                               "4,,1\r\n"
                               "\"5\",\"\",\"\"\r\n"
                               "6,last,1";

} // namespace

TEST_CASE("Records cut by every block end read exactly as the whole text", "[recordreader][blocks]")
{
    CsvScanner whole(trickyText, ',');
    const auto expected = seen(whole);
    REQUIRE(expected.size() == 7);
    REQUIRE(whole.blankLinesSkipped() == 4);
    const auto path = writtenFile("plumbline-record-reader.csv", trickyText);
    for (std::size_t block = 1; block <= trickyText.size() + 1; ++block) {
        INFO("block of " << block << " bytes");
        const auto file = TextFile::load(path.string(), 1 << 20, block);
        REQUIRE(file);
        RecordReader records(*file, ',');
        CHECK(seen(records) == expected);
        CHECK(records.scanner().blankLinesSkipped() == whole.blankLinesSkipped());
        CHECK(records.offset() == trickyText.size());
        CHECK_FALSE(records.readError());
    }
    std::filesystem::remove(path);
}

TEST_CASE("A quote left open is reported once the last block is read", "[recordreader][blocks]")
{
    const std::string text = "id,y\n1,\"open\n2,0\n3,1\n";
    CsvScanner whole(text, ',');
    const auto expected = seen(whole);
    REQUIRE(expected.back().unclosedQuote);
    const auto path = writtenFile("plumbline-record-reader-open.csv", text);
    for (const std::size_t block : {std::size_t{1}, std::size_t{3}, std::size_t{8}}) {
        const auto file = TextFile::load(path.string(), 1 << 20, block);
        REQUIRE(file);
        RecordReader records(*file, ',');
        CHECK(seen(records) == expected);
    }
    std::filesystem::remove(path);
}

TEST_CASE("A scanner over a block stops before a record the block may cut", "[csv][blocks]")
{
    CsvScanner scanner("a,b\nc,\"d", ',', false);
    REQUIRE(scanner.next());
    CHECK(scanner.fields()[1] == "b");
    CHECK_FALSE(scanner.next());
    CHECK(scanner.needsMore());
    CHECK(scanner.offset() == 4);
    scanner.resume("c,\"d\"\"e\"\r", false); // the CR's LF may follow
    CHECK_FALSE(scanner.next());
    CHECK(scanner.needsMore());
    scanner.resume("c,\"d\"\"e\"\r\n", true);
    REQUIRE(scanner.next());
    CHECK(scanner.fields()[1] == "d\"e");
    CHECK(scanner.line() == 2);
    CHECK_FALSE(scanner.next());
    CHECK_FALSE(scanner.needsMore());
}
