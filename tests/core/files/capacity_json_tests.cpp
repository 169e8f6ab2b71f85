#include "files/analysis_file.hpp"
#include "files/capacity_json.hpp"
#include "files/settings_check.hpp"

#include <catch2/catch.hpp>

#include <filesystem>
#include <fstream>

using namespace plumbline;
namespace fs = std::filesystem;

namespace {
fs::path scratch(const std::string& name)
{
    const fs::path dir = fs::temp_directory_path() / ("plumbline-capacity-" + name);
    fs::remove_all(dir);
    fs::create_directories(dir);
    std::ofstream(dir / "cohort.csv") << "y,p,d\n1,0.7,2025-01-01\n0,0.2,2025-01-08\n0,0.1,2025-01-15\n";
    return dir;
}
AnalysisFile analysisOf(const fs::path& dir)
{
    AnalysisFile a;
    a.intake.cohortFile = (dir / "cohort.csv").string();
    a.intake.outcomeColumn = "y";
    a.intake.scoreColumns = {"p"};
    return a;
}
std::string refusal(const AnalysisFile& a, SettingsSource source = SettingsSource::CommandLine)
{
    const auto checked = checkAnalysisSettings(a, source, "a.plumbline.json");
    return checked ? std::string() : checked.error().message();
}
} // namespace

TEST_CASE("An analysis file keeps the capacity so a saved analysis re-runs it", "[capacity]")
{
    const fs::path dir = scratch("round-trip");
    for (const char* text : {"12.5%", "40/week", "3/day", "150/month"}) {
        AnalysisFile a = analysisOf(dir);
        a.intake.periodColumn = "d";
        a.panel.capacity = *parseCapacity(text, "x");
        REQUIRE(saveAnalysisFile((dir / "a.plumbline.json").string(), a));
        std::vector<std::string> warnings;
        const auto b = loadAnalysisFile((dir / "a.plumbline.json").string(), warnings);
        REQUIRE(b);
        REQUIRE(b->panel.capacity);
        CHECK(*b->panel.capacity == *a.panel.capacity);
    }
    AnalysisFile none = analysisOf(dir);
    REQUIRE(saveAnalysisFile((dir / "none.plumbline.json").string(), none));
    std::vector<std::string> warnings;
    CHECK(!loadAnalysisFile((dir / "none.plumbline.json").string(), warnings)->panel.capacity);
    fs::remove_all(dir);
}

TEST_CASE("A bad capacity in an analysis file is refused naming its key", "[capacity]")
{
    const fs::path dir = scratch("bad");
    REQUIRE(saveAnalysisFile((dir / "a.plumbline.json").string(), analysisOf(dir)));
    std::ifstream in(dir / "a.plumbline.json");
    std::string text((std::istreambuf_iterator<char>(in)), {});
    const auto at = text.find("\"capacity\": null");
    REQUIRE(at != std::string::npos);
    for (const char* bad : {"\"40/fortnight\"", "\"101%\"", "7"}) {
        std::string edited = text;
        edited.replace(at, std::string("\"capacity\": null").size(), std::string("\"capacity\": ") + bad);
        std::ofstream(dir / "b.plumbline.json") << edited;
        std::vector<std::string> warnings;
        const auto refused = loadAnalysisFile((dir / "b.plumbline.json").string(), warnings);
        REQUIRE(!refused);
        CHECK(refused.error().message().find("options.capacity") != std::string::npos);
    }
    fs::remove_all(dir);
}

TEST_CASE("The settings check bounds the capacity and asks for dates with a rate", "[capacity]")
{
    AnalysisFile a;
    a.panel.capacity = CapacitySpec{CapacitySpec::Kind::Share, 0.0, CapacitySpec::Unit::Week};
    CHECK(refusal(a).find("--capacity is a share of the patients and must lie above 0%") != std::string::npos);
    a.panel.capacity->amount = 100.5;
    CHECK(refusal(a, SettingsSource::AnalysisFile).find("key 'options.capacity'") != std::string::npos);
    a.panel.capacity->amount = 100.0;
    CHECK(refusal(a).empty());
    a.panel.capacity = CapacitySpec{CapacitySpec::Kind::Rate, -5.0, CapacitySpec::Unit::Week};
    CHECK(refusal(a).find("--capacity must be a number of patients above 0") != std::string::npos);
    a.panel.capacity->amount = 40.0;
    CHECK(refusal(a).find("needs the cohort's dates") != std::string::npos);
    CHECK(refusal(a).find("--period") != std::string::npos);
    a.intake.periodColumn = "discharge_date";
    CHECK(refusal(a).empty());
}

TEST_CASE("The capacity block is null without a capacity and carries the counts with one", "[capacity]")
{
    CHECK(capacityJson(std::nullopt).is_null());
    CapacityAnalysis c;
    c.spec = *parseCapacity("40/week", "x");
    c.text = "40/week";
    c.spanDays = 70.0;
    CapacityResult r;
    r.model = "score";
    r.patients = 1000;
    r.at = {400, 0.25, 410, 30, 380, std::nullopt, 0, 0};
    r.tp = 100;
    r.fp = 310;
    c.overall.push_back(r);
    const auto json = capacityJson(c);
    CHECK(json["kind"] == "rate");
    CHECK(json["unit"] == "week");
    CHECK(json["span_days"] == 70.0);
    CHECK(json["models"][0]["requested"] == 400);
    CHECK(json["models"][0]["flagged"] == 410);
    CHECK(json["models"][0]["tied_at_threshold"] == 30);
    CHECK(json["models"][0]["exact"] == false);
    CHECK(json["models"][0]["net_benefit"].is_null());
    CHECK(json["periods"].empty());
}
