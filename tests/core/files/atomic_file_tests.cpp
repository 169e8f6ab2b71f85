#include "files/atomic_file.hpp"

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

TEST_CASE("An output that is an input is refused after symbolic and hard links", "[atomic]")
{
    const fs::path dir = fs::temp_directory_path() / "plumbline-atomic-inputs";
    fs::remove_all(dir);
    fs::create_directories(dir);
    const fs::path input = dir / "cohort.csv";
    std::ofstream(input) << "y,p\n1,0.5\n";
    fs::create_symlink(input, dir / "soft.csv");
    fs::create_hard_link(input, dir / "hard.csv");
    const std::vector<std::string> inputs{input.string()};
    for (const char* name : {"cohort.csv", "soft.csv", "hard.csv"}) {
        const auto refused = plumbline::refuseInputAsOutput((dir / name).string(), inputs, "--json");
        REQUIRE_FALSE(refused);
        CHECK(refused.error().problem.find("--json names an input") != std::string::npos);
    }
    CHECK(plumbline::refuseInputAsOutput((dir / "new.json").string(), inputs, "--json").has_value());
    CHECK(slurp(input) == "y,p\n1,0.5\n");
    fs::remove_all(dir);
}

TEST_CASE("A set of files is written together or not at all", "[atomic]")
{
    const fs::path dir = fs::temp_directory_path() / "plumbline-atomic-set";
    fs::remove_all(dir);
    fs::create_directories(dir);
    std::ofstream(dir / "a.csv") << "old a";
    std::ofstream(dir / "b.csv") << "old b";
    // The third file cannot be created (its folder does not exist): the first two stay old.
    const auto failed = plumbline::writeFilesTogether({{(dir / "a.csv").string(), "new a"}, {(dir / "b.csv").string(), "new b"},
                                                       {(dir / "missing" / "c.csv").string(), "new c"}});
    REQUIRE_FALSE(failed);
    CHECK(failed.error().remedy.find("none of the 3 files was written") != std::string::npos);
    CHECK(slurp(dir / "a.csv") == "old a");
    CHECK(slurp(dir / "b.csv") == "old b");
    std::size_t entries = 0;
    for ([[maybe_unused]] const auto& entry : fs::directory_iterator(dir))
        ++entries;
    CHECK(entries == 2); // no temporary file left behind
    REQUIRE(plumbline::writeFilesTogether({{(dir / "a.csv").string(), "new a"}, {(dir / "b.csv").string(), "new b"}}));
    CHECK(slurp(dir / "a.csv") == "new a");
    CHECK(slurp(dir / "b.csv") == "new b");
    fs::remove_all(dir);
}
