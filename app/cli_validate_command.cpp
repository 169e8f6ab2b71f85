#include "cli_validate_command.hpp"

#include "atomic_file.hpp"
#include "cli_exit.hpp"
#include "cli_intake_options.hpp"
#include "cli_text.hpp"
#include "intake.hpp"
#include "result_json.hpp"

#include <iostream>
#include <memory>

namespace plumbline::cli {

namespace {

struct ValidateOptions {
    IntakeOptions intake;
    std::string jsonFile;
};

nlohmann::ordered_json resultJson(const IntakeSettings& settings, const IntakeResult& result)
{
    nlohmann::ordered_json json;
    json["plumbline"] = provenanceJson(utcTimestamp());
    json["inputs"] = inputsJson(result.inputs);
    json["settings"] = intakeSettingsJson(settings);
    json["cohort"] = cohortJson(result.audit);
    json["warnings"] = result.audit.warnings;
    return json;
}

int runValidate(const ValidateOptions& options, const CLI::App& command)
{
    const auto settings = options.intake.resolved(command);
    if (!settings)
        return reportError(settings.error());
    const auto result = runIntake(*settings);
    if (!result)
        return reportError(result.error());
    printIntakeSummary(std::cout, *settings, *result);
    if (!options.jsonFile.empty()) {
        const std::string text = resultJson(*settings, *result).dump(2) + "\n";
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
    command->add_option("--json", options->jsonFile, "Write the full result as JSON");
    command->callback([options, command, &exitStatus] { exitStatus = runValidate(*options, *command); });
}

} // namespace plumbline::cli
