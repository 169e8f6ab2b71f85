#include "atomic_file.hpp"

#include <catch2/catch.hpp>

#include <filesystem>
#include <fstream>
#include <sstream>

using plumbline::writeFileAtomically;
namespace fs = std::filesystem;

namespace {
std::string slurp(const fs::path& path)
{
    std::ifstream in(path, std::ios::binary);
    std::stringstream buffer;
    buffer << in.rdbuf();
    return buffer.str();
}
} // namespace

TEST_CASE("Files are written whole and replace the old content", "[atomic]")
{
    const fs::path dir = fs::temp_directory_path() / "plumbline-atomic-test";
    fs::create_directories(dir);
    const fs::path target = dir / "out.json";
    REQUIRE(writeFileAtomically(target.string(), "first"));
    REQUIRE(writeFileAtomically(target.string(), "second"));
    CHECK(slurp(target) == "second");
    std::size_t entries = 0;
    for ([[maybe_unused]] const auto& entry : fs::directory_iterator(dir))
        ++entries;
    CHECK(entries == 1); // no temporary left behind
    fs::remove_all(dir);
}

TEST_CASE("A failed write leaves the old file untouched and says why", "[atomic]")
{
    const fs::path dir = fs::temp_directory_path() / "plumbline-atomic-fail";
    fs::create_directories(dir / "out.json"); // a folder where the file should go
    const auto result = writeFileAtomically((dir / "out.json").string(), "data");
    REQUIRE_FALSE(result);
    CHECK_FALSE(result.error().problem.empty());
    CHECK(fs::is_directory(dir / "out.json"));
    std::size_t entries = 0;
    for ([[maybe_unused]] const auto& entry : fs::directory_iterator(dir))
        ++entries;
    CHECK(entries == 1);
    fs::remove_all(dir);
    CHECK_FALSE(writeFileAtomically("/nonexistent-dir/plumbline/out.json", "x"));
}
