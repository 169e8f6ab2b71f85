#include "cli_monitoring_report.hpp"

#include "metrics/population_stability.hpp"

#include <cstdio>
#include <string>

namespace plumbline::cli {

namespace {

std::string fixed(double value, int digits)
{
    char buffer[64];
    std::snprintf(buffer, sizeof buffer, "%.*f", digits, value);
    return buffer;
}

} // namespace

void printMonitoring(std::ostream& out, const ValidationResult& result)
{
    if (!result.monitoring)
        return;
    const MonitoringAnalysis& m = *result.monitoring;
    out << "\nMonitoring (patients by date; within a day in file order):\n";
    for (const auto& note : m.notes)
        out << "  note: " << note << '\n';
    for (const auto& scope : m.scopes) {
        out << "  " << scope.model << (scope.site.empty() ? " overall" : " at " + scope.site) << ": " << scope.patients << " patients "
            << scope.firstDate << " to " << scope.lastDate << "; expected minus observed " << fixed(scope.finalExpectedMinusObserved, 1)
            << (scope.finalExpectedMinusObserved >= 0 ? " (fewer events than predicted)" : " (more events than predicted)") << '\n';
        for (const auto& chart : scope.charts) {
            out << "    CUSUM " << cusumDirectionKey(chart.direction) << " (OR " << fixed(chart.oddsRatio, 2) << "): h " << fixed(chart.limit.limit, 2)
                << ", in-control run length " << fixed(chart.limit.averageRunLength, 0) << " ± " << fixed(chart.limit.standardError, 0)
                << " patients (target " << fixed(chart.targetRunLength, 0) << ", " << chart.limit.runs << " runs, seed " << chart.seed << ")"
                << (chart.limit.reached ? "" : " [target not reached]") << "; " << chart.signalList.size() << " signal"
                << (chart.signalList.size() == 1 ? "" : "s");
            if (!chart.signalList.empty())
                // No site for the whole-network scope: the patient who tipped a pooled sum says
                // nothing about where the excess lies.
                out << ", last on " << chart.signalList.back().date;
            out << '\n';
        }
        if (scope.latestYearPsi)
            out << "    score distribution, latest year against the first: PSI " << fixed(*scope.latestYearPsi, 3) << " ("
                << psiBand(*scope.latestYearPsi) << " shift; bands 0.1 and 0.25 are common practice)\n";
        if (!scope.question.empty())
            out << "    question: " << scope.question << " (mean predicted " << fixed(scope.codingShift->firstYear.meanPredicted, 3) << " to "
                << fixed(scope.codingShift->latestYear.meanPredicted, 3) << ", observed " << fixed(scope.codingShift->firstYear.observedRate, 3)
                << " to " << fixed(scope.codingShift->latestYear.observedRate, 3) << ")\n";
    }
}

} // namespace plumbline::cli
