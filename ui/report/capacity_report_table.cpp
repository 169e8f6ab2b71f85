#include "report/capacity_report_table.hpp"

#include "reporting/cautions.hpp"
#include "reporting/value_text.hpp"

#include <map>
#include <string>

namespace plumbline {

namespace {

ReportCell text(std::string value) { return {std::move(value), std::nullopt, false}; }
ReportCell number(std::optional<double> value, int digits)
{
    if (!value)
        return {"not computed", std::nullopt, false};
    return {fixedText(*value, digits), *value, false};
}
ReportCell count(std::size_t value) { return {std::to_string(value), double(value), false}; }
ReportCell suppressed() { return {"suppressed", std::nullopt, true}; }
ReportCell withheld() { return {"withheld", std::nullopt, true}; }

bool small(std::size_t value, std::size_t minimumCell) { return value > 0 && value < minimumCell; }

bool rowIsSmall(const CapacityResult& r, std::size_t minimumCell)
{
    return small(r.tp, minimumCell) || small(r.fp, minimumCell) || small(r.tn, minimumCell) || small(r.fn, minimumCell);
}

} // namespace

std::optional<ReportTable> capacityTable(const ValidationResult& v, const DisclosurePlan& plan)
{
    if (!v.capacity)
        return std::nullopt;
    const CapacityAnalysis& c = *v.capacity;
    const std::size_t minimumCell = plan.minimumCell;
    ReportTable table{"capacity", "Operating by capacity: " + c.text + " (flagged if risk >= threshold, highest risk first)",
                      {"Model", "Period", "Capacity", "Threshold", "Flagged", "Tied at the next risk down (it would flag)", "TP", "FP", "TN", "FN", "Sensitivity",
                       "Specificity", "PPV", "Events per 100 flagged", "Net benefit", "Whole-cohort threshold flags"},
                      {}, {}, {}};
    // Periods the report suppresses elsewhere (their patients or events), by model and period.
    std::map<std::pair<std::string, std::string>, bool> periodHidden;
    if (v.periods)
        for (std::size_t i = 0; i < v.periods->results.size() && i < plan.periods.size(); ++i) {
            const auto& shown = plan.periods[i];
            periodHidden[{v.periods->results[i].model, v.periods->results[i].period}] =
                shown[0].primary || shown[0].suppressed || shown[1].primary || shown[1].suppressed;
        }
    // One small count of the whole-cohort threshold's column hides the model's column.
    std::map<std::string, bool> overallColumnHidden;
    for (const auto& r : c.periods)
        if (r.flaggedByOverallThreshold && small(*r.flaggedByOverallThreshold, minimumCell))
            overallColumnHidden[r.model] = true;
    auto addRow = [&](const CapacityResult& r, bool period) {
        const auto hidden = periodHidden.find({r.model, r.period});
        const bool hide = rowIsSmall(r, minimumCell) || (period && hidden != periodHidden.end() && hidden->second);
        // A share's capacity is the period's patients times the share: hidden with them.
        std::vector<ReportCell> row{text(r.model), text(period ? r.period : "all patients"), hide ? suppressed() : count(r.at.requested),
                                    number(r.at.threshold, 4)};
        if (hide) {
            for (int k = 0; k < 6; ++k)
                row.push_back(suppressed());
            for (int k = 0; k < 5; ++k)
                row.push_back(withheld());
        } else {
            row.push_back(count(r.at.flagged));
            // Ties across the capacity: how many share the next risk down and how many it would flag.
            // Every count of 1 to minimumCell − 1 is a small cell, in every row alike.
            const auto& at = r.at;
            if (!at.tiesCrossCapacity())
                row.push_back(count(0));
            else if (small(at.tiedAtNextRiskDown, minimumCell) || small(at.flaggedAtNextRiskDown, minimumCell))
                row.push_back(suppressed());
            else
                row.push_back(text(std::to_string(at.tiedAtNextRiskDown) + " (" + std::to_string(at.flaggedAtNextRiskDown) + ")"));
            for (std::size_t n : {r.tp, r.fp, r.tn, r.fn})
                row.push_back(count(n));
            row.push_back(number(r.sensitivity.value, 3));
            row.push_back(number(r.specificity.value, 3));
            row.push_back(number(r.ppv.value, 3));
            row.push_back(number(r.eventsPer100Flagged, 1));
            row.push_back(number(r.netBenefit, 4));
        }
        if (!period || !r.flaggedByOverallThreshold)
            row.push_back(text("-"));
        else if (overallColumnHidden[r.model] || hide)
            row.push_back(suppressed());
        else
            row.push_back(text(std::to_string(*r.flaggedByOverallThreshold) + (r.overallThresholdOverflows ? " (over capacity)" : "")));
        table.rows.push_back(std::move(row));
    };
    for (const auto& r : c.overall) {
        addRow(r, false);
        for (const auto& p : c.periods)
            if (p.model == r.model)
                addRow(p, true);
    }
    table.note = c.definition + " A capacity is a ceiling: when patients are tied where the capacity ends, the threshold is the next risk "
                 "up and flags fewer; the column 'Tied at the next risk down' says how many share that lower risk and, in brackets, how "
                 "many a threshold there would flag. '(over capacity)': the whole-cohort threshold flags more than the period's "
                 "capacity by more than " + std::to_string(int(overCapacityMargin * 100 + 0.5)) + "% (a tolerance, common practice). Counts of 1 to " + std::to_string(minimumCell - 1) + " are suppressed with what is built on them. " + std::string(capacityCaution);
    return table;
}

} // namespace plumbline
