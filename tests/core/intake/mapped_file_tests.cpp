#include "intake/mapped_file.hpp"

#include <catch2/catch.hpp>

#include <cstdio>
#include <filesystem>
#include <fstream>
#include <string>

#include <fcntl.h>
#include <unistd.h>

using plumbline::MappedFile;

TEST_CASE("Released pages of a mapped file read back unchanged", "[mappedfile]")
{
    // Several pages, with a different byte on each, so a page read back from the wrong place shows.
    std::string bytes;
    for (int i = 0; i < 5 * 4096 + 123; ++i)
        bytes += static_cast<char>('a' + (i / 4096 + i) % 26);
    const auto path = std::filesystem::temp_directory_path() / "plumbline-mapped-file-test.bin";
    std::ofstream(path, std::ios::binary) << bytes;
    const int descriptor = ::open(path.c_str(), O_RDONLY);
    REQUIRE(descriptor >= 0);
    auto mapped = MappedFile::map(descriptor, bytes.size());
    ::close(descriptor); // the mapping keeps the file
    REQUIRE(mapped);
    CHECK(mapped->view() == bytes);
    // Ranges that start and end inside pages, the whole file, and beyond its end.
    mapped->release(100, 3 * 4096 + 5);
    mapped->release(3 * 4096 + 5, 4 * 4096 + 17);
    CHECK(mapped->view() == bytes);
    mapped->release(0, bytes.size() + 10000);
    CHECK(mapped->view() == bytes);
    const MappedFile moved(std::move(*mapped));
    CHECK(moved.view() == bytes);
    CHECK(mapped->view().empty());
    std::filesystem::remove(path);
}
