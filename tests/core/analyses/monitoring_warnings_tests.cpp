#include "analyses/monitoring_warnings.hpp"

#include <catch2/catch.hpp>

using namespace plumbline;

namespace {

MonitoringScope scope(const std::string& site)
{
    MonitoringScope s;
    s.model = "risk";
    s.site = site;
    CusumChart worse;
    worse.direction = CusumDirection::Worse;
    CusumChart better;
    better.direction = CusumDirection::Better;
    s.charts = {worse, better};
    return s;
}

} // namespace

TEST_CASE("Monitoring warnings name each worse signal's model, scope, first date and count; better signals alone say nothing",
          "[monitoring]")
{
    MonitoringAnalysis m;
    m.scopes = {scope(""), scope("North")};
    m.scopes[0].charts[1].signalList = {{10, "2024-02-01", "North", CusumDirection::Better, 10}};
    CHECK(monitoringWarnings(m).empty());
    m.scopes[1].charts[0].signalList = {{40, "2024-03-05", "North", CusumDirection::Worse, 40},
                                        {90, "2024-06-01", "North", CusumDirection::Worse, 50}};
    const auto warnings = monitoringWarnings(m);
    REQUIRE(warnings.size() == 1);
    CHECK(warnings[0] == "Monitoring: risk at North: the CUSUM for worse outcomes than predicted signalled on 2024-03-05 (2 signals) — "
                         "look at that site's discharges around then.");
    // The overall scope is named as such, never by the site of the patient who tipped the sum.
    m.scopes[0].charts[0].signalList = {{12, "2024-01-20", "North", CusumDirection::Worse, 12}};
    const auto both = monitoringWarnings(m);
    REQUIRE(both.size() == 2);
    CHECK(both[0] == "Monitoring: risk overall (all patients): the CUSUM for worse outcomes than predicted signalled on 2024-01-20 "
                     "(1 signal) — look at the discharges around then.");
}

TEST_CASE("Monitoring warnings give the coding-shift question with its two means and rates, and a run length short of target",
          "[monitoring]")
{
    MonitoringAnalysis m;
    m.scopes = {scope("")};
    CodingShiftCheck check;
    check.firstYear.meanPredicted = 0.151;
    check.latestYear.meanPredicted = 0.2;
    check.firstYear.observedRate = 0.149;
    check.latestYear.observedRate = 0.152;
    check.flagged = true;
    m.scopes[0].codingShift = check;
    m.scopes[0].question = "Has coding changed?";
    m.scopes[0].charts[1].limit.reached = false;
    m.scopes[0].charts[1].targetRunLength = 5000.4;
    const auto warnings = monitoringWarnings(m);
    REQUIRE(warnings.size() == 2);
    CHECK(warnings[0] == "Monitoring: risk overall (all patients): the better CUSUM's in-control run length did not reach its target of "
                         "5000 patients, so it may signal more often than intended by chance.");
    CHECK(warnings[1] == "Monitoring: risk overall (all patients): Has coding changed? Mean predicted risk 0.151 in the first year, 0.200 "
                         "in the latest; observed rate 0.149 then, 0.152 now.");
}
