#include "cli_validate_command.hpp"

#include "atomic_file.hpp"
#include "cli_bootstrap_options.hpp"
#include "cli_exit.hpp"
#include "cli_intake_options.hpp"
#include "cli_panel_options.hpp"
#include "cli_panel_report.hpp"
#include "cli_text.hpp"
#include "intake.hpp"
#include "model_updating.hpp"
#include "update_json.hpp"
#include "result_json.hpp"
#include "validation_json.hpp"

#include <iostream>
#include <memory>

namespace plumbline::cli {

namespace {

struct ValidateOptions {
    IntakeOptions intake;
    PanelOptions panel;
    BootstrapOptions bootstrap;
    std::string addUpdated;
    std::string jsonFile;
};

nlohmann::ordered_json resultJson(const IntakeSettings& settings, const IntakeResult& intake,
                                  const ValidationResult& validation, const BootstrapSettings& bootstrap,
                                  const std::vector<ModelUpdate>& updates)
{
    nlohmann::ordered_json json;
    json["plumbline"] = provenanceJson(utcTimestamp());
    json["inputs"] = inputsJson(intake.inputs);
    json["settings"] = intakeSettingsJson(settings);
    json["settings"]["panel"] = panelSettingsJson(validation.settings);
    json["settings"]["bootstrap"] = {{"replicates", bootstrap.replicates}, {"seed", bootstrap.seed},
                                     {"ci_method", std::string(bootstrapCiName(bootstrap.method))},
                                     {"stratified", bootstrap.stratified}};
    json["cohort"] = cohortJson(intake.audit);
    json["bootstrap"] = bootstrapJson(validation);
    json["models"] = modelsJson(validation);
    json["comparisons"] = comparisonsJson(validation);
    json["updates"] = nlohmann::ordered_json::array();
    for (const auto& update : updates)
        json["updates"].push_back(updateJson(update));
    std::vector<std::string> warnings = intake.audit.warnings;
    warnings.insert(warnings.end(), validation.warnings.begin(), validation.warnings.end());
    json["warnings"] = warnings;
    return json;
}

int runValidate(const ValidateOptions& options, const CLI::App& command)
{
    const auto settings = options.intake.resolved(command);
    if (!settings)
        return reportError(settings.error());
    const auto panel = options.panel.resolved();
    if (!panel)
        return reportError(panel.error());
    auto result = runIntake(*settings);
    if (!result)
        return reportError(result.error());
    // Each model updated for the local population enters as one more model, "<name>_updated".
    std::vector<ModelUpdate> updates;
    if (!options.addUpdated.empty() && scaleIsProbabilistic(result->cohort.scale)) {
        UpdateSettings update;
        update.method = options.addUpdated == "intercept" ? UpdateMethod::Intercept
            : options.addUpdated == "logistic"           ? UpdateMethod::Logistic
                                                         : UpdateMethod::ClosedTest;
        const std::size_t originals = result->cohort.models.size();
        for (std::size_t m = 0; m < originals; ++m) {
            const ModelScores original = result->cohort.models[m];
            const auto fitted = updateModel(result->cohort.outcome, original.values, original.name, update);
            if (!fitted)
                continue;
            ModelScores updated{original.name + "_updated", std::vector<double>(original.values.size())};
            for (std::size_t i = 0; i < original.values.size(); ++i)
                updated.values[i] = fitted->fit.updatedRisk(original.values[i]);
            result->cohort.models.push_back(std::move(updated));
            updates.push_back(*fitted);
        }
    }
    ValidationResult validation = runValidation(result->cohort, *panel);
    for (const auto& update : updates)
        validation.warnings.push_back("Model '" + update.model + "_updated' was fitted on these patients (" + update.fit.formula()
                                      + "): its performance here is optimistic; see the optimism-corrected values in 'updates'.");
    const BootstrapSettings bootstrap = options.bootstrap.resolved();
    if (bootstrap.replicates > 0) {
        const auto replicated = runBootstrap(result->cohort, validation, bootstrap, terminalProgress(), {});
        if (replicated)
            applyBootstrap(validation, *replicated);
    }
    printIntakeSummary(std::cout, *settings, *result);
    printPanel(std::cout, validation);
    printCautions(std::cout);
    if (!options.jsonFile.empty()) {
        const std::string text = resultJson(*settings, *result, validation, bootstrap, updates).dump(2) + "\n";
        if (auto written = writeFileAtomically(options.jsonFile, text); !written)
            return reportError(written.error());
        std::cout << "Result file: " << options.jsonFile << '\n';
    }
    return Done;
}

} // namespace

void addValidateCommand(CLI::App& app, int& exitStatus)
{
    auto options = std::make_shared<ValidateOptions>();
    CLI::App* command = app.add_subcommand("validate", "Validate one or more risk models on a cohort.");
    options->intake.addTo(*command);
    options->panel.addTo(*command);
    options->bootstrap.addTo(*command);
    command->add_option("--add-updated", options->addUpdated,
                        "Also validate each model updated on these data (intercept, logistic, closed-test)")
        ->check(CLI::IsMember({"intercept", "logistic", "closed-test"}));
    command->add_option("--json", options->jsonFile, "Write the full result as JSON");
    command->callback([options, command, &exitStatus] { exitStatus = runValidate(*options, *command); });
}

} // namespace plumbline::cli
