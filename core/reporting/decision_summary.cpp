#include "reporting/decision_summary.hpp"

#include "metrics/metric_reading.hpp"
#include "reporting/value_text.hpp"

#include <algorithm>
#include <cmath>

namespace plumbline {

namespace {

bool excludes(const Estimate& e, double value)
{
    return e.value && e.lower && e.upper && (*e.upper < value || *e.lower > value);
}

// "C 0.719, interval 0.712 to 0.725": a value and its interval inside a sentence's brackets.
std::string stated(const std::string& label, const Estimate& e, int digits)
{
    if (!e.value)
        return label + " not computed";
    std::string text = label + " " + fixedText(*e.value, digits);
    if (e.lower && e.upper)
        text += ", interval " + fixedText(*e.lower, digits) + " to " + fixedText(*e.upper, digits);
    return text;
}

std::string percent(double share)
{
    return fixedText(100.0 * share, 0) + " %";
}

DecisionSummaryModel summariseModel(const Cohort& cohort, std::size_t m, const ModelValidation& v, double threshold)
{
    DecisionSummaryModel out;
    out.name = v.name;
    auto metric = [&](PanelMetric k) { return v.metrics[k].estimate; };
    out.c = metric(CStatistic);
    out.oe = metric(OeRatio);
    out.calibrationInTheLarge = metric(CalibrationIntercept);
    out.calibrationSlope = metric(CalibrationSlope);
    out.scaledBrier = metric(ScaledBrier);
    out.risks = scaleIsProbabilistic(cohort.scale);
    if (!out.risks || cohort.rows() == 0)
        return out;
    const auto& p = cohort.models[m].values;
    double sum = 0.0, tp = 0.0, fp = 0.0, events = 0.0;
    for (std::size_t i = 0; i < p.size(); ++i) {
        sum += p[i];
        events += cohort.outcome[i];
        if (p[i] >= threshold)
            (cohort.outcome[i] ? tp : fp) += 1.0;
    }
    const double n = double(p.size());
    out.meanRisk = sum / n;
    out.flagged = (tp + fp) / n;
    if (threshold < 1.0) {
        const double odds = threshold / (1.0 - threshold);
        out.netBenefit = tp / n - fp / n * odds;
        out.netBenefitTreatAll = events / n - (n - events) / n * odds;
    }
    return out;
}

void calibrationFindings(const DecisionSummaryModel& m, const std::string& section, std::vector<DecisionFinding>& out)
{
    if (m.oe.value) {
        const double oe = *m.oe.value;
        if (excludes(m.oe, 1.0) && oe < 1.0)
            out.push_back({m.name + " over-predicts overall: about " + percent(1.0 - oe) + " fewer events were observed than its risks "
                               "predict (" + stated("O/E", m.oe, 2) + ").", section});
        else if (excludes(m.oe, 1.0))
            out.push_back({m.name + " under-predicts overall: about " + percent(oe - 1.0) + " more events were observed than its risks "
                               "predict (" + stated("O/E", m.oe, 2) + ").", section});
        else
            out.push_back({m.name + ": observed events are consistent with its risks overall (" + stated("O/E", m.oe, 2) + ").", section});
    }
    // Overall accuracy against the simplest rival: everyone given the event rate (scaled Brier 0).
    if (m.scaledBrier.value && m.scaledBrier.lower && m.scaledBrier.upper) {
        if (*m.scaledBrier.upper < 0.0)
            out.push_back({m.name + "'s risks are less accurate overall than giving everyone the event rate ("
                               + stated("scaled Brier", m.scaledBrier, 3) + ").", section});
        else if (*m.scaledBrier.lower <= 0.0)
            out.push_back({m.name + "'s risks are not clearly more accurate overall than giving everyone the event rate ("
                               + stated("scaled Brier", m.scaledBrier, 3) + ").", section});
    }
    if (m.calibrationSlope.value) {
        const double slope = *m.calibrationSlope.value;
        const std::string how = slope < 0.8 || slope > 1.25 ? "clearly" : "slightly"; // common practice: 0.8 and 1.25
        if (excludes(m.calibrationSlope, 1.0) && slope < 1.0)
            out.push_back({m.name + "'s risks are " + how + " too extreme: they spread too far from the average, so high risks run too high and low risks too low relative to the overall level ("
                               + stated("calibration slope", m.calibrationSlope, 2) + ").", section});
        else if (excludes(m.calibrationSlope, 1.0))
            out.push_back({m.name + "'s risks are " + how + " too moderate: too close to the average ("
                               + stated("calibration slope", m.calibrationSlope, 2) + ").", section});
    }
}

void usefulnessFinding(const DecisionSummaryModel& m, double threshold, const std::string& section, std::vector<DecisionFinding>& out)
{
    if (!m.netBenefit || !m.netBenefitTreatAll)
        return;
    const std::string at = "At the decision threshold " + fixedText(threshold, 2) + ", acting on " + m.name + " flags "
        + percent(m.flagged) + " of patients with net benefit " + fixedText(*m.netBenefit, 4) + " (treating everyone "
        + fixedText(*m.netBenefitTreatAll, 4) + ", no one 0)";
    const double best = std::max(*m.netBenefitTreatAll, 0.0);
    if (*m.netBenefit > best)
        out.push_back({at + ": it does better than either default at this threshold (point estimates; the decision curve shows "
                            "their uncertainty).", section});
    else
        out.push_back({at + ": it does not do better than " + (*m.netBenefitTreatAll > 0.0 ? "treating everyone" : "treating no one")
                           + " at this threshold.", section});
}

void subgroupFindings(const ValidationResult& r, const std::string& section, std::vector<DecisionFinding>& out)
{
    if (!r.subgroups)
        return;
    for (const auto& h : r.subgroups->heterogeneity)
        if (h.df > 0 && h.pValue < 0.05)
            out.push_back({metricLabel(h.metric) + " of " + h.model + " differs between the levels of " + h.column + " (Cochran's Q "
                               + fixedText(h.q, 2) + ", " + std::to_string(h.df) + " df, " + pValueText(h.pValue) + ").", section});
    // Per column and model, the level whose calibration slope is furthest from 1 with an
    // interval that excludes 1: where the model's spread of risks fits worst.
    struct Worst {
        std::string column, model, level;
        Estimate slope;
    };
    std::vector<Worst> worst;
    for (const auto& g : r.subgroups->results) {
        if (g.tooSmall)
            continue;
        const Estimate& slope = g.panel.metrics[CalibrationSlope].estimate;
        if (!excludes(slope, 1.0))
            continue;
        auto it = std::find_if(worst.begin(), worst.end(), [&](const Worst& w) { return w.column == g.column && w.model == g.model; });
        if (it == worst.end())
            worst.push_back({g.column, g.model, g.level, slope});
        else if (std::abs(std::log(*slope.value)) > std::abs(std::log(*it->slope.value)))
            *it = {g.column, g.model, g.level, slope};
    }
    for (const auto& w : worst)
        out.push_back({w.model + "'s risks are " + (*w.slope.value < 1.0 ? "too extreme" : "too moderate") + " at " + w.column + " "
                           + w.level + " (" + stated("calibration slope", w.slope, 2) + ").", section});
}

// Drift in plain words: the period warnings, and the first year's O/E beside the latest months'.
void periodFindings(const ValidationResult& r, const std::string& section, std::vector<DecisionFinding>& out)
{
    if (r.periods) {
        for (const auto& warning : r.periods->warnings)
            out.push_back({warning, section});
        // Where the model stands now against where it started, in numbers: the first year's O/E
        // beside the latest 12 months', judged on whether their intervals overlap.
        const auto& p = *r.periods;
        for (std::size_t m = 0; m < p.latestYear.size() && m < p.firstYear.size() && !p.latestYearPeriods.empty(); ++m) {
            const Estimate& first = p.firstYear[m].oe;
            const Estimate& latest = p.latestYear[m].oe;
            if (!first.value || !latest.value)
                continue;
            const bool apart = first.lower && first.upper && latest.lower && latest.upper
                               && (*latest.upper < *first.lower || *latest.lower > *first.upper);
            auto span = [](const std::vector<std::string>& list) {
                return list.front() + (list.size() > 1 ? " to " + list.back() : "");
            };
            auto value = [](const Estimate& e) {
                return fixedText(*e.value, 2) + (e.lower && e.upper ? " (" + fixedText(*e.lower, 2) + " to " + fixedText(*e.upper, 2) + ")" : "");
            };
            const std::string direction = *latest.value < *first.value ? "fewer" : "more";
            out.push_back({p.latestYear[m].model + ": O/E " + value(first) + " in the first year (" + span(p.firstYearPeriods) + ") and "
                               + value(latest) + " in the latest months (" + span(p.latestYearPeriods) + ")"
                               + (apart ? ": calibration has changed - " + direction + " events are now observed against its risks than at "
                                              "the start; look for changes in care, coding or case mix."
                                        : ": no clear change since the first year."),
                           section});
        }
    }
}

void comparisonFindings(const ValidationResult& r, const std::string& section, std::vector<DecisionFinding>& out)
{
    for (const auto& c : r.comparisons) {
        const DifferenceEstimate* dc = c.difference("c_statistic_difference");
        if (dc && excludes(dc->estimate, 0.0))
            out.push_back({c.modelB + (*dc->estimate.value > 0.0 ? " discriminates better than " : " discriminates less well than ")
                               + c.modelA + " on the same patients (" + stated("difference in C", dc->estimate, 3) + ").", section});
        const DifferenceEstimate* db = c.difference("brier_difference");
        if (db && excludes(db->estimate, 0.0))
            out.push_back({c.modelB + (*db->estimate.value < 0.0 ? " is more accurate overall than " : " is less accurate overall than ")
                               + c.modelA + " (" + stated("difference in Brier score", db->estimate, 4) + ").", section});
    }
}

} // namespace

DecisionSummary summariseForDecision(const Cohort& cohort, const ValidationResult& result, double decisionThreshold,
                                     const DecisionSections& sections, const std::vector<bool>& netBenefitWithheld)
{
    DecisionSummary out;
    out.patients = cohort.rows();
    out.events = cohort.events();
    out.eventRate = out.patients ? double(out.events) / double(out.patients) : 0.0;
    out.decisionThreshold = decisionThreshold;
    for (std::size_t m = 0; m < result.models.size() && m < cohort.models.size(); ++m)
        out.models.push_back(summariseModel(cohort, m, result.models[m], decisionThreshold));
    for (std::size_t m = 0; m < out.models.size() && m < netBenefitWithheld.size(); ++m)
        if (netBenefitWithheld[m] && out.models[m].netBenefit) {
            out.models[m].netBenefit.reset();
            out.models[m].netBenefitWithheld = true;
        }
    for (const auto& m : out.models) {
        if (m.c.value)
            out.findings.push_back({m.name + ": " + metricReading("c_statistic", m.c) + " (" + stated("C", m.c, 3) + ").", sections.results});
        if (m.risks) {
            calibrationFindings(m, sections.results, out.findings);
            usefulnessFinding(m, decisionThreshold, sections.results, out.findings);
            if (m.netBenefitWithheld)
                out.findings.push_back({"At the decision threshold " + fixedText(decisionThreshold, 2) + ", the net benefit of " + m.name
                                            + " is withheld: a count behind it is below the small-cell minimum.", sections.results});
        }
    }
    comparisonFindings(result, sections.comparisons, out.findings);
    subgroupFindings(result, sections.subgroups, out.findings);
    periodFindings(result, sections.subgroups, out.findings);
    return out;
}

} // namespace plumbline
