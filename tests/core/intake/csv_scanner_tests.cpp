#include "intake/csv_scanner.hpp"

#include <catch2/catch.hpp>

#include <string>
#include <vector>

using plumbline::CsvScanner;

namespace {
std::vector<std::vector<std::string>> allRecords(std::string_view text, char delimiter = ',')
{
    CsvScanner scanner(text, delimiter);
    std::vector<std::vector<std::string>> out;
    while (scanner.next())
        out.emplace_back(scanner.fields().begin(), scanner.fields().end());
    return out;
}
} // namespace

// Examples of RFC 4180 ("Common Format and MIME Type for CSV Files", IETF 2005), section 2.
TEST_CASE("Records end at CRLF and the last record may lack a line break (RFC 4180 §2 rules 1-2)", "[csv]")
{
    const auto records = allRecords("aaa,bbb,ccc\r\nzzz,yyy,xxx");
    REQUIRE(records.size() == 2);
    CHECK(records[0] == std::vector<std::string>{"aaa", "bbb", "ccc"});
    CHECK(records[1] == std::vector<std::string>{"zzz", "yyy", "xxx"});
}

TEST_CASE("Quoted fields may hold line breaks delimiters and doubled quotes (RFC 4180 §2 rules 5-7)", "[csv]")
{
    const auto records = allRecords("\"aaa\",\"b\r\nbb\",\"ccc\"\r\n\"aaa\",\"b\"\"bb\",\"c,cc\"\r\n");
    REQUIRE(records.size() == 2);
    CHECK(records[0] == std::vector<std::string>{"aaa", "b\r\nbb", "ccc"});
    CHECK(records[1] == std::vector<std::string>{"aaa", "b\"bb", "c,cc"});
}

TEST_CASE("Each record reports the physical line it starts on across quoted line breaks", "[csv]")
{
    CsvScanner scanner("h1,h2\n\"multi\nline\",x\n\nlast,y\n", ',');
    REQUIRE(scanner.next());
    CHECK(scanner.line() == 1);
    REQUIRE(scanner.next());
    CHECK(scanner.line() == 2);
    CHECK(scanner.fields()[0] == "multi\nline");
    REQUIRE(scanner.next());
    CHECK(scanner.line() == 5);
    CHECK(scanner.fields()[0] == "last");
    CHECK_FALSE(scanner.next());
    CHECK(scanner.blankLinesSkipped() == 1);
}

TEST_CASE("Trailing blank lines and CR-only line ends are not records", "[csv]")
{
    const auto records = allRecords("a;b\r\n1;2\r\n\r\n\r\n", ';');
    CHECK(records.size() == 2);
}

TEST_CASE("Empty fields are kept including a trailing empty field", "[csv]")
{
    const auto records = allRecords("a,,c,\n");
    REQUIRE(records.size() == 1);
    CHECK(records[0] == std::vector<std::string>{"a", "", "c", ""});
}

TEST_CASE("Text after a closing quote is kept and flagged", "[csv]")
{
    CsvScanner scanner("\"ab\"c,d\n", ',');
    REQUIRE(scanner.next());
    CHECK(scanner.strayQuote());
    CHECK(scanner.fields()[0] == "abc");
    CHECK(scanner.fields()[1] == "d");
}

TEST_CASE("A quote that never closes is reported with the field it opened in", "[csv]")
{
    CsvScanner scanner("a,b\n1,\"open\n2,3\n", ',');
    REQUIRE(scanner.next());
    REQUIRE(scanner.next());
    CHECK(scanner.unclosedQuote());
    CHECK(scanner.unclosedQuoteField() == 1);
    CHECK(scanner.line() == 2);
    CHECK_FALSE(scanner.next());
}

TEST_CASE("Tab and pipe delimiters split fields the same way", "[csv]")
{
    CHECK(allRecords("a\tb\n1\t2\n", '\t')[1] == std::vector<std::string>{"1", "2"});
    CHECK(allRecords("a|b\n1|\"x|y\"\n", '|')[1] == std::vector<std::string>{"1", "x|y"});
}
