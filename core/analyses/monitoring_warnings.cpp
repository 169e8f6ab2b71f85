#include "analyses/monitoring_warnings.hpp"

#include <cmath>
#include <cstdio>

namespace plumbline {

namespace {

std::string threeDigits(double value)
{
    char buffer[32];
    std::snprintf(buffer, sizeof buffer, "%.3f", value);
    return buffer;
}

std::string scopeName(const MonitoringScope& scope)
{
    return scope.site.empty() ? "overall (all patients)" : "at " + scope.site;
}

} // namespace

std::vector<std::string> monitoringWarnings(const MonitoringAnalysis& monitoring)
{
    std::vector<std::string> out;
    for (const auto& scope : monitoring.scopes) {
        for (const auto& chart : scope.charts) {
            if (chart.direction == CusumDirection::Worse && !chart.signalList.empty()) {
                const std::size_t n = chart.signalList.size();
                out.push_back("Monitoring: " + scope.model + " " + scopeName(scope)
                              + ": the CUSUM for worse outcomes than predicted signalled on " + chart.signalList.front().date + " ("
                              + std::to_string(n) + (n == 1 ? " signal" : " signals") + ") — look at "
                              + (scope.site.empty() ? "the discharges" : "that site's discharges") + " around then.");
            }
            if (!chart.limit.reached)
                out.push_back("Monitoring: " + scope.model + " " + scopeName(scope) + ": the " + cusumDirectionKey(chart.direction)
                              + " CUSUM's in-control run length did not reach its target of " + std::to_string(std::llround(chart.targetRunLength))
                              + " patients, so it may signal more often than intended by chance.");
        }
        if (!scope.question.empty() && scope.codingShift) {
            const CodingShiftCheck& c = *scope.codingShift;
            out.push_back("Monitoring: " + scope.model + " " + scopeName(scope) + ": " + scope.question + " Mean predicted risk "
                          + threeDigits(c.firstYear.meanPredicted) + " in the first year, " + threeDigits(c.latestYear.meanPredicted)
                          + " in the latest; observed rate " + threeDigits(c.firstYear.observedRate) + " then, "
                          + threeDigits(c.latestYear.observedRate) + " now.");
        }
    }
    return out;
}

} // namespace plumbline
