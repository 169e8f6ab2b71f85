#include "text_file.hpp"

#include <catch2/catch.hpp>

using plumbline::TextFile;

TEST_CASE("A UTF-8 byte-order mark is skipped in the text but kept in the bytes", "[textfile]")
{
    const auto file = TextFile::fromBytes("f.csv", "\xEF\xBB\xBFy,p\n1,0.5\n");
    REQUIRE(file);
    CHECK(file->text().substr(0, 3) == "y,p");
    CHECK(file->sizeInBytes() == 13);
}

TEST_CASE("UTF-16 binary and empty files are refused with a message naming the file", "[textfile]")
{
    const auto utf16 = TextFile::fromBytes("u.csv", std::string("\xFF\xFEy\0,\0", 6));
    REQUIRE_FALSE(utf16);
    CHECK(utf16.error().message().find("u.csv") == 0);
    CHECK(utf16.error().message().find("UTF-16") != std::string::npos);

    const auto binary = TextFile::fromBytes("b.csv", std::string("y,p\n1,\0", 7));
    REQUIRE_FALSE(binary);
    CHECK(binary.error().line == 2);

    const auto empty = TextFile::fromBytes("e.csv", "\n\r\n  ");
    REQUIRE_FALSE(empty);
    CHECK(empty.error().problem.find("empty") != std::string::npos);
}

TEST_CASE("The first byte that is not UTF-8 is located by offset and line", "[textfile]")
{
    // 0xE9 is 'é' in Latin-1 / Windows-1252 and never valid alone in UTF-8 (RFC 3629 §4).
    const auto file = TextFile::fromBytes("l.csv", "h,y\nok,1\nZ\xE9rich,0\n");
    REQUIRE(file);
    const auto bad = file->firstInvalidUtf8();
    REQUIRE(bad);
    CHECK(*bad == 10);
    CHECK(file->lineOfOffset(*bad) == 3);
    const auto good = TextFile::fromBytes("g.csv", "h,y\nZ\xC3\xA9rich,0\n\xE2\x82\xAC,1\n");
    CHECK_FALSE(good->firstInvalidUtf8());
}

TEST_CASE("A missing file is refused with the path and the system's reason", "[textfile]")
{
    const auto file = TextFile::load("/nonexistent/plumbline/cohort.csv");
    REQUIRE_FALSE(file);
    CHECK(file.error().message().find("/nonexistent/plumbline/cohort.csv") == 0);
    CHECK(file.error().problem.find("No such file") != std::string::npos);
}
