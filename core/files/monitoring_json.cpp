#include "files/monitoring_json.hpp"

#include "metrics/population_stability.hpp"

namespace plumbline {

namespace {

using Json = nlohmann::ordered_json;

// Points as [patient, value] pairs: a chart of 2000 points stays a few tens of kilobytes.
Json pathJson(const std::vector<PathPoint>& path)
{
    Json out = Json::array();
    for (const auto& point : path)
        out.push_back({point.patient, point.value});
    return out;
}

Json riskAndRateJson(const RiskAndRate& r)
{
    return {{"n", r.n}, {"events", r.events}, {"mean_predicted", r.meanPredicted}, {"mean_predicted_ci", {r.meanLower, r.meanUpper}},
            {"observed_rate", r.observedRate}, {"observed_rate_ci", {r.rateLower, r.rateUpper}}};
}

Json chartJson(const CusumChart& chart)
{
    Json signals = Json::array();
    for (const auto& s : chart.signalList)
        signals.push_back({{"patient", s.patient}, {"date", s.date}, {"site", s.site.empty() ? Json(nullptr) : Json(s.site)},
                           {"patients_since_reset", s.patientsSinceReset}});
    return {{"chart", cusumDirectionKey(chart.direction)},
            {"odds_ratio", chart.oddsRatio},
            {"control_limit", chart.limit.limit},
            {"target_run_length", chart.targetRunLength},
            {"target_capped", chart.targetCapped},
            {"achieved_run_length", chart.limit.averageRunLength},
            {"achieved_run_length_se", chart.limit.standardError},
            {"target_reached", chart.limit.reached},
            {"runs", chart.limit.runs},
            {"censored_runs", chart.limit.censoredRuns},
            {"run_cap", chart.limit.runCap},
            {"seed", chart.seed},
            {"points", pathJson(chart.path)},
            {"signals", signals}};
}

Json scopeJson(const MonitoringScope& scope)
{
    Json charts = Json::array();
    for (const auto& chart : scope.charts)
        charts.push_back(chartJson(chart));
    Json periods = Json::array();
    for (const auto& row : scope.periods) {
        Json entry = {{"period", row.period}, {"first_year", row.firstYear}};
        entry.update(riskAndRateJson(row.values));
        entry["psi"] = row.psi;
        entry["psi_band"] = psiBand(row.psi);
        periods.push_back(entry);
    }
    Json shift = nullptr;
    if (scope.codingShift)
        shift = {{"first_year", riskAndRateJson(scope.codingShift->firstYear)},
                 {"latest_year", riskAndRateJson(scope.codingShift->latestYear)},
                 {"predicted_ratio", scope.codingShift->predictedRatio},
                 {"predicted_rose", scope.codingShift->predictedRose},
                 {"observed_rose", scope.codingShift->observedRose},
                 {"flagged", scope.codingShift->flagged},
                 {"question", scope.question.empty() ? Json(nullptr) : Json(scope.question)}};
    return {{"model", scope.model},
            {"site", scope.site.empty() ? Json(nullptr) : Json(scope.site)},
            {"patients", scope.patients},
            {"first_date", scope.firstDate},
            {"last_date", scope.lastDate},
            {"patients_per_year", scope.patientsPerYear},
            {"expected_minus_observed", {{"final", scope.finalExpectedMinusObserved}, {"points", pathJson(scope.expectedMinusObserved)}}},
            {"cusum", charts},
            {"periods", periods},
            {"first_year_periods", scope.firstYearPeriods},
            {"latest_year_periods", scope.latestYearPeriods},
            {"latest_year_psi", scope.latestYearPsi ? Json(*scope.latestYearPsi) : Json(nullptr)},
            {"coding_shift", shift}};
}

} // namespace

nlohmann::ordered_json monitoringJson(const MonitoringAnalysis& monitoring)
{
    const MonitoringSettings& s = monitoring.settings;
    Json scopes = Json::array();
    for (const auto& scope : monitoring.scopes)
        scopes.push_back(scopeJson(scope));
    return {{"settings", {{"worse_odds_ratio", s.worseOdds}, {"better_odds_ratio", s.betterOdds}, {"target_years", s.targetYears},
                          {"simulated_runs", s.simulatedRuns}, {"chart_points", s.chartPoints}, {"coding_shift_rise", s.codingShiftRise},
                          {"seed", s.seed}}},
            {"order", "by date; within a day by the row's line in the cohort file"},
            {"unit", monitoring.unit == PeriodUnit::Month ? "month" : "quarter"},
            {"site_column", monitoring.siteColumn.empty() ? Json(nullptr) : Json(monitoring.siteColumn)},
            {"undated_rows", monitoring.undated},
            {"notes", monitoring.notes},
            {"scopes", scopes}};
}

} // namespace plumbline
