#include "intake/text_file.hpp"

#include "intake/sha256.hpp"
#include "support/temp_files.hpp"

#include <catch2/catch.hpp>

#include <algorithm>
#include <cctype>
#include <filesystem>
#include <fstream>
#include <sys/stat.h>

using plumbline::TextFile;
using plumbline::test::writtenFile;

TEST_CASE("A UTF-8 byte-order mark is skipped in the text but kept in the bytes", "[textfile]")
{
    const auto file = TextFile::fromBytes("f.csv", "\xEF\xBB\xBFy,p\n1,0.5\n");
    REQUIRE(file);
    CHECK(file->readText(0, 3) == "y,p");
    CHECK(file->sizeInBytes() == 13);
    CHECK(file->textSize() == 10);
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
    REQUIRE(*bad);
    CHECK(**bad == 10);
    CHECK(file->positionOf(**bad)->line == 3);
    CHECK(file->positionOf(**bad)->lineStart == 9);
    const auto good = TextFile::fromBytes("g.csv", "h,y\nZ\xC3\xA9rich,0\n\xE2\x82\xAC,1\n");
    CHECK(good->firstInvalidUtf8().value() == std::nullopt);
}

TEST_CASE("A missing file is refused with the path and the system's reason", "[textfile]")
{
    const auto file = TextFile::load("/nonexistent/plumbline/cohort.csv");
    REQUIRE_FALSE(file);
    CHECK(file.error().message().find("/nonexistent/plumbline/cohort.csv") == 0);
    CHECK(file.error().problem.find("No such file") != std::string::npos);
}

TEST_CASE("Only regular files are read and a folder a pipe or a device is named as such", "[textfile]")
{
    const auto folder = TextFile::load(std::filesystem::temp_directory_path().string());
    REQUIRE_FALSE(folder);
    CHECK(folder.error().problem.find("folder") != std::string::npos);
    // /dev/zero never ends: refused before a single byte is read.
    const auto device = TextFile::load("/dev/zero");
    REQUIRE_FALSE(device);
    CHECK(device.error().problem.find("not a regular file") != std::string::npos);
    // A FIFO would block at open(); refused without opening it.
    const auto fifo = std::filesystem::temp_directory_path() / "plumbline-test-fifo";
    std::filesystem::remove(fifo);
    REQUIRE(::mkfifo(fifo.c_str(), 0600) == 0);
    const auto pipe = TextFile::load(fifo.string());
    REQUIRE_FALSE(pipe);
    CHECK(pipe.error().problem.find("not a regular file") != std::string::npos);
    std::filesystem::remove(fifo);
}

TEST_CASE("Reading stops at the first line longer than the limit", "[textfile]")
{
    const auto path = std::filesystem::temp_directory_path() / "plumbline-long-line.csv";
    {
        std::ofstream out(path, std::ios::binary);
        out << "y,p\n1,0.5\n";
        out << std::string(3 << 20, 'x'); // 3 MB without a line break on line 3
    }
    const auto refused = TextFile::load(path.string(), 1 << 20);
    REQUIRE_FALSE(refused);
    CHECK(refused.error().line == 3);
    CHECK(refused.error().problem.find("longer than 1048576 bytes") != std::string::npos);
    CHECK(refused.error().remedy.find("--max-line-length") != std::string::npos);
    CHECK(TextFile::load(path.string(), 4 << 20).has_value()); // a higher limit reads it
    std::filesystem::remove(path);
}

TEST_CASE("UTF-16 without a byte-order mark is recognised and named", "[textfile]")
{
    std::string utf16le;
    for (const char c : std::string("readmitted,score\n1,0.25\n0,0.5\n")) {
        utf16le.push_back(c);
        utf16le.push_back('\0');
    }
    const auto refused = TextFile::fromBytes("w.csv", utf16le);
    REQUIRE_FALSE(refused);
    CHECK(refused.error().problem.find("UTF-16") != std::string::npos);
    CHECK(refused.error().remedy.find("iconv") != std::string::npos);
    // Other binary data is still "binary data".
    const auto binary = TextFile::fromBytes("b.csv", std::string("y,p\n1,0.5\n\0\x01\x02\x03\x04\x05\x06\x07\x08\x09", 19));
    REQUIRE_FALSE(binary);
    CHECK(binary.error().problem.find("binary") != std::string::npos);
}

