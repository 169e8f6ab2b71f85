#include "cli_analysis_options.hpp"

#include "files/settings_check.hpp"

namespace plumbline::cli {

void AnalysisOptions::addTo(CLI::App& command)
{
    intake.addTo(command, false); // FILE and columns may come from --settings
    panel.addTo(command);
    bootstrap.addTo(command);
    command.add_option("--add-updated", addUpdated, "Also validate each model updated on these data (intercept, logistic, closed-test)")
        ->check(CLI::IsMember({"intercept", "logistic", "closed-test"}));
    command.add_option("--min-cell", minimumCell, "Reports suppress counts below this (default 11)")->check(CLI::Range(1, 1000));
    command.add_option("--report-title", report.title, "Report title");
    command.add_option("--report-model", report.model, "Model name and version, for the report");
    command.add_option("--report-outcome", report.outcome, "Outcome definition and horizon, for the report");
    command.add_option("--report-population", report.population, "Population, for the report");
    command.add_option("--report-period", report.period, "Period of the data, for the report");
    command.add_option("--report-notes", report.notes, "Reviewer's notes, for the report");
    command.add_option("--settings", settingsFile, "Start from a saved analysis (*.plumbline.json); options given here override it");
    command.add_option("--save-settings", saveSettingsFile, "Save the analysis as a file that re-runs it exactly");
    command.add_flag("--allow-outside-paths", allowOutsidePaths,
                     "Let --settings read inputs named by an absolute path or outside the analysis file's folder");
    command.add_flag("--strict-inputs", strictInputs,
                     "Refuse --settings when an input has changed since it was saved or has no recorded SHA-256");
}

std::expected<AnalysisFile, InputError> AnalysisOptions::resolved(const CLI::App& command, std::vector<std::string>& warnings) const
{
    const auto intakeGiven = intake.resolved(command);
    if (!intakeGiven)
        return std::unexpected(intakeGiven.error());
    const auto panelGiven = panel.resolved();
    if (!panelGiven)
        return std::unexpected(panelGiven.error());
    const BootstrapSettings bootstrapGiven = bootstrap.resolved();
    AnalysisFile out;
    if (!settingsFile.empty()) {
        auto loaded = loadAnalysisFile(settingsFile, warnings, {allowOutsidePaths, strictInputs});
        if (!loaded)
            return std::unexpected(loaded.error());
        out = std::move(*loaded);
    } else {
        out.intake = *intakeGiven;
        out.panel = *panelGiven;
        out.bootstrap = bootstrapGiven;
    }
    auto given = [&](const char* option) { return command.count(option) > 0; };
    if (!settingsFile.empty()) {
        // Only what the user typed overrides the saved analysis.
        IntakeSettings& i = out.intake;
        const IntakeSettings& g = *intakeGiven;
        if (given("FILE")) i.cohortFile = g.cohortFile;
        if (given("--sheet")) i.sheet = g.sheet;
        if (given("--database")) { i.database = g.database; i.cohortFile.clear(); }
        if (given("--query") || given("--query-file")) i.query = g.query;
        if (given("--outcome")) i.outcomeColumn = g.outcomeColumn;
        if (given("--score")) i.scoreColumns = g.scoreColumns;
        if (given("--id")) i.idColumn = g.idColumn;
        if (given("--outcomes")) i.outcomesFile = g.outcomesFile;
        if (given("--outcomes-id")) i.outcomesIdColumn = g.outcomesIdColumn;
        if (given("--event")) i.eventValue = g.eventValue;
        if (given("--scale")) { i.scale = g.scale; i.scaleGiven = true; }
        if (given("--delimiter")) i.delimiter = g.delimiter;
        if (given("--decimal-comma")) i.decimalComma = g.decimalComma;
        if (given("--group")) i.groupColumns = g.groupColumns;
        if (given("--period")) i.periodColumn = g.periodColumn;
        if (given("--cluster")) i.clusterColumn = g.clusterColumn;
        if (given("--max-line-length")) i.maxLineBytes = g.maxLineBytes;
        PanelSettings& p = out.panel;
        if (given("--thresholds")) p.thresholds = panelGiven->thresholds;
        if (given("--groups")) p.riskGroups = panelGiven->riskGroups;
        if (given("--confidence")) p.confidence = panelGiven->confidence;
        if (given("--c-interval")) p.cStatisticScale = panelGiven->cStatisticScale;
        if (given("--binomial-interval")) p.binomialInterval = panelGiven->binomialInterval;
        if (given("--nri-cuts")) p.nriCutPoints = panelGiven->nriCutPoints;
        if (given("--decision-threshold")) p.decisionThreshold = panelGiven->decisionThreshold;
        if (given("--decision-range")) { p.decisionFrom = panelGiven->decisionFrom; p.decisionTo = panelGiven->decisionTo; p.decisionStep = panelGiven->decisionStep; }
        if (given("--period-unit")) p.periodUnit = panelGiven->periodUnit;
        if (given("--date-format")) p.dateFormat = panelGiven->dateFormat;
        if (given("--capacity")) p.capacity = panelGiven->capacity;
        if (given("--acceptable")) p.acceptable = panelGiven->acceptable;
        if (given("--cusum-odds")) { p.monitoring.worseOdds = panelGiven->monitoring.worseOdds; p.monitoring.betterOdds = panelGiven->monitoring.betterOdds; }
        if (given("--cusum-years")) p.monitoring.targetYears = panelGiven->monitoring.targetYears;
        BootstrapSettings& b = out.bootstrap;
        if (given("--bootstrap")) b.replicates = bootstrapGiven.replicates;
        if (given("--seed")) b.seed = bootstrapGiven.seed;
        if (given("--ci-method")) b.method = bootstrapGiven.method;
        if (given("--stratified-bootstrap")) b.stratified = bootstrapGiven.stratified;
    }
    out.bootstrap.threads = bootstrapGiven.threads; // never saved: it changes no result
    if (settingsFile.empty() || given("--add-updated")) out.addUpdated = addUpdated;
    if (settingsFile.empty() || given("--min-cell")) out.minimumCell = minimumCell;
    out.panel.minimumCell = out.minimumCell;
    out.panel.simulationSeed = out.bootstrap.seed; // the draws for a new site's acceptability
    auto text = [&](const char* option, const std::string& value, std::string& field) {
        if (settingsFile.empty() || given(option))
            field = value;
    };
    text("--report-title", report.title, out.report.title);
    text("--report-model", report.model, out.report.model);
    text("--report-outcome", report.outcome, out.report.outcome);
    text("--report-population", report.population, out.report.population);
    text("--report-period", report.period, out.report.period);
    text("--report-notes", report.notes, out.report.notes);
    // The same bounds as an analysis file and the window, in the command line's words.
    if (auto checked = checkAnalysisSettings(out, SettingsSource::CommandLine); !checked)
        return std::unexpected(checked.error());
    return out;
}

} // namespace plumbline::cli
