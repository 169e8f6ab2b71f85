#include "report/monitoring_section.hpp"

#include "metrics/population_stability.hpp"
#include "reporting/value_text.hpp"

#include <algorithm>
#include <string>
#include <vector>

namespace plumbline {

namespace {

ReportCell text(std::string s)
{
    return {std::move(s)};
}

ReportCell number(double value, int digits)
{
    return {fixedText(value, digits), value};
}

ReportCell count(std::size_t value, std::size_t minimumCell)
{
    if (value < minimumCell)
        return {"suppressed", std::nullopt, true};
    return {std::to_string(value), double(value)};
}

// Signals listed per chart and scope in the report; the rest are in the result file.
constexpr std::size_t signalsPerChart = 10;

std::string scopeName(const MonitoringScope& scope)
{
    return scope.site.empty() ? "all patients" : scope.site;
}

} // namespace

void addMonitoring(ReportSection& section, const ValidationResult& v, std::size_t minimumCell)
{
    if (!v.monitoring)
        return;
    const MonitoringAnalysis& m = *v.monitoring;
    ReportTable summary{"monitoring", "Monitoring: expected minus observed and the CUSUMs",
                        {"Model", "Scope", "Patients", "Expected − observed", "Chart", "Odds ratio", "h", "In-control run length",
                         "Target", "Signals"},
                        {}, {}, {}};
    ReportTable signalsTable{"monitoring_signals", "Monitoring: CUSUM signals by month",
                             {"Model", "Scope", "Chart", "Month", "Site", "Patients since the last restart"}, {}, {}, {}};
    ReportTable caseMix{"monitoring_case_mix", "Monitoring: mean predicted risk and score shift by period",
                        {"Model", "Scope", "Period", "Mean predicted risk", "PSI against the first year", "Shift"}, {}, {}, {}};
    ReportTable questions{"monitoring_questions", "Monitoring: case mix and coding, latest year against the first",
                          {"Model", "Scope", "PSI", "Shift", "Mean predicted, first year", "Mean predicted, latest year", "Question"},
                          {}, {}, {}};
    std::vector<std::vector<ReportCell>> worseSignals, betterSignals;
    for (const auto& scope : m.scopes) {
        for (const auto& chart : scope.charts) {
            summary.rows.push_back({text(scope.model), text(scopeName(scope)), count(scope.patients, minimumCell),
                                    number(scope.finalExpectedMinusObserved, 1), text(cusumDirectionKey(chart.direction)),
                                    number(chart.oddsRatio, 2), number(chart.limit.limit, 2),
                                    text(fixedText(chart.limit.averageRunLength, 0) + " ± " + fixedText(chart.limit.standardError, 0)
                                         + (chart.limit.reached ? "" : " (target not reached)")),
                                    number(chart.targetRunLength, 0), number(double(chart.signalList.size()), 0)});
            // At most the first few signals per chart and scope; the worse chart's first. The
            // whole-network scope shows no site: the patient who tipped a pooled sum says nothing
            // about where the excess lies.
            auto& rows = chart.direction == CusumDirection::Worse ? worseSignals : betterSignals;
            const std::size_t shown = std::min(chart.signalList.size(), signalsPerChart);
            for (std::size_t k = 0; k < shown; ++k) {
                const CusumSignal& signal = chart.signalList[k];
                rows.push_back({text(scope.model), text(scopeName(scope)), text(cusumDirectionKey(chart.direction)),
                                text(signal.date.substr(0, 7)), text(scope.site.empty() ? "-" : signal.site),
                                count(signal.patientsSinceReset, minimumCell)});
            }
            if (chart.signalList.size() > shown)
                rows.push_back({text(scope.model), text(scopeName(scope)), text(cusumDirectionKey(chart.direction)),
                                text("and " + std::to_string(chart.signalList.size() - shown) + " more (all in the JSON)"), text(""),
                                text("")});
        }
        for (const auto& row : scope.periods)
            caseMix.rows.push_back({text(scope.model), text(scopeName(scope)), text(row.period), number(row.values.meanPredicted, 3),
                                    number(row.psi, 3), text(psiBand(row.psi))});
        if (scope.latestYearPsi && scope.codingShift)
            questions.rows.push_back({text(scope.model), text(scopeName(scope)), number(*scope.latestYearPsi, 3),
                                      text(psiBand(*scope.latestYearPsi)), number(scope.codingShift->firstYear.meanPredicted, 3),
                                      number(scope.codingShift->latestYear.meanPredicted, 3),
                                      text(scope.question.empty() ? "-" : scope.question)});
    }
    signalsTable.rows = std::move(worseSignals);
    signalsTable.rows.insert(signalsTable.rows.end(), betterSignals.begin(), betterSignals.end());
    std::string notes;
    for (const auto& note : m.notes)
        notes += note + " ";
    summary.note = notes + "Patients in date order, within a day in file order. Expected − observed above zero: fewer events than "
                           "predicted (Lovegrove et al. 1997). Risk-adjusted Bernoulli CUSUMs (Steiner et al. 2000) restart at 0 "
                           "after a signal; h is chosen by simulation from the model's own risks for the target in-control run "
                           "length (± its Monte Carlo SE), " + std::to_string(m.settings.simulatedRuns) + " runs, seed "
                 + std::to_string(m.settings.seed) + ".";
    signalsTable.note = "A signal is a reason to look at the cases, not a finding. Exact dates are in the result file.";
    caseMix.note = "PSI bands: below 0.1 little, 0.1 to 0.25 moderate, 0.25 or more a large shift (common practice). Observed "
                   "rates by period are in the period table, under the small-cell rule.";
    questions.note = "The question is asked when the latest year's mean predicted risk is at least "
                     + fixedText(100.0 * m.settings.codingShiftRise, 0)
                     + " % above the first year's with intervals apart, while the observed rate did not rise significantly: "
                       "a pattern of changed coding or documentation, to be investigated, not a finding.";
    section.tables.push_back(summary);
    if (!signalsTable.rows.empty())
        section.tables.push_back(signalsTable);
    section.tables.push_back(caseMix);
    if (!questions.rows.empty())
        section.tables.push_back(questions);
    // The whole cohort's charts per model (a site's are in the window).
    for (std::size_t model = 0; model < v.models.size(); ++model)
        for (ReportChart kind : {ReportChart::MonitoringExpectedMinusObserved, ReportChart::MonitoringWorse, ReportChart::MonitoringBetter})
            section.charts.push_back({kind, int(model)});
}

} // namespace plumbline
