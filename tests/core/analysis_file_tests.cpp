#include "analysis_file.hpp"

#include <catch2/catch.hpp>

#include <filesystem>
#include <fstream>

using namespace plumbline;
namespace fs = std::filesystem;

namespace {
fs::path scratch(const std::string& name)
{
    const fs::path dir = fs::temp_directory_path() / ("plumbline-analysis-" + name);
    fs::remove_all(dir);
    fs::create_directories(dir / "data");
    std::ofstream(dir / "data" / "cohort.csv") << "y,p\n1,0.7\n0,0.2\n0,0.1\n";
    return dir;
}
} // namespace

TEST_CASE("An analysis file keeps every setting and finds its inputs relative to itself", "[analysis]")
{
    const fs::path dir = scratch("round-trip");
    AnalysisFile a;
    a.intake.cohortFile = (dir / "data" / "cohort.csv").string();
    a.intake.outcomeColumn = "y";
    a.intake.scoreColumns = {"p"};
    a.intake.groupColumns = {"site"};
    a.intake.eventValue = std::string("1");
    a.intake.scale = ScoreScale::Percent;
    a.panel.thresholds = {0.05, 0.3};
    a.panel.cStatisticScale = CStatisticScale::Plain;
    a.bootstrap.replicates = 321;
    a.bootstrap.seed = 99;
    a.bootstrap.method = BootstrapCi::Percentile;
    a.addUpdated = "logistic";
    a.minimumCell = 5;
    a.report.title = "Title <with> \"quotes\"";
    REQUIRE(saveAnalysisFile((dir / "a.plumbline.json").string(), a));
    // Moving the folder keeps the analysis working: paths are relative.
    const fs::path moved = fs::temp_directory_path() / "plumbline-analysis-moved";
    fs::remove_all(moved);
    fs::rename(dir, moved);
    std::vector<std::string> warnings;
    const auto b = loadAnalysisFile((moved / "a.plumbline.json").string(), warnings);
    REQUIRE(b);
    CHECK(warnings.empty());
    CHECK(fs::equivalent(b->intake.cohortFile, moved / "data" / "cohort.csv"));
    CHECK(b->intake.scoreColumns == a.intake.scoreColumns);
    CHECK(b->intake.groupColumns == a.intake.groupColumns);
    CHECK(b->intake.eventValue == a.intake.eventValue);
    CHECK(b->intake.scale == ScoreScale::Percent);
    CHECK(b->panel.thresholds == a.panel.thresholds);
    CHECK(b->panel.cStatisticScale == CStatisticScale::Plain);
    CHECK(b->bootstrap.replicates == 321);
    CHECK(b->bootstrap.seed == 99);
    CHECK(b->bootstrap.method == BootstrapCi::Percentile);
    CHECK(b->addUpdated == "logistic");
    CHECK(b->minimumCell == 5);
    CHECK(b->report.title == a.report.title);
    fs::remove_all(moved);
}

TEST_CASE("A damaged or foreign analysis file is refused with a clear message", "[analysis]")
{
    const fs::path dir = scratch("bad");
    std::vector<std::string> warnings;
    std::ofstream(dir / "broken.json") << "{ not json";
    const auto broken = loadAnalysisFile((dir / "broken.json").string(), warnings);
    REQUIRE_FALSE(broken);
    CHECK(broken.error().problem.find("not valid JSON") != std::string::npos);
    std::ofstream(dir / "other.json") << "{\"name\": 1}";
    CHECK(loadAnalysisFile((dir / "other.json").string(), warnings).error().problem.find("not a Plumbline analysis") != std::string::npos);
    std::ofstream(dir / "newer.json") << "{\"plumbline_analysis\": 99}";
    CHECK(loadAnalysisFile((dir / "newer.json").string(), warnings).error().problem.find("newer") != std::string::npos);
    std::ofstream(dir / "missing.json") << "{\"plumbline_analysis\": 1, \"inputs\": []}";
    const auto missing = loadAnalysisFile((dir / "missing.json").string(), warnings);
    REQUIRE_FALSE(missing);
    CHECK(missing.error().key == "inputs");
    CHECK(missing.error().problem.find("must list the cohort file") != std::string::npos);
    fs::remove_all(dir);
}
