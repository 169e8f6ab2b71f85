#include "cli_validate_command.hpp"

#include "run/analysis_snapshot.hpp"
#include "files/atomic_file.hpp"
#include "cli_analysis_options.hpp"
#include "cli_exit.hpp"
#include "cli_ineffective_options.hpp"
#include "cli_panel_report.hpp"
#include "cli_text.hpp"
#include "intake/intake.hpp"
#include "analyses/model_updating.hpp"
#include "report/report_writers.hpp"
#include "files/result_json.hpp"
#include "files/update_json.hpp"
#include "files/validation_json.hpp"

#include <system_error>
#include <QApplication>

#include <cstdlib>
#include <iostream>
#include <filesystem>
#include <memory>
#include <optional>

namespace plumbline::cli {

namespace {

struct ValidateOptions {
    AnalysisOptions analysis;
    std::string jsonFile;
    std::vector<std::string> reportFiles; // --report, repeatable: PDF and HTML from one run, one timestamp
    std::string xlsxFile;
    std::string csvFolder;
    std::string chartFolder;
};

nlohmann::ordered_json resultJson(const AnalysisSnapshot& s)
{
    nlohmann::ordered_json json;
    json["plumbline"] = provenanceJson(utcTimestamp());
    json["inputs"] = inputsJson(s.inputs);
    json["settings"] = intakeSettingsJson(s.request.intake);
    json["settings"]["panel"] = panelSettingsJson(s.validation.settings);
    json["settings"]["bootstrap"] = {{"replicates", s.request.bootstrap.replicates}, {"seed", s.request.bootstrap.seed},
                                     {"ci_method", std::string(bootstrapCiName(s.request.bootstrap.method))},
                                     {"stratified", s.request.bootstrap.stratified}};
    json["cohort"] = cohortJson(s.audit);
    json["bootstrap"] = bootstrapJson(s.validation);
    json["models"] = modelsJson(s.validation);
    json["comparisons"] = comparisonsJson(s.validation);
    addUsefulnessFairnessDriftJson(json, s.validation);
    json["updates"] = nlohmann::ordered_json::array();
    for (const auto& update : s.updates)
        json["updates"].push_back(updateJson(update));
    std::vector<std::string> warnings = s.audit.warnings;
    warnings.insert(warnings.end(), s.validation.warnings.begin(), s.validation.warnings.end());
    json["warnings"] = warnings;
    return json;
}

// Reports with charts need a QApplication (Qt Charts are widgets); the CLI makes one only then,
// offscreen, so it never needs a display.
bool wantsReports(const ValidateOptions& options)
{
    return !options.reportFiles.empty() || !options.xlsxFile.empty() || !options.csvFolder.empty() || !options.chartFolder.empty();
}

// The CSV tables' names depend on the results (one per subgroup column, say): checked once the
// report's content is known, before any output is written.
std::expected<void, InputError> checkTableOutputs(const ValidateOptions& options, const AnalysisFile& analysis, const ReportDocument& document)
{
    if (options.csvFolder.empty())
        return {};
    std::vector<std::string> inputs{analysis.intake.cohortFile, options.analysis.settingsFile};
    if (analysis.intake.outcomesFile)
        inputs.push_back(*analysis.intake.outcomesFile);
    for (const auto& table : csvTablePaths(document, options.csvFolder))
        if (auto ok = refuseInputAsOutput(table, inputs, "--csv-dir"); !ok)
            return ok;
    return {};
}

int writeReports(const ValidateOptions& options, const ReportDocument& document, const std::shared_ptr<const AnalysisSnapshot>& snapshot)
{
    if (!wantsReports(options))
        return Done;
    if (!options.csvFolder.empty()) {
        if (auto written = writeCsvTables(document, options.csvFolder); !written)
            return reportError(written.error());
        std::cout << "Tables (CSV): " << options.csvFolder << '\n';
    }
    if (!options.xlsxFile.empty()) {
        if (auto written = writeXlsxReport(document, options.xlsxFile); !written)
            return reportError(written.error());
        std::cout << "Workbook: " << options.xlsxFile << '\n';
    }
    if (!options.reportFiles.empty() || !options.chartFolder.empty()) {
        static int argc = 1;
        static char name[] = "plumbline-cli";
        static char* argv[] = {name, nullptr};
        if (!std::getenv("QT_QPA_PLATFORM"))
            qputenv("QT_QPA_PLATFORM", "offscreen");
        std::unique_ptr<QApplication> application;
        if (!QApplication::instance())
            application = std::make_unique<QApplication>(argc, argv);
        // Charts drawn from what the report may show: nothing the small-cell rule withholds.
        ReportCharts charts(snapshotForReport(*snapshot, snapshot->request.minimumCell));
        for (const auto& reportFile : options.reportFiles) {
            if (auto written = writeReport(document, charts, reportFile); !written)
                return reportError(written.error());
            std::cout << "Report: " << reportFile << '\n';
        }
        if (!options.chartFolder.empty()) {
            QString error;
            if (!charts.exportAll(QString::fromStdString(options.chartFolder), &error)) {
                InputError e;
                e.file = options.chartFolder;
                e.problem = "the charts could not be written (" + error.toStdString() + ").";
                e.remedy = "choose a folder you may write to.";
                return reportError(e);
            }
            std::cout << "Charts (PNG and SVG): " << options.chartFolder << '\n';
        }
    }
    return Done;
}

// No output may replace an input (after links), checked before anything is computed or written.
std::expected<void, InputError> checkOutputs(const ValidateOptions& options, const AnalysisFile& analysis)
{
    std::vector<std::string> inputs{analysis.intake.cohortFile};
    if (analysis.intake.outcomesFile)
        inputs.push_back(*analysis.intake.outcomesFile);
    // The analysis file itself may be saved again (--settings a.json --save-settings a.json).
    if (auto ok = refuseInputAsOutput(options.analysis.saveSettingsFile, inputs, "--save-settings"); !ok)
        return ok;
    inputs.push_back(options.analysis.settingsFile);
    std::vector<std::pair<const std::string*, const char*>> outputs{{&options.jsonFile, "--json"}, {&options.xlsxFile, "--xlsx"}};
    for (const auto& reportFile : options.reportFiles)
        outputs.emplace_back(&reportFile, "--report");
    for (const auto& [path, option] : outputs)
        if (auto ok = refuseInputAsOutput(*path, inputs, option); !ok)
            return ok;
    if (!options.chartFolder.empty())
        for (const char* name : {"roc.png", "roc.svg", "calibration.png", "calibration.svg"})
            if (auto ok = refuseInputAsOutput((std::filesystem::path(options.chartFolder) / name).string(), inputs, "--chart-dir"); !ok)
                return ok;
    return {};
}

int runValidate(const ValidateOptions& options, const CLI::App& command)
{
    std::vector<std::string> settingsWarnings;
    const auto analysis = options.analysis.resolved(command, settingsWarnings);
    if (!analysis)
        return reportError(analysis.error());
    if (auto ok = checkOutputs(options, *analysis); !ok)
        return reportError(ok.error());
    for (const auto& warning : settingsWarnings)
        std::cerr << "plumbline-cli: warning: " << warning << '\n';
    for (const auto& warning : ineffectiveOptionWarnings(command, *analysis))
        std::cerr << "plumbline-cli: warning: " << warning << '\n';
    auto result = runIntake(analysis->intake);
    if (!result)
        return reportError(result.error());
    if (const auto changed = queryResultChange(*analysis, result->inputs.front().sha256)) {
        if (options.analysis.strictInputs) {
            InputError error;
            error.file = options.analysis.settingsFile;
            error.key = "inputs[0].sha256";
            error.problem = changed->substr(0, changed->size() - 1) + ", and --strict-inputs asks for the saved inputs.";
            error.remedy = "re-run on the data the analysis was saved with, or save the analysis again.";
            return reportError(error);
        }
        std::cerr << "plumbline-cli: warning: " << *changed << '\n';
        settingsWarnings.push_back(*changed);
    }
    if (result->cohort.period)
        // Only the dates are checked here: the analysis over time runs once, in runValidation.
        if (auto dates = checkPeriodDates(result->cohort, *result->cohort.period, analysis->panel.dateFormat); !dates) {
            InputError error = dates.error();
            error.file = analysis->intake.cohortFile;
            return reportError(error);
        }
    // A changed or unfingerprinted input is a warning of the result itself (JSON, report,
    // window), not only a line on the terminal.
    result->audit.warnings.insert(result->audit.warnings.begin(), settingsWarnings.begin(), settingsWarnings.end());
    auto snapshot = std::make_shared<AnalysisSnapshot>();
    snapshot->request = AnalysisRequest::fromAnalysisFile(*analysis);
    snapshot->request.inputWarnings = settingsWarnings;
    // Each model updated for the local population enters as one more model, "<name>_updated".
    snapshot->updates = addUpdatedModels(result->cohort, analysis->addUpdated);
    // The CUSUM limits are simulated with the run's one seed (--seed), like the bootstrap.
    PanelSettings panel = analysis->panel;
    panel.monitoring.seed = analysis->bootstrap.seed;
    snapshot->validation = runValidation(result->cohort, panel);
    for (const auto& update : snapshot->updates)
        snapshot->validation.warnings.push_back("Model '" + update.model + "_updated' was fitted on these patients (" + update.fit.formula()
                                                + "): its performance here is optimistic; see the optimism-corrected values in 'updates'.");
    if (analysis->bootstrap.replicates > 0)
        if (const auto replicated = runBootstrap(result->cohort, snapshot->validation, analysis->bootstrap, terminalProgress(), {}))
            applyBootstrap(snapshot->validation, *replicated);
    snapshot->audit = result->audit;
    snapshot->inputs = result->inputs;
    snapshot->cohort = std::make_shared<const Cohort>(std::move(result->cohort));
    printIntakeSummary(std::cout, analysis->intake, *result);
    printPanel(std::cout, snapshot->validation);
    printCautions(std::cout);
    std::optional<ReportDocument> document;
    if (wantsReports(options)) {
        document = buildReport(*snapshot, analysis->report, analysis->minimumCell, utcTimestamp());
        if (auto ok = checkTableOutputs(options, *analysis, *document); !ok)
            return reportError(ok.error());
    }
    if (!options.jsonFile.empty()) {
        if (auto written = writeFileAtomically(options.jsonFile, resultJson(*snapshot).dump(2) + "\n"); !written)
            return reportError(written.error());
        std::cout << "Result file: " << options.jsonFile << '\n';
    }
    if (!options.analysis.saveSettingsFile.empty()) {
        AnalysisFile saved = *analysis;
        if (saved.intake.database)
            saved.queryResultSha256 = snapshot->inputs.front().sha256;
        if (auto written = saveAnalysisFile(options.analysis.saveSettingsFile, saved); !written)
            return reportError(written.error());
        std::cout << "Analysis file: " << options.analysis.saveSettingsFile << '\n';
    }
    return document ? writeReports(options, *document, snapshot) : Done;
}

} // namespace

void addValidateCommand(CLI::App& app, int& exitStatus)
{
    auto options = std::make_shared<ValidateOptions>();
    CLI::App* command = app.add_subcommand("validate", "Validate one or more risk models on a cohort.");
    options->analysis.addTo(*command);
    command->add_option("--json", options->jsonFile, "Write the full result as JSON");
    command->add_option("--report", options->reportFiles, "Write the validation report (.pdf or .html); repeat for both from one run");
    command->add_option("--xlsx", options->xlsxFile, "Write every table of the report to a workbook");
    command->add_option("--csv-dir", options->csvFolder, "Write every table of the report as CSV into this folder");
    command->add_option("--chart-dir", options->chartFolder, "Write the ROC and calibration charts as PNG and SVG into this folder");
    command->callback([options, command, &exitStatus] {
        try {
            exitStatus = runValidate(*options, *command);
        } catch (const std::bad_alloc&) {
            exitStatus = reportOutOfMemory(options->analysis.intake.settings.cohortFile);
        } catch (const std::system_error& error) {
            // A thread whose stack cannot be mapped is memory running out too (EAGAIN).
            if (error.code() != std::errc::resource_unavailable_try_again)
                throw;
            exitStatus = reportOutOfMemory(options->analysis.intake.settings.cohortFile);
        }
    });
}

} // namespace plumbline::cli
