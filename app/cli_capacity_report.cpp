#include "cli_capacity_report.hpp"

#include "reporting/cautions.hpp"

#include <cstdio>
#include <iomanip>
#include <string>

namespace plumbline::cli {

namespace {

std::string fixed(const std::optional<double>& value, int digits = 3)
{
    if (!value)
        return "-";
    char buffer[40];
    std::snprintf(buffer, sizeof buffer, "%.*f", digits, *value);
    return buffer;
}

std::string withInterval(const ProportionWithCi& p)
{
    if (!p.value)
        return "-";
    return fixed(p.value) + (p.ci ? " (" + fixed(p.ci->lower) + "-" + fixed(p.ci->upper) + ")" : "");
}

} // namespace

void printCapacity(std::ostream& out, const ValidationResult& result)
{
    if (!result.capacity)
        return;
    const CapacityAnalysis& c = *result.capacity;
    out << "\nCapacity " << c.text << " (flagged if risk >= threshold, highest risk first):\n  " << c.definition << '\n';
    for (const auto& r : c.overall) {
        out << "  " << r.model << ": capacity " << r.at.requested << " patients; threshold " << fixed(r.at.threshold, 4) << " flags "
            << r.at.flagged << (r.at.exact() ? " (exactly the capacity)" : r.at.flagged < r.at.requested ? " (at most the capacity)" : "") << '\n';
        // A capacity is a ceiling: with a tie across it the threshold is the next risk up.
        if (r.at.tiesCrossCapacity())
            out << "    ties: " << r.at.tiedAtNextRiskDown << " patients share the next risk down (" << fixed(r.at.nextRiskDown, 4)
                << "), which would flag " << r.at.flaggedAtNextRiskDown << ", more than the capacity\n";
        out << "    sensitivity " << withInterval(r.sensitivity) << ", specificity " << withInterval(r.specificity) << ", PPV "
            << withInterval(r.ppv) << '\n'
            << "    net benefit " << fixed(r.netBenefit, 4) << ", events reached per 100 flagged " << fixed(r.eventsPer100Flagged, 1) << '\n';
    }
    out << "  note: " << capacityCaution << '\n';
    if (c.periods.empty())
        return;
    out << "  Per " << (c.periodUnit == PeriodUnit::Month ? "month" : "quarter")
        << " (the same capacity within each; 'whole-cohort threshold' flags with the threshold above):\n"
        << "    period    model               patients  capacity  threshold  flagged   sens    PPV  whole-cohort threshold\n";
    for (const auto& r : c.periods)
        out << "    " << std::left << std::setw(10) << r.period << std::setw(18) << r.model.substr(0, 17) << std::right << std::setw(10)
            << r.patients << std::setw(10) << r.at.requested << std::setw(11) << fixed(r.at.threshold, 4) << std::setw(9) << r.at.flagged
            << std::setw(7) << fixed(r.sensitivity.value) << std::setw(7) << fixed(r.ppv.value) << std::setw(10)
            << (r.flaggedByOverallThreshold ? std::to_string(*r.flaggedByOverallThreshold) : "-")
            << (r.overallThresholdOverflows ? "  [over capacity]" : "") << (r.at.tiesCrossCapacity() ? "  [ties]" : "") << '\n';
    out << "    [over capacity]: the whole-cohort threshold flags more than the period's capacity by more than "
        << int(overCapacityMargin * 100 + 0.5) << "%; [ties]: patients tied where the capacity ends, the threshold flags fewer\n";
}

} // namespace plumbline::cli
