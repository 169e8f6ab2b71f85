#include "report/report_document.hpp"
#include "report/capacity_report_table.hpp"
#include "report/site_pooling_report.hpp"

#include "report/monitoring_section.hpp"

#include "reporting/cautions.hpp"
#include "reporting/decision_summary.hpp"
#include "reporting/disclosure_plan.hpp"
#include "resampling/interval_choice.hpp"
#include "metrics/metric_definitions.hpp"
#include "metrics/metric_reading.hpp"
#include "analyses/model_comparison.hpp"
#include "intake/printable_text.hpp"
#include "metrics/panel_keys.hpp"
#include "intake/sha256.hpp"
#include "reporting/value_text.hpp"
#include "files/version.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <filesystem>

namespace plumbline {

namespace {

// Report numbers share the window's formatting: no "-0.000" for a value that rounds to zero.
std::string fixed(double value, int digits)
{
    return fixedText(value, digits);
}

ReportCell numberCell(std::optional<double> value, int digits)
{
    if (!value)
        return {"not computed", std::nullopt, false};
    return {fixed(*value, digits), *value, false};
}

ReportCell textCell(std::string text)
{
    return {std::move(text), std::nullopt, false};
}

// A p-value as people read it ("< 0.001", "= 0.372"); the exact number stays for spreadsheets.
ReportCell pCell(double p)
{
    std::string text = pValueText(p);
    if (text.starts_with("p "))
        text.erase(0, 2);
    return {text, p, false};
}

// A count as the disclosure plan shows it: "suppressed" when it is small or would reveal a small
// one - one marker for both, since "<11" beside "suppressed" tells a reader which hidden cell is
// the small one and bounds the other - else itself (zero is shown: it reveals nobody).
ReportCell countCell(const CountShown& count, std::size_t /*minimumCell*/)
{
    if (count.primary || count.suppressed)
        return {"suppressed", std::nullopt, true};
    return {std::to_string(count.value), double(count.value), false};
}

// A count the small-cell rule publishes as it is (data-quality exclusions).
ReportCell plainCount(std::size_t count)
{
    return {std::to_string(count), double(count), false};
}

// A number left out because it would reveal a suppressed count.
ReportCell withheldCell()
{
    return {"withheld", std::nullopt, true};
}

int digitsFor(const std::string& key)
{
    return key == "ici" || key == "e50" || key == "e90" || key == "emax" || key == "brier" ? 4 : 3;
}

// "0.700 to 0.740" with its ends kept as numbers for the workbook and CSV.
ReportCell rangeCell(double lower, double upper, int digits)
{
    return {fixed(lower, digits) + " to " + fixed(upper, digits), std::nullopt, false, std::pair{lower, upper}};
}

ReportCell intervalCell(const Estimate& e, int digits)
{
    return e.lower && e.upper ? rangeCell(*e.lower, *e.upper, digits) : ReportCell{"-"};
}

ReportTable metricTable(const std::string& id, const std::string& title, const ValidationResult& v,
                        std::initializer_list<PanelMetric> metrics)
{
    ReportTable t{id, title, {"Model", "Metric", "Estimate", "Interval", "Interval from", "Reading"}, {}, {}, {}};
    std::vector<std::pair<std::string, std::string>> notes; // why an interval other than the one asked for is reported: reason, metrics
    for (const auto& model : v.models)
        for (PanelMetric k : metrics) {
            const MetricEntry& e = model.metrics[k];
            const int digits = digitsFor(e.key);
            t.rows.push_back({textCell(model.name), textCell(metricLabel(e.key)), numberCell(e.estimate.value, digits),
                              e.estimate.value ? intervalCell(e.estimate, digits) : textCell("-"),
                              textCell(e.estimate.lower ? ciMethodLabel(e.estimate.ciMethod) : "-"),
                              textCell(e.estimate.value ? e.reading : "not computed: see the warnings")});
            if (e.estimate.value && !e.intervalNote.empty()) {
                const std::string who = model.name + " " + metricLabel(e.key);
                auto same = std::find_if(notes.begin(), notes.end(), [&](const auto& n) { return n.first == e.intervalNote; });
                if (same == notes.end())
                    notes.emplace_back(e.intervalNote, who);
                else
                    same->second += ", " + who;
            }
        }
    // Metrics sharing a reason share a sentence, so a small cohort's notes stay short.
    t.note = "Intervals at the " + fixed(v.settings.confidence * 100.0, 0) + " % level.";
    for (const auto& [reason, who] : notes)
        t.note += " " + who + ": " + reason + ".";
    return t;
}

// Common practice: 1000 or more replicates for interval ends (BCa's above all) that hold from one
// seed to the next.
std::string replicatesCaution(std::size_t replicates)
{
    return std::to_string(replicates) + " bootstrap replicates: the interval ends may move with another seed; use 1000 to 2000 "
                                        "for the report of record.";
}

// The inputs' fingerprints and every setting that changes a number, hashed.
std::string documentIdOf(const AnalysisSnapshot& s)
{
    const AnalysisRequest& r = s.request;
    std::string basis;
    for (const auto& input : s.inputs)
        basis += input.role + ":" + input.sha256 + ";";
    basis += "outcome=" + r.intake.outcomeColumn + ";scale=" + std::string(scaleName(r.intake.scale)) + ";scores=";
    for (const auto& score : r.intake.scoreColumns)
        basis += score + ",";
    basis += ";groups=";
    for (const auto& group : r.intake.groupColumns)
        basis += group + ",";
    basis += ";period=" + r.intake.periodColumn.value_or("") + ";thresholds=";
    for (double t : r.panel.thresholds)
        basis += fixedText(t, 6) + ",";
    basis += ";confidence=" + fixedText(r.panel.confidence, 6) + ";groups=" + std::to_string(r.panel.riskGroups)
        + ";decision=" + fixedText(r.panel.decisionThreshold, 6) + ";replicates=" + std::to_string(r.bootstrap.replicates)
        + ";seed=" + std::to_string(r.bootstrap.seed) + ";method=" + std::string(bootstrapCiName(r.bootstrap.method))
        + ";stratified=" + (r.bootstrap.stratified ? "1" : "0") + ";min-cell=" + std::to_string(r.minimumCell)
        + ";version=" + versionString;
    return "PL-" + sha256Hex(basis).substr(0, 12);
}

// Page 1: what was validated, on whom, the key numbers per model side by side, the findings in
// plain words with the section that shows each, every warning and the cautions.
ReportSection decisionSummarySection(const AnalysisSnapshot& s, const ValidationResult& v, const DisclosurePlan& plan,
                                     const ReportFields& f, const std::string& created)
{
    ReportSection section{"1. Decision summary", {}, {}, {}, {}, true};
    auto stated = [](const std::string& value) { return value.empty() ? std::string("(not stated - fill in before sign-off)") : value; };
    section.paragraphs.push_back("Model and version: " + stated(f.model) + ". Outcome and horizon: " + stated(f.outcome)
                                 + ". Population: " + stated(f.population) + ". Period: " + stated(f.period) + ".");
    const double threshold = s.request.panel.decisionThreshold;
    DecisionSections where{"section 4", "section 6", "section 5"};
    const DecisionSummary summary = s.cohort ? summariseForDecision(*s.cohort, v, threshold, where, plan.decisionThresholdWithheld)
                                             : DecisionSummary{};
    section.paragraphs.push_back("Cohort: " + std::to_string(summary.patients) + " patients, " + std::to_string(summary.events)
                                 + " with the event (event rate " + fixed(100.0 * summary.eventRate, 1) + " %). Report created "
                                 + created + " with Plumbline " + versionString + ".");
    std::vector<std::string> headers{"Measure"};
    for (const auto& m : summary.models)
        headers.push_back(m.name);
    ReportTable table{"summary", "Key results (" + fixed(v.settings.confidence * 100.0, 0) + " % intervals)", headers, {}, {}, {}};
    auto row = [&](const std::string& label, auto cell) {
        std::vector<ReportCell> cells{textCell(label)};
        for (const auto& m : summary.models)
            cells.push_back(cell(m));
        table.rows.push_back(cells);
    };
    auto estimate = [](const Estimate& e, int digits) {
        if (!e.value)
            return ReportCell{"not computed"};
        std::optional<std::pair<double, double>> interval;
        if (e.lower && e.upper)
            interval = std::pair{*e.lower, *e.upper};
        return ReportCell{estimateText(e, digits), *e.value, false, interval};
    };
    row("C statistic", [&](const DecisionSummaryModel& m) { return estimate(m.c, 3); });
    row("Observed / expected", [&](const DecisionSummaryModel& m) { return estimate(m.oe, 2); });
    row("Calibration-in-the-large", [&](const DecisionSummaryModel& m) { return estimate(m.calibrationInTheLarge, 2); });
    row("Calibration slope", [&](const DecisionSummaryModel& m) { return estimate(m.calibrationSlope, 2); });
    row("Scaled Brier score", [&](const DecisionSummaryModel& m) { return estimate(m.scaledBrier, 3); });
    row("Mean predicted risk (event rate " + fixed(summary.eventRate, 3) + ")", [&](const DecisionSummaryModel& m) {
        return m.risks ? ReportCell{fixed(m.meanRisk, 3), m.meanRisk, false} : textCell("not a risk");
    });
    // Brackets hold intervals everywhere else in this table: treat-all has its own row.
    row("Net benefit at " + fixed(threshold, 2), [&](const DecisionSummaryModel& m) {
        if (m.netBenefitWithheld)
            return withheldCell();
        return m.netBenefit ? ReportCell{fixed(*m.netBenefit, 4), *m.netBenefit, false}
                            : textCell("not a risk");
    });
    row("Net benefit of treating everyone at " + fixed(threshold, 2), [&](const DecisionSummaryModel& m) {
        return m.netBenefitTreatAll ? ReportCell{fixed(*m.netBenefitTreatAll, 4), *m.netBenefitTreatAll, false} : textCell("not a risk");
    });
    table.note = "Net benefit counts patients with risk >= " + fixed(threshold, 2)
        + " as flagged: the decision threshold set for this analysis (--decision-threshold; 0.20 unless changed), to be confirmed "
          "as the one the care team will act on. Treating no one has net benefit 0.";
    section.tables.push_back(table);
    section.closing.push_back("Findings");
    std::vector<std::string> told; // a warning already given as a finding is not repeated
    for (const auto& finding : summary.findings) {
        section.closing.push_back("- " + finding.text + " (" + finding.section + ")");
        told.push_back(finding.text);
    }
    std::vector<std::string> others;
    for (const auto* list : {&s.audit.warnings, &v.warnings})
        for (const auto& w : *list)
            if (std::find(told.begin(), told.end(), w) == told.end())
                others.push_back("Warning: " + w);
    if (s.request.bootstrap.replicates > 0 && s.request.bootstrap.replicates < 1000)
        others.push_back("Warning: " + replicatesCaution(s.request.bootstrap.replicates));
    if (plan.suppressedCells > 0)
        others.push_back("Warning: " + std::to_string(plan.suppressedCells) + " counts are suppressed under the small-cell rule, "
                         "with the rates, intervals and net benefits that would reveal them (section 8).");
    section.closing.push_back(others.empty() ? "No other warning was raised (the cautions are at the top of page 1)"
                                             : "Every other warning of the run (the cautions are at the top of page 1)");
    section.closing.insert(section.closing.end(), others.begin(), others.end());
    return section;
}

ReportSection provenanceSection(const AnalysisSnapshot& s)
{
    ReportSection section{"2. Data provenance", {}, {}, {}, {}, false};
    ReportTable inputs{"inputs", "Input files", {"Role", "File", "SHA-256", "Data rows"}, {}, {}, {}};
    for (const auto& input : s.inputs) {
        // A query is named by its database's address (not a path); a workbook with its sheet.
        const std::string source = input.query ? input.path + " (query result)"
                                               : std::filesystem::path(input.path).filename().string()
                + (input.sheet ? ", sheet '" + *input.sheet + "'" : std::string());
        inputs.rows.push_back({textCell(input.role), textCell(source), textCell(input.sha256),
                               {std::to_string(input.rows), double(input.rows), false}});
    }
    section.tables.push_back(inputs);
    for (const auto& input : s.inputs)
        if (input.query)
            section.paragraphs.push_back("The cohort is the result of this query (the SHA-256 in the table of input files is of the result as read: column "
                                         "names, then every cell's type and value): " + *input.query);
    for (const auto& warning : s.request.inputWarnings)
        section.paragraphs.push_back("Input check: " + warning);
    const IntakeAudit& a = s.audit;
    section.paragraphs.push_back("Rows read " + std::to_string(a.rowsRead) + "; used " + std::to_string(a.rowsUsed) + " ("
                                 + std::to_string(a.events) + " with the event, " + std::to_string(a.nonEvents)
                                 + " without); excluded " + std::to_string(a.rowsExcluded()) + ".");
    ReportTable exclusions{"exclusions", "Rows excluded, by reason", {"Reason", "Column", "Rows"}, {}, {}, {}};
    for (const auto& tally : a.exclusions)
        exclusions.rows.push_back({textCell(exclusionReasonText(tally.reason)), textCell(tally.column.empty() ? "-" : tally.column),
                                   plainCount(tally.rows)});
    if (exclusions.rows.empty())
        exclusions.rows.push_back({textCell("none"), textCell("-"), {"0", 0.0, false}});
    exclusions.note = "Each excluded row counts once, under the first reason that applies. Data-quality counts, not patient "
                      "cells: shown as they are.";
    section.tables.push_back(exclusions);
    if (a.join)
        section.paragraphs.push_back("Scores and outcomes joined on the id: " + std::to_string(a.join->matched) + " matched; "
                                     + std::to_string(a.join->scoresWithoutOutcome) + " score rows without an outcome; "
                                     + std::to_string(a.join->outcomesWithoutScore) + " outcome rows without a score row.");
    return section;
}

ReportSection settingsSection(const AnalysisSnapshot& s, const DisclosurePlan& plan)
{
    const AnalysisRequest& r = s.request;
    ReportSection section{"3. Settings", {}, {}, {}, {}, false};
    ReportTable t{"settings", "Analysis settings", {"Setting", "Value"}, {}, {}, {}};
    std::string thresholds;
    for (double x : r.panel.thresholds) {
        if (!thresholds.empty())
            thresholds.append(", ");
        thresholds.append(fixed(x, 3));
    }
    std::string scores;
    for (const auto& score : r.intake.scoreColumns) {
        if (!scores.empty())
            scores.append(", ");
        scores.append(score);
    }
    auto row = [&](const std::string& name, const std::string& value) { t.rows.push_back({textCell(name), textCell(value)}); };
    row("Outcome column", r.intake.outcomeColumn + " (event = '" + s.audit.eventValue + "')");
    row("Score columns", scores);
    row("Score scale", std::string(scaleName(r.intake.scale)));
    row("Decision thresholds (positive if risk >= t)", thresholds);
    auto list = [](const std::vector<double>& values, int digits) {
        std::string out;
        for (double x : values)
            out += (out.empty() ? "" : ", ") + fixed(x, digits);
        return out;
    };
    auto names = [](const std::vector<std::string>& values) {
        std::string out;
        for (const auto& x : values)
            out += (out.empty() ? "" : ", ") + x;
        return out.empty() ? std::string("none") : out;
    };
    row("Decision threshold (confirm it is the one the care team will act on)", fixed(r.panel.decisionThreshold, 3));
    row("Decision curve thresholds (from, to, step)",
        fixed(r.panel.decisionFrom, 3) + ", " + fixed(r.panel.decisionTo, 3) + ", " + fixed(r.panel.decisionStep, 3));
    row("NRI cut-points", list(r.panel.cutPoints(), 3) + (r.panel.nriCutPoints.empty() ? " (the thresholds)" : ""));
    row("Subgroup columns", names(r.intake.groupColumns));
    row("Period column and unit", r.intake.periodColumn ? *r.intake.periodColumn + ", by "
                                        + (r.panel.periodUnit == PeriodUnit::Month ? "month" : "quarter") : "none");
    row("Interval methods", std::string("C: DeLong (") + (r.panel.cStatisticScale == CStatisticScale::Logit ? "logit" : "plain")
                                + " scale); calibration intercept and slope: Wald; O/E: log-normal, exact Poisson below 10 events; "
                                  "proportions: " + ciMethodLabel(r.panel.binomialInterval)
                                + (r.bootstrap.replicates > 0 ? "; with the bootstrap: " + bootstrapCiLabel(r.bootstrap.method)
                                                                    + " under the rule of section 8; differences between models: "
                                                                      "percentile intervals of paired resamples"
                                                              : ""));
    row("Risk groups", std::to_string(r.panel.riskGroups));
    row("Confidence level", fixed(r.panel.confidence, 3));
    row("C statistic interval", std::string(r.panel.cStatisticScale == CStatisticScale::Logit ? "DeLong, logit scale" : "DeLong, plain scale")
                                    + (r.bootstrap.replicates > 0 ? "; the bootstrap's where the rule of section 8 prefers it" : ""));
    // Common practice: 1000 or more replicates for interval ends (BCa's above all) that do not
    // move from one seed to the next.
    row("Bootstrap replicates", std::to_string(r.bootstrap.replicates)
                                    + (r.bootstrap.replicates > 0 && r.bootstrap.replicates < 1000
                                           ? " (fewer than 1000: the interval ends may move with another seed; use 1000 to 2000 "
                                             "for the report of record)"
                                           : ""));
    row("Bootstrap seed", std::to_string(r.bootstrap.seed));
    row("Bootstrap interval", r.bootstrap.replicates > 0 ? bootstrapCiLabel(r.bootstrap.method) + (r.bootstrap.stratified ? ", stratified" : "")
                                                          : "none (analytic only)");
    row("Small-cell rule", "counts of 1 to " + std::to_string(plan.minimumCell - 1)
                               + " suppressed, with complementary suppression across the report (section 8)");
    row("Software", std::string("Plumbline ") + versionString);
    row("Document id (inputs' SHA-256 and these settings)", documentIdOf(s));
    section.tables.push_back(t);
    return section;
}

ReportSection resultsSection(const AnalysisSnapshot& s, const ValidationResult& shown, const DisclosurePlan& plan)
{
    const ValidationResult& v = s.validation;
    const std::size_t minimumCell = plan.minimumCell;
    ReportSection section{"4. Results", {}, {}, {{ReportChart::Roc}, {ReportChart::Calibration}, {ReportChart::DecisionCurve}}, {}, false};
    section.tables.push_back(metricTable("discrimination", "Discrimination", v, {CStatistic, Auprc, DiscriminationSlope}));
    section.tables.push_back(metricTable("calibration", "Calibration", v,
                                         {CalibrationIntercept, CalibrationSlope, RecalibrationIntercept, OeRatio, Ici, E50, E90, Emax}));
    section.tables.push_back(metricTable("overall_accuracy", "Overall accuracy", v, {Brier, ScaledBrier, LogLoss, NagelkerkeR2}));
    ReportTable tests{"calibration_tests", "Calibration tests", {"Model", "Test", "Statistic", "df", "p-value"}, {}, {}, {}};
    for (std::size_t k = 0; k < v.models.size(); ++k) {
        const ModelValidation& m = v.models[k];
        if (m.hosmerLemeshow && !shown.models[k].hosmerLemeshow)
            tests.rows.push_back({textCell(m.name), textCell("Hosmer-Lemeshow (df = groups: external validation)"), withheldCell(),
                                  withheldCell(), withheldCell()});
        else if (m.hosmerLemeshow)
            tests.rows.push_back({textCell(m.name), textCell("Hosmer-Lemeshow (df = groups: external validation)"),
                                  numberCell(m.hosmerLemeshow->statistic, 2), {std::to_string(m.hosmerLemeshow->df), double(m.hosmerLemeshow->df), false},
                                  pCell(m.hosmerLemeshow->pValue)});
        if (m.spiegelhalter)
            tests.rows.push_back({textCell(m.name), textCell("Spiegelhalter z"), numberCell(m.spiegelhalter->z, 3), textCell("-"),
                                  pCell(m.spiegelhalter->pValue)});
        if (m.likelihoodRatio && m.likelihoodRatio->joint)
            tests.rows.push_back({textCell(m.name), textCell("Likelihood ratio: intercept 0 and slope 1"),
                                  numberCell(m.likelihoodRatio->joint->statistic, 2), {"2", 2.0, false}, pCell(m.likelihoodRatio->joint->pValue)});
    }
    tests.note = "Large cohorts reject clinically unimportant miscalibration: read the risk-group table and the curve.";
    section.tables.push_back(tests);
    ReportTable groups{"risk_groups", "Risk groups", {"Model", "Group", "Patients", "Events", "Expected", "Mean predicted", "Observed", "Interval"}, {}, {}, {}};
    for (std::size_t k = 0; k < v.models.size(); ++k)
        for (std::size_t i = 0; i < v.models[k].riskGroups.size(); ++i) {
            const RiskGroup& g = v.models[k].riskGroups[i];
            // Expected = patients x mean predicted, and the rate and its interval give the events.
            const bool withheld = plan.riskGroupWithheld(k, i);
            groups.rows.push_back({textCell(v.models[k].name), {std::to_string(g.group), double(g.group), false},
                                   countCell(plan.riskGroups[k][i][0], minimumCell), countCell(plan.riskGroups[k][i][1], minimumCell),
                                   withheld ? withheldCell() : numberCell(g.expected, 1), numberCell(g.meanPredicted, 4),
                                   withheld ? withheldCell() : numberCell(g.observedRate, 4),
                                   withheld ? withheldCell() : rangeCell(g.ciLower, g.ciUpper, 4)});
        }
    groups.note = "Groups of about equal size by predicted risk; equal risks are never split. Where a count is suppressed, the "
                  "expected events, rate and interval that would reveal it are withheld (section 8).";
    section.tables.push_back(groups);
    ReportTable thresholds{"thresholds", "Decision thresholds and net benefit (positive if risk >= threshold)",
                           {"Model", "Threshold", "TP", "FP", "TN", "FN", "Sensitivity", "Specificity", "PPV", "NPV", "Flagged",
                            "Net benefit", "Treat all"}, {}, {}, {}};
    for (std::size_t k = 0; k < v.models.size(); ++k)
        for (std::size_t i = 0; i < v.models[k].thresholds.size(); ++i) {
            const ThresholdMetrics& t = v.models[k].thresholds[i];
            const auto& counts = plan.thresholds[k][i];
            // Every proportion and the net benefit are built on the four counts.
            const bool withheld = plan.thresholdWithheld(k, i);
            auto derived = [&](std::optional<double> value, int digits) { return withheld ? withheldCell() : numberCell(value, digits); };
            thresholds.rows.push_back({textCell(v.models[k].name), numberCell(t.threshold, 3), countCell(counts[0], minimumCell),
                                       countCell(counts[1], minimumCell), countCell(counts[2], minimumCell), countCell(counts[3], minimumCell),
                                       derived(t.sensitivity.value, 3), derived(t.specificity.value, 3), derived(t.ppv.value, 3),
                                       derived(t.npv.value, 3), derived(t.flagRate.value, 3), derived(t.netBenefit, 4),
                                       numberCell(t.netBenefitTreatAll, 4)});
        }
    section.tables.push_back(thresholds);
    if (auto capacity = capacityTable(v, plan))
        section.tables.push_back(std::move(*capacity));
    ReportTable decision{"net_benefit", "Decision curve: net benefit by threshold (treat none = 0)",
                         {"Model", "Threshold", "Net benefit", "Interval", "Treat all", "Standardised", "Net reduction per 100"}, {}, {}, {}};
    for (std::size_t k = 0; k < v.models.size(); ++k)
        for (std::size_t i = 0; i < v.models[k].decisionCurve.size(); ++i) {
            const DecisionCurvePoint& p = v.models[k].decisionCurve[i];
            if (plan.decisionCurveWithheld[k][i])
                decision.rows.push_back({textCell(v.models[k].name), numberCell(p.threshold, 2), withheldCell(), withheldCell(),
                                         numberCell(p.treatAll, 4), withheldCell(), withheldCell()});
            else
                // A net reduction in interventions means something only where the model does some good.
                decision.rows.push_back({textCell(v.models[k].name), numberCell(p.threshold, 2), numberCell(p.netBenefit, 4),
                                         p.lower ? rangeCell(*p.lower, *p.upper, 4) : textCell("-"), numberCell(p.treatAll, 4),
                                         numberCell(p.standardized, 4),
                                         p.netBenefit > 0.0 ? numberCell(p.netReductionPer100, 2) : textCell("-")});
            const double twentieths = p.threshold * 20.0;
            decision.onlyInData.push_back(std::abs(twentieths - std::round(twentieths)) > 1e-9);
        }
    decision.note = "Net reduction in interventions per 100 patients against treating everyone (Vickers et al. 2008), shown where "
                    "the model's net benefit is positive. Read only the thresholds the care team would use. Printed every 0.05; "
                    "the workbook and CSV hold the whole grid.";
    section.tables.push_back(decision);
    return section;
}

ReportSection subgroupSection(const AnalysisSnapshot& s, const ValidationResult& shown, const DisclosurePlan& plan)
{
    const ValidationResult& v = s.validation;
    const std::size_t minimumCell = plan.minimumCell;
    ReportSection section{"6. Subgroups, sites and performance over time", {}, {}, {}, {}, false};
    if (!v.subgroups && !v.periods && !v.sites)
        section.paragraphs.push_back("Not part of this analysis (no subgroup, period or site column).");
    addSitePooling(section, shown);
    if (v.subgroups)
        // Every column and model: forests of C, O/E and slope, the curves by level, the funnel.
        for (std::size_t column = 0; s.cohort && column < s.cohort->groups.size(); ++column)
            for (std::size_t m = 0; m < v.models.size(); ++m)
                for (ReportChart kind : {ReportChart::SubgroupC, ReportChart::SubgroupOe, ReportChart::SubgroupSlope,
                                         ReportChart::SubgroupCalibration, ReportChart::SubgroupFunnel})
                    section.charts.push_back({kind, int(column * v.models.size() + m)});
    if (v.periods)
        for (std::size_t m = 0; m < v.models.size(); ++m)
            for (ReportChart kind : {ReportChart::OverTimeOe, ReportChart::OverTimeC})
                section.charts.push_back({kind, int(m)});
    if (v.subgroups) {
        ReportTable groups{"subgroups", "Performance within subgroups",
                           {"Column", "Level", "Model", "Patients", "Events", "C statistic", "C interval", "O/E", "O/E interval",
                            "Calibration slope", "Slope interval", "Scaled Brier", "Note"}, {}, {}, {}};
        for (std::size_t i = 0; i < v.subgroups->results.size(); ++i) {
            const SubgroupResult& r = v.subgroups->results[i];
            const bool withheld = plan.subgroupWithheld(i) && !r.tooSmall;
            const Estimate& c = r.panel.metrics[CStatistic].estimate;
            const Estimate& oe = r.panel.metrics[OeRatio].estimate;
            const Estimate& slope = r.panel.metrics[CalibrationSlope].estimate;
            const Estimate& brier = r.panel.metrics[ScaledBrier].estimate;
            auto value = [&](const Estimate& e, int digits) {
                return withheld ? withheldCell() : numberCell(r.tooSmall ? std::nullopt : e.value, digits);
            };
            auto interval = [&](const Estimate& e, int digits) {
                return withheld ? withheldCell() : r.tooSmall ? textCell("-") : intervalCell(e, digits);
            };
            groups.rows.push_back({textCell(r.column), textCell(r.level), textCell(r.model), countCell(plan.subgroups[i][0], minimumCell),
                                   countCell(plan.subgroups[i][1], minimumCell), value(c, 3), interval(c, 3), value(oe, 3), interval(oe, 3),
                                   value(slope, 2), interval(slope, 2), value(brier, 3),
                                   textCell(r.tooSmall  ? "too small to estimate (shown, not hidden)"
                                            : withheld ? "counts suppressed: estimates withheld"
                                                       : "")});
        }
        groups.note = "Levels with fewer than " + std::to_string(minimumCell) + " patients, events or non-events are flagged and their "
                      "estimates withheld; so are those of a level whose counts are suppressed to protect another (section 8).";
        section.tables.push_back(groups);
        ReportTable het{"heterogeneity", "Do levels differ? Cochran's Q across levels", {"Column", "Model", "Metric", "Q", "df", "p-value"}, {}, {}, {}};
        for (const auto& h : v.subgroups->heterogeneity)
            het.rows.push_back({textCell(h.column), textCell(h.model), textCell(metricLabel(h.metric)), numberCell(h.q, 2),
                                {std::to_string(h.df), double(h.df), false}, h.df > 0 ? pCell(h.pValue) : textCell("-")});
        section.tables.push_back(het);
        ReportTable funnel{"funnel", "Funnel: observed/expected by level against control limits (Spiegelhalter 2005)",
                           {"Column", "Level", "Model", "Expected events", "O/E", "95 % limits", "99.8 % limits", "Signal"}, {}, {}, {}};
        for (const auto& f : v.subgroups->funnel) {
            const bool out95 = f.oe < f.lower95 || f.oe > f.upper95, out998 = f.oe < f.lower998 || f.oe > f.upper998;
            // O/E times expected events is the level's events; the limits give the expected events.
            const bool withheld = std::none_of(shown.subgroups->funnel.begin(), shown.subgroups->funnel.end(), [&](const FunnelPoint& g) {
                return g.column == f.column && g.level == f.level && g.model == f.model;
            });
            if (withheld)
                funnel.rows.push_back({textCell(f.column), textCell(f.level), textCell(f.model), withheldCell(), withheldCell(),
                                       withheldCell(), withheldCell(), textCell(out998 ? "outside 99.8 %" : out95 ? "outside 95 %" : "within")});
            else
                funnel.rows.push_back({textCell(f.column), textCell(f.level), textCell(f.model), numberCell(f.expected, 1),
                                       numberCell(f.oe, 3), rangeCell(f.lower95, f.upper95, 3), rangeCell(f.lower998, f.upper998, 3),
                                       textCell(out998 ? "outside 99.8 %" : out95 ? "outside 95 %" : "within")});
        }
        section.tables.push_back(funnel);
    }
    if (v.periods) {
        ReportTable periods{"periods", "Performance over time", {"Period", "Model", "Patients", "Events", "C statistic", "O/E", "O/E interval",
                                                                 "Calibration-in-the-large", "Against the first year"}, {}, {}, {}};
        for (std::size_t i = 0; i < v.periods->results.size(); ++i) {
            const PeriodResult& p = v.periods->results[i];
            if (plan.periodWithheld(i))
                periods.rows.push_back({textCell(p.period), textCell(p.model), countCell(plan.periods[i][0], minimumCell),
                                        countCell(plan.periods[i][1], minimumCell), withheldCell(), withheldCell(), withheldCell(),
                                        withheldCell(), textCell("")});
            else
                periods.rows.push_back({textCell(p.period), textCell(p.model), countCell(plan.periods[i][0], minimumCell),
                                        countCell(plan.periods[i][1], minimumCell), numberCell(p.c.value, 3), numberCell(p.oe.value, 3),
                                        intervalCell(p.oe, 3), numberCell(p.calibrationIntercept.value, 3),
                                        textCell(p.outsideFirstYear ? "outside its interval" : "")});
        }
        periods.note = v.periods->note;
        // The values every later period is compared with, so a reader can check each flag.
        ReportTable reference{"first_year", "The first year's values (which each later period is compared with) and the latest months'",
                              {"Model", "Months", "C statistic", "C interval", "O/E", "O/E interval", "Calibration-in-the-large", "Interval"},
                              {}, {}, {}};
        auto span = [](const std::vector<std::string>& list) {
            return list.empty() ? std::string("-") : list.size() == 1 ? list.front() : list.front() + " to " + list.back();
        };
        auto referenceRow = [&](const PeriodReference& r, const std::string& months, bool withheld) {
            reference.rows.push_back({textCell(r.model), textCell(months), numberCell(r.c.value, 3), intervalCell(r.c, 3),
                                      numberCell(r.oe.value, 3), withheld ? withheldCell() : intervalCell(r.oe, 3),
                                      numberCell(r.calibrationIntercept.value, 3), intervalCell(r.calibrationIntercept, 3)});
        };
        for (std::size_t m = 0; m < v.periods->firstYear.size(); ++m) {
            referenceRow(v.periods->firstYear[m], "first year (" + span(v.periods->firstYearPeriods) + ")", plan.firstYearEventsWithheld);
            if (m < v.periods->latestYear.size())
                referenceRow(v.periods->latestYear[m], "latest (" + span(v.periods->latestYearPeriods) + ")", plan.latestYearEventsWithheld);
        }
        reference.note = "A later period is flagged when the interval of its O/E or calibration-in-the-large does not overlap "
                         "the first year's. The latest months are the last 12 after the first year (fewer when the data are shorter).";
        section.tables.push_back(reference);
        section.tables.push_back(periods);
    }
    addMonitoring(section, v, minimumCell);
    ReportTable precision{"precision", "Precision achieved", {"Model", "Metric", "Interval width", "Common target", "Met"}, {}, {}, {}};
    for (const auto& p : v.precision)
        precision.rows.push_back({textCell(p.model), textCell(metricLabel(p.metric)), numberCell(p.width, 3), numberCell(p.target, 2),
                                  textCell(p.width <= p.target ? "yes" : "no")});
    precision.note = "Targets as in the sample-size criteria of Riley et al. 2021 (CI width 0.1 for C, 0.2 for O/E and the slope; "
                     "common choices). Plan a study with plumbline-cli plan.";
    section.tables.push_back(precision);
    return section;
}

ReportSection comparisonSection(const AnalysisSnapshot& s, const ValidationResult& shown, const DisclosurePlan& plan)
{
    const std::size_t minimumCell = plan.minimumCell;
    ReportSection section{"5. Comparisons and updating", {}, {}, {}, {}, false};
    const ValidationResult& v = s.validation;
    if (v.comparisons.empty() && s.updates.empty()) {
        section.paragraphs.push_back("Not part of this analysis: one model, not updated.");
        return section;
    }
    ReportTable differences{"comparisons", "Differences between models on the same patients (B - A)",
                            {"Model A", "Model B", "Difference", "Estimate", "Interval", "Interval from", "p-value"}, {}, {}, {}};
    for (std::size_t ci = 0; ci < v.comparisons.size(); ++ci) {
        const ModelComparison& c = v.comparisons[ci];
        auto add = [&](const std::string& label, const DifferenceEstimate& d, const DifferenceEstimate& reported) {
            // Emptied by the small-cell rule: it would give a suppressed count.
            if (d.estimate.value && !reported.estimate.value) {
                differences.rows.push_back({textCell(c.modelA), textCell(c.modelB), textCell(label), withheldCell(), withheldCell(),
                                            textCell("-"), withheldCell()});
                return;
            }
            differences.rows.push_back({textCell(c.modelA), textCell(c.modelB), textCell(label), numberCell(d.estimate.value, 4),
                                        intervalCell(d.estimate, 4), textCell(d.estimate.lower ? ciMethodLabel(d.estimate.ciMethod) : "-"),
                                        d.pValue ? pCell(*d.pValue) : textCell("-")});
            if (d.estimate.value && !d.intervalNote.empty())
                differences.note += (differences.note.empty() ? "" : " ") + c.modelB + " - " + c.modelA + ", " + label + ": " + d.intervalNote + ".";
            else if (d.truncated)
                differences.note += (differences.note.empty() ? "" : " ") + c.modelB + " - " + c.modelA + ", " + label
                                    + ": the Wald interval is cut at the quantity's range.";
        };
        const ModelComparison& reported = shown.comparisons[ci];
        for (std::size_t k = 0; k < c.differences.size(); ++k)
            add(differenceLabel(c.differences[k].key), c.differences[k], reported.differences[k]);
        for (std::size_t t = 0; t < c.netBenefitDifferences.size(); ++t)
            add("Net benefit at " + fixed(c.netBenefitThresholds[t], 2), c.netBenefitDifferences[t], reported.netBenefitDifferences[t]);
        ReportTable reclass{"reclassification", "Reclassification of " + c.modelB + " against " + c.modelA,
                            {"Outcome", "Category under A", "Category under B", "Patients"}, {}, {}, {}};
        const auto& r = c.reclassification;
        auto category = [&](std::size_t k) {
            const std::string lo = k == 0 ? "0" : fixed(r.cutPoints[k - 1], 3);
            const std::string hi = k == r.cutPoints.size() ? "1" : fixed(r.cutPoints[k], 3);
            return "[" + lo + ", " + hi + ")";
        };
        for (std::size_t i = 0; i < r.events.size(); ++i)
            for (std::size_t j = 0; j < r.events.size(); ++j) {
                reclass.rows.push_back({textCell("event"), textCell(category(i)), textCell(category(j)),
                                        countCell(plan.reclassEvents[ci][i][j], minimumCell)});
                reclass.rows.push_back({textCell("no event"), textCell(category(i)), textCell(category(j)),
                                        countCell(plan.reclassNonEvents[ci][i][j], minimumCell)});
            }
        section.tables.push_back(reclass);
    }
    for (const auto& caution : comparisonCautions())
        section.paragraphs.push_back(caution);
    if (!differences.rows.empty())
        section.tables.insert(section.tables.begin(), differences);
    if (!s.updates.empty()) {
        ReportTable updating{"updating", "Updating for the local population: apparent and optimism-corrected performance",
                             {"Model", "Choice", "Formula", "Metric", "Apparent", "Optimism", "Corrected"}, {}, {}, {}};
        for (const auto& u : s.updates)
            for (const auto& row : u.optimism)
                updating.rows.push_back({textCell(u.model), textCell(std::string(updateChoiceName(u.fit.choice))), textCell(u.fit.formula()),
                                         textCell(row.key), numberCell(row.apparent, 4), numberCell(row.optimism, 4), numberCell(row.corrected, 4)});
        updating.note = s.updates.front().cautions.front();
        section.tables.push_back(updating);
    }
    return section;
}

// The usual limits of a retrospective validation on one organisation's records, each said for
// this analysis where the run knows the numbers.
ReportSection limitsSection(const AnalysisSnapshot& s, const ReportFields& f)
{
    ReportSection section{"7. What these data cannot show", {}, {}, {}, {}, false};
    const IntakeAudit& a = s.audit;
    std::size_t missingOutcome = 0, missingScore = 0;
    for (const auto& tally : a.exclusions) {
        if (tally.reason == ExclusionReason::MissingOutcome)
            missingOutcome += tally.rows;
        if (tally.reason == ExclusionReason::MissingScore || tally.reason == ExclusionReason::ScoreNotANumber
            || tally.reason == ExclusionReason::ScoreNotFinite || tally.reason == ExclusionReason::ScoreOutOfRange)
            missingScore += tally.rows;
    }
    const std::string outcome = f.outcome.empty() ? "the outcome" : "the outcome (" + f.outcome + ")";
    section.paragraphs.push_back("Outcomes recorded elsewhere: " + outcome + " is known only as these records hold it; events "
                                 "recorded by other organisations (a readmission to another hospital, say) are missing, so the "
                                 "observed rate and O/E may be too low.");
    section.paragraphs.push_back("Competing events: patients who died or moved before the outcome could occur are counted as "
                                 "without the event; where such events are common, risks will look too high.");
    section.paragraphs.push_back("Interventions triggered by the score: if the score was already in use, patients flagged at high "
                                 "risk may have been treated and avoided the event, which makes the model look miscalibrated at "
                                 "high risk and less discriminating than it is.");
    section.paragraphs.push_back("Complete cases only: " + std::to_string(a.rowsExcluded()) + " of " + std::to_string(a.rowsRead)
                                 + " rows were left out (" + std::to_string(missingOutcome) + " without an outcome, "
                                 + std::to_string(missingScore) + " without a usable score"
                                 + (a.rowsExcluded() > missingOutcome + missingScore ? ", the rest for other reasons in section 2" : "")
                                 + "); "
                                 "if those patients differ from the rest, the results may not hold for them.");
    if (s.validation.periods && !s.validation.periods->results.empty())
        section.paragraphs.push_back("Time: the results describe patients from " + s.validation.periods->results.front().period + " to "
                                     + s.validation.periods->results.back().period + "; practice, coding and case mix change.");
    section.paragraphs.push_back("No evidence of clinical impact: good discrimination, calibration and net benefit show that the "
                                 "model could help at the stated threshold, not that using it improves care; that needs a study of "
                                 "its use.");
    return section;
}

ReportSection methodsSection(const AnalysisSnapshot& s, const DisclosurePlan& plan)
{
    ReportSection section{"8. Methods", {}, {}, {}, {}, false};
    section.paragraphs.push_back(disclosureRuleText(plan));
    for (std::string_view key : panelKeys) {
        const MetricDefinition d = metricDefinition(key);
        // A definition that opens with its own name ("Average precision: ...") is not named twice.
        std::string definition(d.definition);
        if (const auto colon = definition.find(": "); colon != std::string::npos && colon < 40
            && metricLabel(key).starts_with(definition.substr(0, colon)))
            definition.erase(0, colon + 2);
        section.paragraphs.push_back(metricLabel(key) + ": " + definition + " Source: " + std::string(d.source) + ".");
    }
    section.paragraphs.push_back("Risk-group intervals: Wilson 1927 (or Clopper & Pearson 1934); smoothed calibration curve: loess "
                                 "(span 0.75, local quadratic, tricube; Cleveland, Grosse & Shyu 1992).");
    if (s.request.bootstrap.replicates > 0)
        section.paragraphs.push_back("Bootstrap: " + std::to_string(s.request.bootstrap.replicates) + " nonparametric replicates (seed "
                                     + std::to_string(s.request.bootstrap.seed) + "), " + std::string(bootstrapCiName(s.request.bootstrap.method))
                                     + " intervals (Efron 1987); differences between models from paired resamples. Interval "
                                       "reported: " + intervalRuleText());
    section.paragraphs.push_back("Net benefit: Vickers & Elkin 2006; NRI and IDI: Pencina et al. 2008; model updating: Steyerberg et al. "
                                 "2004, Vergouwe et al. 2017; optimism correction: Harrell, Lee & Mark 1996.");
    return section;
}

// Every TRIPOD 2015 item that applies to a validation, none dropped: covered (with the section),
// partly covered (what is missing), or for the authors to supply. Item numbers are recalled, and
// the report says so.
ReportSection checklistSection(const AnalysisSnapshot& s, const ReportFields& f)
{
    ReportSection section{"9. Reporting checklists (TRIPOD 2015 and TRIPOD+AI 2024)", {}, {}, {}, {}, false};
    ReportTable t{"checklist", "Every validation item and where this report covers it", {"Item", "Topic", "Status", "Where, or what to add"}, {}, {}, {}};
    const bool updated = !s.updates.empty();
    std::string groupNames;
    for (const auto& g : s.request.intake.groupColumns)
        groupNames += (groupNames.empty() ? "" : ", ") + g;
    const bool subgroups = s.validation.subgroups.has_value();
    const bool periods = s.validation.periods.has_value();
    const std::string covered = "covered", partly = "partly covered", authors = "for the authors to supply";
    const std::vector<std::array<std::string, 4>> items{{
        {"1", "Title", f.title.empty() ? partly : covered, f.title.empty() ? "a generic title: give --report-title" : "title block"},
        {"2", "Abstract", partly, "section 1 summarises the results; the abstract itself is for the authors"},
        {"3a", "Background and rationale", authors, "why this model is validated here"},
        {"3b", "Objectives", authors, "state that this is an external validation and of what"},
        {"4a", "Source of data", partly, "section 2 (files and their SHA-256); describe the study design"},
        {"4b", "Key dates", periods ? covered : partly, periods ? "section 6 (periods)" : "the period is free text in section 1"},
        {"5a", "Setting and participants", f.population.empty() ? authors : partly, "section 1 (population, free text)"},
        {"5b", "Eligibility criteria", partly, "section 2 (rows excluded by reason); add the clinical criteria"},
        {"5c", "Treatments received", authors, "treatments that may change the outcome"},
        {"6a", "Outcome definition", f.outcome.empty() ? partly : covered, "section 1 (free text) and section 3 (column and event value)"},
        {"6b", "Blinding of outcome assessment", authors, "whether outcome assessors knew the score"},
        {"7a", "Predictors", authors, "the model's inputs and how they were measured"},
        {"7b", "Blinding of predictor assessment", authors, "whether predictors were assessed knowing the outcome"},
        {"8", "Sample size", partly, "section 6 (precision achieved); plan a study with plumbline-cli plan"},
        {"9", "Missing data", covered, "section 2 (complete cases, exclusions counted) and section 7"},
        {"10c", "How predictions were calculated", covered, "section 3 (score column and scale)"},
        {"10d", "Performance measures", covered, "sections 4 and 8"},
        {"10e", "Model updating", updated ? covered : partly, updated ? "section 5" : "no update was made in this run"},
        {"11", "Risk groups", covered, "section 4 (risk groups, thresholds)"},
        {"12", "Differences from the development data", authors, "setting, eligibility, outcome and predictors against the development study"},
        {"13a", "Participant flow", covered, "section 2 (rows read, used, excluded)"},
        {"13b", "Participant characteristics", partly, "section 1 (patients, events, event rate); describe the cohort"},
        {"13c", "Comparison with the development data", authors, "case mix against the development study"},
        {"16", "Model performance with intervals", covered, "section 4" + std::string(subgroups ? " and section 6 (by subgroup)" : "")},
        {"17", "Results of model updating", updated ? covered : partly, updated ? "section 5 (optimism-corrected)" : "no update was made in this run"},
        {"18", "Limitations", partly, "section 7 (what these data cannot show); add the study's own"},
        {"19a", "Interpretation against the development results", authors, "compare with the published performance"},
        {"19b", "Overall interpretation", partly, "section 1 (findings); the interpretation is for the authors"},
        {"20", "Implications", authors, "clinical use and further research"},
        {"21", "Supplementary information", partly, "section 3 (settings, document id); keep the analysis file"},
        {"22", "Funding", authors, "sources of funding and their role"},
    }};
    for (const auto& item : items)
        t.rows.push_back({textCell(item[0]), textCell(item[1]), textCell(item[2]), textCell(item[3])});
    t.note = "Items of the TRIPOD statement (Collins et al. 2015) that apply to validation; the numbers are recalled, not checked "
             "against the published checklist (from memory): check them before submission.";
    section.tables.push_back(t);

    // TRIPOD+AI (Collins et al. 2024) as it applies to evaluating a model: every item, none dropped.
    ReportTable ai{"checklist_ai", "TRIPOD+AI items for evaluating a model and where this report covers them",
                   {"Item", "Topic", "Status", "Where, or what to add"}, {}, {}, {}};
    const bool titled = !f.title.empty();
    const std::vector<std::array<std::string, 4>> aiItems{{
        {"1", "Title", titled ? covered : partly, titled ? "title block" : "a generic title: give --report-title"},
        {"2", "Abstract", partly, "section 1 summarises the results; the abstract is for the authors"},
        {"3a", "Healthcare context and rationale", authors, "why this model is evaluated here"},
        {"3b", "Intended purpose, users and place in the care pathway", authors, "who acts on the score, and when"},
        {"3c", "Known health inequalities between groups", authors, "groups at risk of worse care or worse predictions"},
        {"4", "Objectives", authors, "state that this is an evaluation of an existing model, and of what"},
        {"5a", "Data sources", partly, "section 2 (files and their SHA-256); describe where the data come from"},
        {"5b", "Dates of the data", periods ? covered : partly, periods ? "section 6 (periods)" : "the period is free text in section 1"},
        {"6a", "Setting", f.population.empty() ? authors : partly, "section 1 (population, free text)"},
        {"6b", "Eligibility criteria", partly, "section 2 (rows excluded by reason); add the clinical criteria"},
        {"6c", "Treatments received", authors, "treatments that may change the outcome (section 7)"},
        {"7", "Data preparation and quality checks", covered, "section 2 (every exclusion counted by reason) and section 3 (scale)"},
        {"8a", "Outcome definition and time horizon", f.outcome.empty() ? partly : covered, "section 1 (free text) and section 3"},
        {"8b", "Outcome assessment (who, how)", authors, "how outcomes were recorded"},
        {"8c", "Outcome assessment blinded to the predictors", authors, "whether assessors knew the score"},
        {"9a", "Choice of predictors", authors, "the model's inputs (from its developers)"},
        {"9b", "Predictor definitions and measurement", authors, "how the inputs were measured here"},
        {"9c", "Predictor assessors' qualifications and blinding", authors, "who recorded the inputs"},
        {"10", "Sample size", partly, "section 6 (precision achieved); plan a study with plumbline-cli plan"},
        {"11", "Missing data", covered, "section 2 (complete cases, exclusions counted) and section 7"},
        {"12a", "How the data were used (evaluation only)", partly,
         (updated ? std::string("this run fits only the updates of section 5, optimism-corrected; ") : std::string("this run fits no model; "))
             + "whether any model was developed or refitted on these patients is for the authors (its results would then be optimistic)"},
        {"12b", "How predictors were handled", authors, "for the model's developers"},
        {"12c", "Model type and fitting", authors, "for the model's developers"},
        {"12d", "Heterogeneity across clusters (sites)", subgroups ? covered : authors,
         subgroups ? "section 6 (Cochran's Q, funnel)" : "give --group with the site column"},
        {"12e", "Performance measures and their intervals", covered, "sections 4 and 8"},
        {"12f", "Model updating", updated ? covered : partly, updated ? "section 5" : "no update was made in this run"},
        {"12g", "How the model's output is calculated", covered, "section 3 (score column and scale)"},
        {"13", "Class imbalance", covered, "no resampling or reweighting; the event rate is in section 1"},
        {"14", "Fairness", subgroups ? partly : authors,
         subgroups ? "section 6, for the groups analysed only (" + groupNames + "); other groups that matter are for the authors"
                   : "give --group"},
        {"15", "Model output and thresholds", covered, "section 3 (decision thresholds) and section 4"},
        {"16", "Differences between development and evaluation data", authors, "case mix, setting and outcome against the development study"},
        {"17", "Ethics approval", authors, "approval or waiver"},
        {"18a", "Funding", authors, "sources of funding and their role"},
        {"18b", "Conflicts of interest", authors, "declarations"},
        {"18c", "Protocol", authors, "where the protocol can be found"},
        {"18d", "Registration", authors, "study registration, if any"},
        {"18e", "Data availability", partly, "aggregates only in this report; the document id names the inputs"},
        {"18f", "Code availability", covered, "Plumbline " + std::string(versionString) + " (open source); settings in section 3"},
        {"19", "Patient and public involvement", authors, "how patients and the public were involved"},
        {"20a", "Participant flow", covered, "section 2 (rows read, used, excluded)"},
        {"20b", "Participant characteristics", partly, "section 1 (patients, events, event rate); describe the cohort"},
        {"20c", "Comparison with the development data", authors, "case mix against the development study"},
        {"21", "Participants and outcomes in each analysis", covered, "patients and events in sections 1, 4 and 6"},
        {"22", "Full model specification", updated ? partly : authors, updated ? "section 5 (the updated formula); the original is the developers'"
                                                                          : "for the model's developers"},
        {"23a", "Performance with intervals", covered, "section 4"},
        {"23b", "Performance in key subgroups", subgroups ? covered : authors, subgroups ? "section 6" : "give --group"},
        {"24", "Results of model updating", updated ? covered : partly, updated ? "section 5" : "no update was made in this run"},
        {"25", "Interpretation", partly, "section 1 (findings); the interpretation is for the authors"},
        {"26", "Limitations", partly, "section 7 (what these data cannot show); add the study's own"},
        {"27a", "Handling of poor-quality or missing inputs in use", partly, "section 2 shows what was excluded here; say what happens in use"},
        {"27b", "Users' expertise and interaction", authors, "who uses the output and with what training"},
        {"27c", "Next steps", authors, "further evaluation, impact study"},
    }};
    for (const auto& item : aiItems)
        ai.rows.push_back({textCell(item[0]), textCell(item[1]), textCell(item[2]), textCell(item[3])});
    ai.note = "Items of TRIPOD+AI (Collins et al., BMJ 2024) that apply to evaluating a model; numbers and wording are recalled, "
              "not checked against the published checklist (from memory): check them before submission.";
    section.tables.push_back(ai);
    return section;
}

} // namespace

std::vector<const ReportTable*> ReportDocument::tables() const
{
    std::vector<const ReportTable*> out;
    for (const auto& section : sections)
        for (const auto& table : section.tables)
            out.push_back(&table);
    return out;
}

// Text from the data (column names, levels, free text) may hold right-to-left overrides that
// make "exe.png" show as "gnp.exe": every string of the report shows them as <U+202E> instead,
// in every format at once.
namespace {
void makeBidiControlsVisible(ReportDocument& d)
{
    auto visible = [](std::string& text) { text = withVisibleBidiControls(text); };
    visible(d.title);
    visible(d.subtitle);
    for (auto& section : d.sections) {
        visible(section.title);
        for (auto* paragraphs : {&section.paragraphs, &section.closing})
            for (auto& paragraph : *paragraphs)
                visible(paragraph);
        for (auto& table : section.tables) {
            visible(table.title);
            visible(table.note);
            for (auto& header : table.headers)
                visible(header);
            for (auto& row : table.rows)
                for (auto& cell : row)
                    visible(cell.text);
        }
    }
}
} // namespace

DisclosurePlan disclosurePlanOf(const AnalysisSnapshot& s, std::size_t minimumCell)
{
    static const Cohort none;
    return planDisclosure(s.cohort ? *s.cohort : none, s.validation, s.request.panel.decisionThreshold, minimumCell);
}

SnapshotPointer snapshotForReport(const AnalysisSnapshot& s, std::size_t minimumCell)
{
    auto shown = std::make_shared<AnalysisSnapshot>(s);
    shown->validation = redactedForReport(s.validation, disclosurePlanOf(s, minimumCell));
    return shown;
}

ReportDocument buildReport(const AnalysisSnapshot& s, const ReportFields& fields, std::size_t minimumCell,
                           const std::string& createdUtc)
{
    ReportDocument d;
    d.title = fields.title.empty() ? "Validation of a risk model on local data" : fields.title;
    d.subtitle = "Plumbline " + std::string(versionString) + " - " + createdUtc;
    d.documentId = documentIdOf(s);
    const DisclosurePlan plan = disclosurePlanOf(s, minimumCell);
    const ValidationResult shown = redactedForReport(s.validation, plan);
    d.sections.push_back(decisionSummarySection(s, shown, plan, fields, createdUtc));
    d.sections.push_back(provenanceSection(s));
    d.sections.push_back(settingsSection(s, plan));
    d.sections.push_back(resultsSection(s, shown, plan));
    d.sections.push_back(comparisonSection(s, shown, plan));
    d.sections.push_back(subgroupSection(s, shown, plan));
    d.sections.push_back(limitsSection(s, fields));
    d.sections.push_back(methodsSection(s, plan));
    d.sections.push_back(checklistSection(s, fields));
    ReportSection warnings{"10. Warnings and cautions", {}, {}, {}, {}, false};
    for (const auto& w : s.audit.warnings)
        warnings.paragraphs.push_back("Warning: " + w);
    for (const auto& w : s.validation.warnings)
        warnings.paragraphs.push_back("Warning: " + w);
    if (s.request.bootstrap.replicates > 0 && s.request.bootstrap.replicates < 1000)
        warnings.paragraphs.push_back("Warning: " + replicatesCaution(s.request.bootstrap.replicates));
    for (const auto caution : standardCautions)
        warnings.paragraphs.push_back("Caution: " + std::string(caution));
    warnings.paragraphs.push_back("Caution: this report shows aggregates only; counts below " + std::to_string(minimumCell)
                                  + " are suppressed, with the counts and numbers that would reveal them (section 8). Keep "
                                    "patient-level files inside your organisation's controls.");
    d.sections.push_back(warnings);
    ReportSection signOff{"11. Reviewer's notes and sign-off", {}, {}, {}, {}, false};
    signOff.paragraphs.push_back("Notes: " + (fields.notes.empty() ? std::string("(none)") : fields.notes));
    signOff.paragraphs.push_back("Reviewed by (name, role): ______________________________");
    signOff.paragraphs.push_back("Decision and conditions: ______________________________");
    signOff.paragraphs.push_back("Signature and date: ______________________________");
    d.sections.push_back(signOff);
    makeBidiControlsVisible(d);
    return d;
}

ReportTable printedRows(const ReportTable& table)
{
    ReportTable out = table;
    out.rows.clear();
    out.onlyInData.clear();
    for (std::size_t r = 0; r < table.rows.size(); ++r)
        if (r >= table.onlyInData.size() || !table.onlyInData[r])
            out.rows.push_back(table.rows[r]);
    // A column empty in every printed row (a note column with nothing to note) takes no room.
    for (std::size_t c = out.headers.size(); c-- > 0;) {
        const bool empty = !out.rows.empty() && std::all_of(out.rows.begin(), out.rows.end(), [&](const std::vector<ReportCell>& row) {
            return c >= row.size() || row[c].text.empty();
        });
        if (!empty)
            continue;
        out.headers.erase(out.headers.begin() + long(c));
        for (auto& row : out.rows)
            if (c < row.size())
                row.erase(row.begin() + long(c));
    }
    return out;
}

ReportTable dataColumns(const ReportTable& table)
{
    const std::size_t columns = table.headers.size();
    std::vector<bool> hasInterval(columns, false), hasEstimate(columns, false);
    for (const auto& row : table.rows)
        for (std::size_t c = 0; c < row.size() && c < columns; ++c) {
            hasInterval[c] = hasInterval[c] || row[c].interval.has_value();
            hasEstimate[c] = hasEstimate[c] || row[c].number.has_value();
        }
    ReportTable out = table;
    out.headers.clear();
    out.rows.assign(table.rows.size(), {});
    out.onlyInData.clear();
    for (std::size_t c = 0; c < columns; ++c) {
        const bool keep = !hasInterval[c] || hasEstimate[c];
        // A column of intervals alone is named for what it bounds ("Interval lower").
        if (keep)
            out.headers.push_back(table.headers[c]);
        if (hasInterval[c]) {
            out.headers.push_back(table.headers[c] + " lower");
            out.headers.push_back(table.headers[c] + " upper");
        }
        for (std::size_t r = 0; r < table.rows.size(); ++r) {
            const ReportCell cell = c < table.rows[r].size() ? table.rows[r][c] : ReportCell{};
            auto& row = out.rows[r];
            if (keep) {
                ReportCell data = cell;
                data.interval.reset();
                if (data.number && !data.suppressed) {
                    char buffer[32];
                    std::snprintf(buffer, sizeof buffer, "%.10g", *data.number);
                    // A number shown in words ("< 0.001", "0.72 (0.70 to 0.74)") is written as itself.
                    if (data.text.find_first_not_of("-0123456789.") != std::string::npos)
                        data.text = buffer;
                }
                if (!data.number && data.text == "-")
                    data.text.clear();
                row.push_back(data);
            }
            if (hasInterval[c]) {
                if (cell.interval) {
                    row.push_back({fixed(cell.interval->first, 6), cell.interval->first});
                    row.push_back({fixed(cell.interval->second, 6), cell.interval->second});
                } else {
                    row.push_back({});
                    row.push_back({});
                }
            }
        }
    }
    return out;
}

std::string neutralisedForSpreadsheet(const std::string& text)
{
    if (!text.empty() && (text[0] == '=' || text[0] == '+' || text[0] == '-' || text[0] == '@' || text[0] == '\t' || text[0] == '\r'))
        return "'" + text;
    return text;
}

} // namespace plumbline
