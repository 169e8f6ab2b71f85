#include "cli_update_command.hpp"

#include "files/atomic_file.hpp"
#include "cli_exit.hpp"
#include "cli_intake_options.hpp"
#include "cli_text.hpp"
#include "files/csv_quoting.hpp"
#include "intake/intake.hpp"
#include "metrics/metric_reading.hpp"
#include "analyses/model_updating.hpp"
#include "files/result_json.hpp"
#include "files/update_json.hpp"
#include "reporting/value_text.hpp"

#include <system_error>
#include <charconv>
#include <iomanip>
#include <iostream>
#include <memory>

namespace plumbline::cli {

namespace {

struct UpdateOptions {
    IntakeOptions intake;
    std::string method = "closed-test";
    std::string out;
    std::string jsonFile;
    std::size_t replicates = 200;
    std::uint64_t seed = 20240101;
};

std::string shortest(double value)
{
    char buffer[32];
    const auto result = std::to_chars(buffer, buffer + sizeof buffer, value);
    return std::string(buffer, result.ptr);
}

void printUpdate(const ModelUpdate& u)
{
    std::cout << "\nUpdating " << u.model << " (" << updateMethodName(u.method) << "): " << updateChoiceName(u.fit.choice) << '\n';
    if (u.fit.tests)
        std::cout << "  closed test: intercept and slope jointly " << pValueText(u.fit.tests->joint->pValue)
                  << "; slope given intercept " << pValueText(u.fit.tests->slopeGivenIntercept->pValue) << '\n';
    std::cout << "  " << u.fit.formula() << "\n\n";
    std::cout << "  " << std::left << std::setw(24) << "metric" << std::right << std::setw(10) << "apparent" << std::setw(10)
              << "optimism" << std::setw(11) << "corrected\n";
    for (const auto& row : u.optimism)
        std::cout << "  " << std::left << std::setw(24) << metricLabel(row.key) << std::right << std::setw(10)
                  << fixedText(row.apparent, 4) << std::setw(10) << fixedText(row.optimism, 4) << std::setw(10)
                  << fixedText(row.corrected, 4) << '\n';
    std::cout << "  (optimism from " << u.replicatesUsed << " of " << u.replicates << " bootstrap refits of the whole procedure)\n";
    for (const auto& caution : u.cautions)
        std::cout << "  note: " << caution << '\n';
}

int runUpdate(const UpdateOptions& options, const CLI::App& command)
{
    auto settings = options.intake.resolved(command);
    if (!settings)
        return reportError(settings.error());
    if (settings->scoreColumns.size() != 1 || !settings->idColumn) {
        InputError error;
        error.file = settings->cohortFile;
        error.problem = "update needs exactly one --score and an --id to write the updated scores against.";
        error.remedy = "name one score column and the id column (e.g. --score supplier_score --id encounter_id).";
        return reportError(error);
    }
    std::vector<std::string> inputs{settings->cohortFile};
    if (settings->outcomesFile)
        inputs.push_back(*settings->outcomesFile);
    for (const auto& [output, option] : {std::pair{options.out, "--out"}, std::pair{options.jsonFile, "--json"}})
        if (auto ok = refuseInputAsOutput(output, inputs, option); !ok)
            return reportError(ok.error());
    const auto intake = runIntake(*settings);
    if (!intake)
        return reportError(intake.error());
    if (!scaleIsProbabilistic(intake->cohort.scale)) {
        InputError error;
        error.file = settings->cohortFile;
        error.column = settings->scoreColumns[0];
        error.problem = "a points score has no risks to recalibrate.";
        error.remedy = "give risks on the probability, percent or logit scale.";
        return reportError(error);
    }
    UpdateSettings update;
    update.method = options.method == "intercept" ? UpdateMethod::Intercept
        : options.method == "logistic"           ? UpdateMethod::Logistic
                                                 : UpdateMethod::ClosedTest;
    update.optimismReplicates = options.replicates;
    update.seed = options.seed;
    const ModelScores& model = intake->cohort.models[0];
    const auto result = updateModel(intake->cohort.outcome, model.values, model.name, update);
    if (!result) {
        InputError error;
        error.kind = ErrorKind::ImpossibleAnalysis;
        error.file = settings->cohortFile;
        error.column = model.name;
        error.problem = "the update cannot be fitted: the risks separate the outcomes perfectly or are all equal.";
        error.remedy = "check the score column; an update needs both outcomes across a spread of risks.";
        return reportError(error);
    }
    printIntakeSummary(std::cout, *settings, *intake);
    printUpdate(*result);
    std::string csv = csvQuoted(*settings->idColumn) + "," + csvQuoted(model.name) + "," + csvQuoted(model.name + "_updated") + "\n";
    for (std::size_t i = 0; i < intake->cohort.rows(); ++i)
        csv += csvQuoted(intake->cohort.ids[i]) + "," + shortest(model.values[i]) + "," + shortest(result->fit.updatedRisk(model.values[i])) + "\n";
    if (auto written = writeFileAtomically(options.out, csv); !written)
        return reportError(written.error());
    std::cout << "\nUpdated scores: " << options.out << " (" << withThousands(intake->cohort.rows())
              << " rows: id, original and updated risk)\n";
    if (!options.jsonFile.empty()) {
        nlohmann::ordered_json json;
        json["plumbline"] = provenanceJson(utcTimestamp());
        json["inputs"] = inputsJson(intake->inputs);
        json["settings"] = intakeSettingsJson(*settings);
        json["cohort"] = cohortJson(intake->audit);
        json["updates"] = nlohmann::ordered_json::array({updateJson(*result)});
        if (auto written = writeFileAtomically(options.jsonFile, json.dump(2) + "\n"); !written)
            return reportError(written.error());
    }
    printCautions(std::cout);
    return Done;
}

} // namespace

void addUpdateCommand(CLI::App& app, int& exitStatus)
{
    auto options = std::make_shared<UpdateOptions>();
    CLI::App* command = app.add_subcommand("update", "Update one model for the local population (intercept or logistic recalibration).");
    options->intake.addTo(*command);
    command->add_option("--method", options->method, "intercept, logistic, or closed-test (choose by likelihood-ratio tests)")
        ->check(CLI::IsMember({"intercept", "logistic", "closed-test"}));
    command->add_option("--out", options->out, "CSV to write: id, original score, updated score")->required();
    command->add_option("--json", options->jsonFile, "Write the update (formula, tests, optimism) as JSON");
    command->add_option("--bootstrap", options->replicates, "Bootstrap refits for the optimism correction")
        ->check(CLI::Range(std::size_t{10}, std::size_t{20000}));
    command->add_option("--seed", options->seed, "Seed of the optimism bootstrap");
    command->callback([options, command, &exitStatus] {
        try {
            exitStatus = runUpdate(*options, *command);
        } catch (const std::bad_alloc&) {
            exitStatus = reportOutOfMemory(options->intake.settings.cohortFile);
        } catch (const std::system_error& error) {
            // A thread whose stack cannot be mapped is memory running out too (EAGAIN).
            if (error.code() != std::errc::resource_unavailable_try_again)
                throw;
            exitStatus = reportOutOfMemory(options->intake.settings.cohortFile);
        }
    });
}

} // namespace plumbline::cli
