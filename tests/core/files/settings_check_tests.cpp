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
    // The CUSUMs: worse from 1.1 to 20, better from 0.05 to 0.9 (nearer 1 a chart cannot signal); 0.1 to 50 years.
    for (const auto& [worse, better] : {std::pair{0.5, 2.0}, {1.0, 0.5}, {2.0, 1.0}, {21.0, 0.5}, {2.0, 0.04}, {1e308, 0.5},
                                        {1.0001, 0.9999}, {1.09, 0.5}, {2.0, 0.91}}) {
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
    a.panel.monitoring.worseOdds = 1.1;
    a.panel.monitoring.betterOdds = 0.9;
    CHECK(refusal(a).empty());
    for (const double years : {0.0, 0.09, 50.5, -5.0}) {
        a = {};
        a.panel.monitoring.targetYears = years;
        CHECK(refusal(a).find("--cusum-years must lie between 0.1 and 50") != std::string::npos);
    }
}

TEST_CASE("A site column that is empty or the outcome or a score is refused", "[settings][cluster]")
{
    AnalysisFile a;
    a.intake.outcomeColumn = "y";
    a.intake.scoreColumns = {"p"};
    a.intake.clusterColumn = std::string("hospital");
    CHECK(refusal(a).empty());
    a.intake.clusterColumn = std::string();
    CHECK(refusal(a).find("--cluster names no column") != std::string::npos);
    CHECK(refusal(a, SettingsSource::AnalysisFile).find("key 'columns.cluster'") != std::string::npos);
    a.intake.clusterColumn = std::string("p");
    CHECK(refusal(a).find("--cluster names the outcome or a score column") != std::string::npos);
    a.intake.clusterColumn = std::string("y");
    CHECK(refusal(a, SettingsSource::Window).find("Site column: names the outcome") != std::string::npos);
}

TEST_CASE("Acceptability criteria out of range are refused naming where they were given", "[settings][cluster]")
{
    AnalysisFile a;
    a.panel.acceptable.oeLow = 1.3; // above oeHigh
    CHECK(refusal(a).find("--acceptable takes oe as low:high") != std::string::npos);
    CHECK(refusal(a, SettingsSource::AnalysisFile).find("key 'options.acceptable'") != std::string::npos);
    a = {};
    a.panel.acceptable.cMinimum = 1.0;
    CHECK(refusal(a, SettingsSource::Window).find("Acceptable in a new site: takes c") != std::string::npos);
    // The parser reads what a person types, with the same words (core/intake/acceptable_criteria).
    const auto parsed = parseAcceptableCriteria(" slope = 0.9:1.1 , c=0.75", "--acceptable");
    REQUIRE(parsed);
    CHECK(parsed->cMinimum == 0.75);
    CHECK(parsed->slopeLow == 0.9);
    CHECK(parsed->oeLow == 0.8); // not named: the default
    CHECK(parseAcceptableCriteria(acceptableCriteriaText(*parsed), "x").value() == *parsed);
    CHECK(parseAcceptableCriteria("oe=0.8:", "--acceptable").error().problem.find("low:high") != std::string::npos);
}
