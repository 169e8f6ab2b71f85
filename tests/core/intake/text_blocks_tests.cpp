#include "intake/text_blocks.hpp"

#include <catch2/catch.hpp>

#include <filesystem>
#include <fstream>
#include <string>

using plumbline::ReadOnlyFile;
using plumbline::TextBlocks;

namespace {

std::filesystem::path writtenFile(const std::string& name, const std::string& bytes)
{
    const auto path = std::filesystem::temp_directory_path() / name;
    std::ofstream(path, std::ios::binary) << bytes;
    return path;
}

} // namespace

TEST_CASE("Bytes in memory are one block viewed without a copy", "[textblocks]")
{
    const std::string bytes = "id,y\n1,0\n";
    TextBlocks blocks(bytes);
    CHECK(blocks.atEnd());
    CHECK(blocks.view().data() == bytes.data());
    blocks.consume(5);
    CHECK(blocks.view() == "1,0\n");
    CHECK(blocks.offset() == 5);
    CHECK_FALSE(blocks.readMore().value());
}

TEST_CASE("What a pass has not consumed stays in view before the next block", "[textblocks]")
{
    const std::string bytes = "0123456789abcdefghij";
    const auto path = writtenFile("plumbline-text-blocks.bin", bytes);
    auto file = ReadOnlyFile::open(path.string());
    REQUIRE(file);
    TextBlocks blocks(*file, 2, bytes.size(), 4);
    CHECK(blocks.view().empty());
    REQUIRE(blocks.readMore().value());
    CHECK(blocks.view() == "2345");
    blocks.consume(3);
    REQUIRE(blocks.readMore().value());
    CHECK(blocks.view() == "5678"); // the kept byte, then as much as the buffer holds
    CHECK(blocks.offset() == 3);
    // A tail that fills the buffer makes it grow, so a record longer than a block is read whole.
    REQUIRE(blocks.readMore().value());
    CHECK(blocks.view() == "56789abc");
    blocks.consume(8);
    std::string rest;
    while (blocks.readMore().value()) {
        rest += blocks.view();
        blocks.consume(blocks.view().size());
    }
    CHECK(rest == "defghij");
    CHECK(blocks.atEnd());
    CHECK(blocks.offset() == bytes.size() - 2);
    std::filesystem::remove(path);
}

TEST_CASE("A file shorter than when it was opened is an error of the read", "[textblocks]")
{
    const std::string bytes(10000, 'x');
    const auto path = writtenFile("plumbline-text-blocks-cut.bin", bytes);
    auto file = ReadOnlyFile::open(path.string());
    REQUIRE(file);
    TextBlocks blocks(*file, 0, bytes.size(), 4096);
    REQUIRE(blocks.readMore().value());
    std::filesystem::resize_file(path, 5000);
    blocks.consume(4096);
    const auto cut = blocks.readMore();
    REQUIRE_FALSE(cut);
    CHECK(cut.error().find("became shorter") != std::string::npos);
    std::filesystem::remove(path);
}
