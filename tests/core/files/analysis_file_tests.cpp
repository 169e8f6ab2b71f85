#include "files/analysis_file.hpp"

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
// The smallest analysis of the scratch cohort: outcome y, score p.
AnalysisFile analysisOf(const fs::path& dir)
{
    AnalysisFile a;
    a.intake.cohortFile = (dir / "data" / "cohort.csv").string();
    a.intake.outcomeColumn = "y";
    a.intake.scoreColumns = {"p"};
    return a;
}
} // namespace

TEST_CASE("An analysis file keeps every setting and finds its inputs relative to itself", "[analysis]")
{
    const fs::path dir = scratch("round-trip");
    AnalysisFile a = analysisOf(dir);
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
    a.panel.monitoring.worseOdds = 1.5;
    a.panel.monitoring.betterOdds = 0.25;
    a.panel.monitoring.targetYears = 2.5;
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
    CHECK(b->panel.monitoring.worseOdds == 1.5);
    CHECK(b->panel.monitoring.betterOdds == 0.25);
    CHECK(b->panel.monitoring.targetYears == 2.5);
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

namespace {
// A saved analysis beside its data, with one option replaced by raw JSON text.
fs::path analysisWith(const fs::path& dir, const std::string& key, const std::string& rawValue)
{
    const AnalysisFile a = analysisOf(dir);
    const fs::path file = dir / "a.plumbline.json";
    REQUIRE(saveAnalysisFile(file.string(), a));
    std::ifstream in(file);
    std::string text((std::istreambuf_iterator<char>(in)), std::istreambuf_iterator<char>());
    const auto at = text.find("\"" + key + "\": ");
    REQUIRE(at != std::string::npos);
    const auto start = at + key.size() + 4;
    const auto end = text.find_first_of(",\n", start);
    text.replace(start, end - start, rawValue);
    std::ofstream(file) << text;
    return file;
}
} // namespace

TEST_CASE("Analysis-file values are checked and refused with the file the key and the value", "[analysis]")
{
    const fs::path dir = scratch("values");
    std::vector<std::string> warnings;
    const std::vector<std::pair<std::string, std::string>> bad{
        {"confidence", "0"}, {"confidence", "-0.95"}, {"confidence", "2"}, {"confidence", "1e400"},
        {"risk_groups", "-5"}, {"risk_groups", "0"}, {"bootstrap", "2.5"}, {"bootstrap", "-1"},
        {"ci_method", "\"bogus\""}, {"scale", "\"dollars\""}, {"period_unit", "\"week\""}, {"seed", "\"7\""},
        {"plumbline_analysis", "99"}, {"plumbline_analysis", "0"}};
    for (const auto& [key, value] : bad) {
        const auto loaded = loadAnalysisFile(analysisWith(dir, key, value).string(), warnings);
        INFO(key << " = " << value);
        REQUIRE_FALSE(loaded);
        CHECK(loaded.error().kind == ErrorKind::UnusableInput); // exit 2, never an internal error
        CHECK(loaded.error().message().find("a.plumbline.json") != std::string::npos);
        const bool named = loaded.error().key.find(key) != std::string::npos || loaded.error().problem.find("JSON") != std::string::npos;
        CHECK(named);
    }
    fs::remove_all(dir);
}

TEST_CASE("An input outside the analysis file's folder is read only when allowed", "[analysis]")
{
    const fs::path dir = scratch("outside");
    AnalysisFile a = analysisOf(dir);
    fs::create_directories(dir / "analyses");
    const fs::path file = dir / "analyses" / "a.plumbline.json"; // the input is ../data/cohort.csv
    REQUIRE(saveAnalysisFile(file.string(), a));
    std::vector<std::string> warnings;
    const auto refused = loadAnalysisFile(file.string(), warnings);
    REQUIRE_FALSE(refused);
    CHECK(refused.error().kind == ErrorKind::OutsideFolder);
    CHECK(refused.error().key == "inputs[0].path");
    CHECK(loadAnalysisFile(file.string(), warnings, {true, false}).has_value());
    // A symbolic link inside the folder that points out of it is outside too.
    fs::create_symlink(dir / "data" / "cohort.csv", dir / "analyses" / "link.csv");
    a.intake.cohortFile = (dir / "analyses" / "link.csv").string();
    REQUIRE(saveAnalysisFile(file.string(), a));
    CHECK(loadAnalysisFile(file.string(), warnings).error().kind == ErrorKind::OutsideFolder);
    fs::remove_all(dir);
}

TEST_CASE("A missing fingerprint is a warning and strict reading refuses a changed input", "[analysis]")
{
    const fs::path dir = scratch("fingerprint");
    const fs::path file = analysisWith(dir, "sha256", "\"\"");
    std::vector<std::string> warnings;
    REQUIRE(loadAnalysisFile(file.string(), warnings));
    REQUIRE(warnings.size() == 1);
    CHECK(warnings[0].find("records no SHA-256") != std::string::npos);
    const auto strict = loadAnalysisFile(file.string(), warnings, {false, true});
    REQUIRE_FALSE(strict);
    CHECK(strict.error().message().find("--strict-inputs") != std::string::npos);
    fs::remove_all(dir);
}

TEST_CASE("A query's SQLite file is found relative to the analysis file, and a result that changed is said", "[analysis]")
{
    const fs::path dir = scratch("sqlite");
    std::ofstream(dir / "data" / "cohort.db") << "stands for the database file";
    AnalysisFile a = analysisOf(dir);
    a.intake.cohortFile.clear();
    a.intake.database = "sqlite:" + (dir / "data" / "cohort.db").string();
    a.intake.query = "SELECT y, p FROM cohort ORDER BY id";
    a.queryResultSha256 = std::string(64, 'b');
    REQUIRE(saveAnalysisFile((dir / "q.plumbline.json").string(), a));
    std::ifstream saved(dir / "q.plumbline.json");
    const std::string text((std::istreambuf_iterator<char>(saved)), std::istreambuf_iterator<char>());
    CHECK(text.find("\"sqlite:data/cohort.db\"") != std::string::npos);
    // Moved with its data, the analysis still finds the database (an outside try found it read
    // relative to the working folder instead).
    const fs::path moved = fs::temp_directory_path() / "plumbline-analysis-sqlite-moved";
    fs::remove_all(moved);
    fs::rename(dir, moved);
    std::vector<std::string> warnings;
    const auto b = loadAnalysisFile((moved / "q.plumbline.json").string(), warnings);
    REQUIRE(b);
    REQUIRE(b->intake.database);
    REQUIRE(b->intake.database->starts_with("sqlite:"));
    CHECK(fs::equivalent(b->intake.database->substr(7), moved / "data" / "cohort.db"));
    CHECK(b->intake.query == a.intake.query);
    CHECK(b->intake.cohortFile.empty());
    CHECK_FALSE(queryResultChange(*b, std::string(64, 'b')));
    const auto changed = queryResultChange(*b, std::string(64, 'c'));
    REQUIRE(changed);
    CHECK(changed->starts_with("The query's result has changed since the analysis was saved"));
    fs::remove_all(moved);
}

TEST_CASE("An analysis file keeps the site column so a pooled analysis re-runs", "[analysis][cluster]")
{
    const fs::path dir = scratch("cluster");
    AnalysisFile a = analysisOf(dir);
    a.intake.clusterColumn = std::string("hospital");
    a.panel.acceptable = {0.65, 0.85, 1.15, 0.7, 1.3};
    a.bootstrap.seed = 77;
    REQUIRE(saveAnalysisFile((dir / "a.plumbline.json").string(), a));
    std::vector<std::string> warnings;
    const auto b = loadAnalysisFile((dir / "a.plumbline.json").string(), warnings);
    REQUIRE(b);
    CHECK(b->intake.clusterColumn == std::optional<std::string>("hospital"));
    CHECK(b->panel.acceptable == a.panel.acceptable);
    CHECK(b->panel.simulationSeed == 77); // the draws for a new site use the saved seed
    a.intake.clusterColumn.reset();
    REQUIRE(saveAnalysisFile((dir / "b.plumbline.json").string(), a));
    const auto c = loadAnalysisFile((dir / "b.plumbline.json").string(), warnings);
    REQUIRE(c);
    CHECK_FALSE(c->intake.clusterColumn);
    fs::remove_all(dir);
}
