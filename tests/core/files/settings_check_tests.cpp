#include "files/settings_check.hpp"

#include <catch2/catch.hpp>

using namespace plumbline;

namespace {
std::string refusal(const AnalysisFile& a, SettingsSource source = SettingsSource::CommandLine)
{
    const auto checked = checkAnalysisSettings(a, source, "a.plumbline.json");
    return checked ? std::string() : checked.error().message();
}
} // namespace

TEST_CASE("The defaults pass the check of every setting", "[settings]")
{
    CHECK(checkAnalysisSettings(AnalysisFile{}, SettingsSource::CommandLine).has_value());
}

TEST_CASE("Every setting out of its range is refused naming it where it was given", "[settings]")
{
    AnalysisFile a;
    a.panel.confidence = 2.0;
    CHECK(refusal(a).find("--confidence must lie between 0.5 and 0.999") != std::string::npos);
    CHECK(refusal(a, SettingsSource::AnalysisFile).find("key 'options.confidence', value '2'") != std::string::npos);
    CHECK(refusal(a, SettingsSource::Window).find("Confidence level: must lie") != std::string::npos);
    a.panel.confidence = -0.95;
    CHECK(!refusal(a).empty());
    a = {};
    a.panel.riskGroups = std::size_t(-5); // what a negative count becomes when it wraps
    CHECK(refusal(a).find("--groups") != std::string::npos);
    a = {};
    for (double t : {-1.0, 2.0, 1e308, 0.0, 1.0}) {
        a.panel.thresholds = {0.1, t};
        CHECK(refusal(a).find("--thresholds takes risks strictly between 0 and 1") != std::string::npos);
    }
    a.panel.thresholds.assign(5'000'000, 0.2);
    CHECK(refusal(a).find("at most 50 values") != std::string::npos);
    a = {};
    a.panel.decisionStep = 1e-12; // minutes of work, refused at once
    CHECK(refusal(a).find("at most 1000 are drawn") != std::string::npos);
    a.panel.decisionStep = 0.0;
    CHECK(refusal(a).find("--decision-range") != std::string::npos);
    a.panel.decisionStep = -0.01;
    CHECK(refusal(a).find("--decision-range") != std::string::npos);
    a = {};
    a.bootstrap.replicates = 20001;
    CHECK(refusal(a).find("--bootstrap") != std::string::npos);
    a = {};
    a.minimumCell = 0;
    CHECK(refusal(a).find("--min-cell") != std::string::npos);
    a = {};
    a.addUpdated = "bogus";
    CHECK(refusal(a).find("--add-updated") != std::string::npos);
    // The CUSUMs: worse above 1 and at most 20, better below 1 and at least 0.05; 0.1 to 50 years.
    for (const auto& [worse, better] : {std::pair{0.5, 2.0}, {1.0, 0.5}, {2.0, 1.0}, {21.0, 0.5}, {2.0, 0.04}, {1e308, 0.5}}) {
        a = {};
        a.panel.monitoring.worseOdds = worse;
        a.panel.monitoring.betterOdds = better;
        CHECK(refusal(a).find("--cusum-odds takes two odds ratios") != std::string::npos);
        CHECK(refusal(a, SettingsSource::AnalysisFile).find("key 'options.cusum_odds'") != std::string::npos);
    }
    a = {};
    a.panel.monitoring.worseOdds = 20.0;
    a.panel.monitoring.betterOdds = 0.05;
    CHECK(refusal(a).empty());
    for (const double years : {0.0, 0.09, 50.5, -5.0}) {
        a = {};
        a.panel.monitoring.targetYears = years;
        CHECK(refusal(a).find("--cusum-years must lie between 0.1 and 50") != std::string::npos);
    }
}