namespace {

// A cohort of several 4 KiB pages whose lines end in CRLF and hold two- and three-byte UTF-8
// characters, so that block and page boundaries fall inside characters and between CR and LF.
std::string pagesOfText()
{
    std::string text = "\xEF\xBB\xBFid,y,p,site\r\n";
    for (int row = 0; text.size() < 9 * 4096; ++row) {
        text += 'r';
        text += std::to_string(row) + ',' + std::to_string(row % 2) + ",0." + std::to_string(row % 97 + 1);
        text += row % 3 == 0 ? ",Z\xC3\xBCrich\r\n" : ",\xE2\x82\xAC" "ward\r\n";
    }
    return text;
}

} // namespace

TEST_CASE("A file read in tiny blocks is fingerprinted and checked like the same bytes in memory", "[textfile][blocks]")
{
    const std::string bytes = pagesOfText();
    const auto path = writtenFile("plumbline-blocks.csv", bytes);
    for (const std::size_t block : {std::size_t{1}, std::size_t{7}, std::size_t{4096}, plumbline::defaultBlockBytes}) {
        const auto file = TextFile::load(path.string(), 1 << 20, block);
        REQUIRE(file);
        CHECK(file->fingerprint() == plumbline::sha256Hex(bytes));
        CHECK(file->firstInvalidUtf8().value() == std::nullopt);
        CHECK(file->sizeInBytes() == bytes.size());
        CHECK(file->readText(0, file->textSize()) == bytes.substr(3));
        CHECK(file->readText(5000, 5100) == bytes.substr(5003, 100));
        CHECK(file->positionOf(file->textSize())->line == 1 + std::size_t(std::count(bytes.begin(), bytes.end(), '\n')));
        CHECK(file->positionOf(file->textSize())->lineStart == bytes.rfind('\n') + 1 - 3);
    }
    std::filesystem::remove(path);
}

TEST_CASE("A bad byte a NUL or a long line in a later block is reported on its own line", "[textfile][blocks]")
{
    const std::string good = pagesOfText();
    // An ASCII letter or digit inside the eighth page, several blocks in, between ASCII neighbours.
    std::size_t late = 7 * 4096 + 1;
    const auto plain = [&](std::size_t i) { return std::isalnum(static_cast<unsigned char>(good[i])) != 0; };
    while (!(plain(late - 1) && plain(late) && plain(late + 1)))
        ++late;
    const std::size_t lineOfLate = 1 + std::size_t(std::count(good.begin(), good.begin() + std::ptrdiff_t(late), '\n'));
    for (const std::size_t block : {std::size_t{1}, std::size_t{7}, std::size_t{4096}}) {
        std::string latin1 = good;
        latin1[late] = '\xE9';
        const auto latin1Path = writtenFile("plumbline-blocks-latin1.csv", latin1);
        const auto fromDisk = TextFile::load(latin1Path.string(), 1 << 20, block);
        const auto inMemory = TextFile::fromBytes("m.csv", latin1);
        REQUIRE(fromDisk);
        REQUIRE(inMemory);
        REQUIRE(fromDisk->firstInvalidUtf8().value_or(std::nullopt));
        CHECK(fromDisk->firstInvalidUtf8().value() == inMemory->firstInvalidUtf8().value());
        CHECK(**fromDisk->firstInvalidUtf8() == late - 3); // an offset into the text, after the mark
        CHECK(fromDisk->positionOf(**fromDisk->firstInvalidUtf8())->line == lineOfLate);

        std::string nul = good;
        nul[late] = '\0';
        const auto nulPath = writtenFile("plumbline-blocks-nul.csv", nul);
        const auto binary = TextFile::load(nulPath.string(), 1 << 20, block);
        REQUIRE_FALSE(binary);
        CHECK(binary.error().line == lineOfLate);

        std::string longLine = good.substr(0, late) + std::string(5000, 'x') + good.substr(late);
        const auto longPath = writtenFile("plumbline-blocks-long.csv", longLine);
        const auto refused = TextFile::load(longPath.string(), 4096, block);
        REQUIRE_FALSE(refused);
        CHECK(refused.error().line == lineOfLate);
        CHECK(TextFile::load(longPath.string(), 8192, block).has_value());
        std::filesystem::remove(latin1Path);
        std::filesystem::remove(nulPath);
        std::filesystem::remove(longPath);
    }
}
