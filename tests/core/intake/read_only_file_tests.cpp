#include "intake/read_only_file.hpp"

#include <catch2/catch.hpp>

#include <filesystem>
#include <fstream>
#include <string>

using plumbline::ReadOnlyFile;

TEST_CASE("A file is read at any offset and short only at its end", "[readonlyfile]")
{
    std::string bytes;
    for (int i = 0; i < 3 * 4096 + 123; ++i)
        bytes += static_cast<char>('a' + (i / 4096 + i) % 26);
    const auto path = std::filesystem::temp_directory_path() / "plumbline-read-only-file-test.bin";
    std::ofstream(path, std::ios::binary) << bytes;
    auto file = ReadOnlyFile::open(path.string());
    REQUIRE(file);
    std::string into(5000, '\0');
    CHECK(file->readAt(4000, into.data(), into.size()).value() == 5000);
    CHECK(into == bytes.substr(4000, 5000));
    CHECK(file->readAt(bytes.size() - 10, into.data(), into.size()).value() == 10);
    CHECK(into.substr(0, 10) == bytes.substr(bytes.size() - 10));
    CHECK(file->readAt(bytes.size() + 10, into.data(), into.size()).value() == 0);
    const ReadOnlyFile moved(std::move(*file));
    CHECK(moved.readAt(0, into.data(), 3).value() == 3);
    CHECK(file->descriptor() == -1);
    std::filesystem::remove(path);
    const auto missing = ReadOnlyFile::open("/nonexistent/plumbline/file.csv");
    REQUIRE_FALSE(missing);
    CHECK(missing.error().find("No such file") != std::string::npos);
}
