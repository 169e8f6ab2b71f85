#include "cli_panel_report.hpp"
#include "cli_capacity_report.hpp"

#include "cli_site_pooling_report.hpp"
#include "cli_monitoring_report.hpp"

#include "metrics/metric_reading.hpp"
#include "reporting/value_text.hpp"

#include <algorithm>
#include <cstdio>
#include <iomanip>
#include <numeric>
#include <string>

namespace plumbline::cli {

namespace {

std::string number(const std::optional<double>& value, int digits = 3)
{
    return fixedText(value, digits, "-");
}

std::string shortMethod(CiMethod method)
{
    switch (method) {
    case CiMethod::DeLongLogit: return "DeLong, logit";
    case CiMethod::DeLongPlain: return "DeLong";
    case CiMethod::Wald: return "Wald";
    case CiMethod::LogNormal: return "log-normal";
    case CiMethod::ExactPoisson: return "exact Poisson";
    case CiMethod::BootstrapBca: return "bootstrap BCa";
    case CiMethod::BootstrapPercentile: return "bootstrap pct";
    default: return "";
    }
}

std::string interval(const Estimate& e, int digits)
{
    if (!e.lower || !e.upper)
        return e.value ? "(no interval)" : "-";
    return number(e.lower, digits) + " to " + number(e.upper, digits);
}

void printMetrics(std::ostream& out, const ModelValidation& model, double confidence)
{
    char ciHeader[32];
    std::snprintf(ciHeader, sizeof ciHeader, "%g %% CI", confidence * 100.0);
    out << "  " << std::left << std::setw(27) << "metric" << std::right << std::setw(9) << "estimate" << "   "
        << std::left << std::setw(20) << ciHeader << std::setw(15) << "interval" << "reading\n";
    for (const auto& entry : model.metrics) {
        const bool small = entry.key == "ici" || entry.key == "e50" || entry.key == "e90" || entry.key == "emax"
            || entry.key == "brier";
        const int digits = small ? 4 : 3;
        out << "  " << std::left << std::setw(27) << metricLabel(entry.key) << std::right << std::setw(9)
            << number(entry.estimate.value, digits) << "   " << std::left << std::setw(20)
            << interval(entry.estimate, digits) << std::setw(15) << shortMethod(entry.estimate.ciMethod)
            << (entry.estimate.value ? entry.reading : "not computed: see the warnings") << '\n';
    }
    // Why an interval other than the bootstrap one asked for is shown (the interval rule); the
    // metrics sharing a reason share a line.
    std::vector<std::pair<std::string, std::string>> notes; // reason, metrics
    for (const auto& entry : model.metrics) {
        if (!entry.estimate.value || entry.intervalNote.empty())
            continue;
        auto same = std::find_if(notes.begin(), notes.end(), [&](const auto& n) { return n.first == entry.intervalNote; });
        if (same == notes.end())
            notes.emplace_back(entry.intervalNote, metricLabel(entry.key));
        else
            same->second += ", " + metricLabel(entry.key);
    }
    for (const auto& [reason, metrics] : notes)
        out << "  * " << metrics << ": " << reason << ".\n";
}

void printTests(std::ostream& out, const ModelValidation& model)
{
    if (model.hosmerLemeshow)
        out << "  Hosmer-Lemeshow: chi2 " << number(model.hosmerLemeshow->statistic, 2) << ", df "
            << model.hosmerLemeshow->df << " (one per risk group: external validation), "
            << pValueText(model.hosmerLemeshow->pValue) << "; large cohorts reject small miscalibration, read the table\n";
    if (model.spiegelhalter)
        out << "  Spiegelhalter: z " << number(model.spiegelhalter->z, 2) << ", " << pValueText(model.spiegelhalter->pValue) << '\n';
    if (model.likelihoodRatio) {
        const auto& lr = *model.likelihoodRatio;
        auto p = [](const std::optional<LikelihoodRatioTest>& t) { return t ? pValueText(t->pValue) : std::string("not computed"); };
        out << "  Likelihood-ratio tests: intercept 0 and slope 1 jointly " << p(lr.joint) << "; calibration-in-the-large "
            << pValueText(lr.interceptOnly.pValue) << "; slope given intercept " << p(lr.slopeGivenIntercept) << '\n';
    }
}

void printRiskGroups(std::ostream& out, const ModelValidation& model)
{
    if (model.riskGroups.empty())
        return;
    out << "  Risk groups:  group       n   events  expected  mean risk  observed  (CI)\n" << std::right;
    for (const auto& g : model.riskGroups)
        out << "                " << std::setw(5) << g.group << std::setw(8) << g.n << std::setw(9) << g.events
            << std::setw(10) << number(g.expected, 1) << std::setw(11) << number(g.meanPredicted) << std::setw(10)
            << number(g.observedRate) << "  (" << number(g.ciLower) << "-" << number(g.ciUpper) << ")\n";
}

void printThresholds(std::ostream& out, const ModelValidation& model)
{
    if (model.thresholds.empty())
        return;
    out << "  At thresholds (positive if risk >= t):\n"
        << "      t   flagged   sens   spec    PPV    NPV   net benefit  treat all\n" << std::right;
    for (const auto& t : model.thresholds)
        out << "  " << std::setw(5) << number(t.threshold, 2) << std::setw(10) << number(t.flagRate.value) << std::setw(7)
            << number(t.sensitivity.value) << std::setw(7) << number(t.specificity.value) << std::setw(7)
            << number(t.ppv.value) << std::setw(7) << number(t.npv.value) << std::setw(14) << number(t.netBenefit, 4)
            << std::setw(11) << number(t.netBenefitTreatAll, 4) << '\n';
}

std::string differenceLabel(const std::string& key)
{
    static const std::pair<const char*, const char*> labels[] = {
        {"c_statistic_difference", "C statistic"}, {"brier_difference", "Brier score"},
        {"calibration_slope_difference", "Calibration slope"}, {"ici_difference", "ICI"},
        {"nri_events", "NRI, events part"}, {"nri_non_events", "NRI, non-events part"}, {"nri", "NRI (categories)"},
        {"nri_continuous_events", "Category-free NRI, events"}, {"nri_continuous_non_events", "Category-free NRI, non-events"},
        {"nri_continuous", "Category-free NRI"}, {"idi", "IDI"}};
    for (const auto& [k, label] : labels)
        if (key == k)
            return label;
    return key;
}

void printComparisons(std::ostream& out, const ValidationResult& result)
{
    for (const auto& c : result.comparisons) {
        out << "\nComparison: " << c.modelB << " minus " << c.modelA << " (same patients)\n";
        out << "  " << std::left << std::setw(30) << "difference" << std::right << std::setw(9) << "estimate" << "   "
            << std::left << std::setw(22) << "interval" << "p (test)\n";
        for (const auto& d : c.differences)
            out << "  " << std::left << std::setw(30) << differenceLabel(d.key) << std::right << std::setw(9)
                << number(d.estimate.value, 4) << "   " << std::left << std::setw(22) << interval(d.estimate, 4)
                << (d.pValue ? pValueText(*d.pValue) : std::string("-")) << '\n';
        for (std::size_t t = 0; t < c.netBenefitDifferences.size(); ++t)
            out << "  " << std::left << std::setw(30) << ("Net benefit at " + number(c.netBenefitThresholds[t], 2))
                << std::right << std::setw(9) << number(c.netBenefitDifferences[t].estimate.value, 4) << "   " << std::left
                << std::setw(22) << interval(c.netBenefitDifferences[t].estimate, 4) << "-\n";
        for (const auto& caution : comparisonCautions())
            out << "  note: " << caution << '\n';
    }
}

void printDecisionCurves(std::ostream& out, const ValidationResult& result)
{
    if (result.models.empty() || result.models.front().decisionCurve.empty())
        return;
    out << "\nDecision curve (net benefit; treat none = 0), every fifth threshold:\n" << std::right << std::setw(7) << "t";
    for (const auto& m : result.models)
        out << "  " << std::setw(18) << m.name.substr(0, 18);
    out << "  " << std::setw(12) << "treat all" << '\n';
    const auto& grid = result.models.front().decisionCurve;
    for (std::size_t k = 0; k < grid.size(); k += 5) {
        out << std::setw(7) << number(grid[k].threshold, 2);
        for (const auto& m : result.models)
            out << "  " << std::setw(18) << number(m.decisionCurve[k].netBenefit, 4);
        out << "  " << std::setw(12) << number(grid[k].treatAll, 4) << '\n';
    }
}

void printSubgroups(std::ostream& out, const ValidationResult& result)
{
    if (!result.subgroups)
        return;
    // Levels are listed under each model so that long site names are never cut.
    std::size_t width = 12;
    for (const auto& r : result.subgroups->results)
        width = std::max(width, r.column.size() + 3 + r.level.size() + 2);
    out << "\nSubgroups:\n";
    for (const auto& model : result.models) {
        out << "  " << model.name << "\n    " << std::left << std::setw(int(width)) << "column = level" << std::right << std::setw(8)
            << "n" << std::setw(8) << "events" << "   " << std::left << std::setw(24) << "C" << "O/E\n";
        // The overall value first, so that each level is read against it.
        const Estimate& allC = model.metrics[CStatistic].estimate;
        const Estimate& allOe = model.metrics[OeRatio].estimate;
        const auto& hist = model.riskDistribution;
        const std::size_t events = std::accumulate(hist.events.begin(), hist.events.end(), std::size_t{0});
        const std::size_t rows = events + std::accumulate(hist.nonEvents.begin(), hist.nonEvents.end(), std::size_t{0});
        out << "    " << std::left << std::setw(int(width)) << "all patients" << std::right << std::setw(8) << rows
            << std::setw(8) << events << "   " << std::left << std::setw(24)
            << (number(allC.value) + " (" + interval(allC, 3) + ")") << number(allOe.value) << " (" << interval(allOe, 3) << ")"
            << std::right << '\n';
        for (const auto& r : result.subgroups->results) {
            if (r.model != model.name)
                continue;
            const Estimate& c = r.panel.metrics[CStatistic].estimate;
            const Estimate& oe = r.panel.metrics[OeRatio].estimate;
            out << "    " << std::left << std::setw(int(width)) << (r.column + " = " + r.level) << std::right << std::setw(8) << r.n
                << std::setw(8) << r.events << "   " << std::left << std::setw(24) << (number(c.value) + " (" + interval(c, 3) + ")")
                << number(oe.value) << " (" << interval(oe, 3) << ")" << (r.tooSmall ? "  [too small to estimate well]" : "")
                << std::right << '\n';
        }
    }
    for (const auto& h : result.subgroups->heterogeneity)
        if (h.df > 0)
            out << "  heterogeneity of " << metricLabel(h.metric) << " across " << h.column << " (" << h.model << "): Q " << number(h.q, 2)
                << ", df " << h.df << ", " << pValueText(h.pValue) << '\n';
    for (const auto& f : result.subgroups->funnel)
        if (f.oe < f.lower95 || f.oe > f.upper95)
            out << "  funnel: " << f.column << " = " << f.level << " (" << f.model << ") O/E " << number(f.oe) << " lies outside the "
                << (f.oe < f.lower998 || f.oe > f.upper998 ? "99.8 %" : "95 %") << " limits for " << number(f.expected, 0)
                << " expected events\n";
}

void printPeriods(std::ostream& out, const ValidationResult& result)
{
    if (!result.periods)
        return;
    out << "\nOver time (" << (result.periods->unit == PeriodUnit::Month ? "months" : "quarters") << "):\n";
    for (const auto& p : result.periods->results)
        out << "  " << std::left << std::setw(10) << p.period << std::setw(18) << p.model.substr(0, 17) << std::right << std::setw(7) << p.n
            << "  C " << number(p.c.value) << "  O/E " << number(p.oe.value) << " (" << interval(p.oe, 3) << ")"
            << (p.outsideFirstYear ? "  [outside the first year's interval]" : "") << '\n';
    out << "  note: " << result.periods->note << '\n';
}

void printPrecision(std::ostream& out, const ValidationResult& result)
{
    if (result.precision.empty())
        return;
    out << "\nPrecision achieved (interval width against a common target):\n";
    for (const auto& p : result.precision)
        out << "  " << std::left << std::setw(20) << p.model.substr(0, 19) << std::setw(26) << metricLabel(p.metric) << std::right
            << number(p.width, 3) << " (target " << number(p.target, 2) << (p.width <= p.target ? ", met)\n" : ", not met)\n");
}

} // namespace

void printPanel(std::ostream& out, const ValidationResult& result)
{
    if (result.bootstrap)
        out << "\nIntervals: bootstrap (" << result.bootstrap->replicates << " replicates, seed " << result.bootstrap->seed
            << ", " << result.bootstrap->ciMethod << (result.bootstrap->stratified ? ", stratified by outcome" : "")
            << "); analytic intervals are kept in the JSON.\n";
    else
        out << "\nIntervals: analytic only (--bootstrap 0).\n";
    for (const auto& model : result.models) {
        out << "\nModel " << model.name << "\n";
        printMetrics(out, model, result.settings.confidence);
        printTests(out, model);
        printRiskGroups(out, model);
        printThresholds(out, model);
    }
    printComparisons(out, result);
    printDecisionCurves(out, result);
    printSubgroups(out, result);
    printPeriods(out, result);
    printCapacity(out, result);
    printSitePooling(out, result);
    printMonitoring(out, result);
    printPrecision(out, result);
    if (!result.warnings.empty()) {
        out << "\nWarnings:\n";
        for (const auto& warning : result.warnings)
            out << "  - " << warning << '\n';
    }
}

} // namespace plumbline::cli
