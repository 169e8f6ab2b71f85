#include "cli_simulate_command.hpp"

#include "files/atomic_file.hpp"
#include "cli_exit.hpp"
#include "files/cohort_simulator.hpp"
#include "files/cohort_stata_file.hpp"
#include "files/cohort_workbook.hpp"

#include <iostream>
#include <memory>

namespace plumbline::cli {

namespace {
struct SimulateOptions {
    std::size_t rows = 24000;
    std::uint64_t seed = 20240101;
    int decimals = 4;
    std::string out;
    std::string scoresOut;
    std::string outcomesOut;
    std::string xlsxOut;
    std::string dtaOut;
};
} // namespace

void addSimulateCommand(CLI::App& app, int& exitStatus)
{
    auto options = std::make_shared<SimulateOptions>();
    CLI::App* command = app.add_subcommand("simulate", "Write an invented cohort (the sample scenario) of any size.");
    command->add_option("--rows", options->rows, "Number of discharges")->required()->check(CLI::Range(std::size_t{1}, std::size_t{100000000}));
    command->add_option("--seed", options->seed, "Seed; the same seed gives the same bytes")->required();
    command->add_option("--decimals", options->decimals, "Decimals of the risks written (default 4; 9 for a model exported "
                                                         "at full precision, nearly every risk distinct)")
        ->check(CLI::Range(1, 12));
    command->add_option("--out", options->out, "Cohort file to write (scores and outcome in one file)")->required();
    command->add_option("--scores-out", options->scoresOut, "Also write the scores alone, shuffled, with defects");
    command->add_option("--outcomes-out", options->outcomesOut, "Also write the outcomes alone, shuffled, with defects");
    command->add_option("--xlsx-out", options->xlsxOut, "Also write the cohort as a workbook (sheet 'Cohort'; at most 1,048,575 rows)");
    command->add_option("--dta-out", options->dtaOut, "Also write the cohort as a Stata file (at most 1,048,575 rows)");
    command->callback([options, &exitStatus] {
        const bool split = !options->scoresOut.empty() || !options->outcomesOut.empty();
        const bool typed = !options->xlsxOut.empty() || !options->dtaOut.empty();
        // The typed copies are built whole before they are written; a worksheet's row limit
        // bounds them (and their memory) for both formats.
        if (typed && options->rows > workbookMaxRecords) {
            InputError error;
            error.key = options->xlsxOut.empty() ? "--dta-out" : "--xlsx-out";
            error.value = std::to_string(options->rows) + " rows";
            error.problem = "a workbook or Stata copy of the cohort holds at most " + std::to_string(workbookMaxRecords) + " rows.";
            error.remedy = "lower --rows, or write the larger cohort as CSV only (--out).";
            exitStatus = reportError(error);
            return;
        }
        const SimulatedFiles files = simulateCohort({options->rows, options->seed, options->decimals}, split, typed);
        const std::pair<const std::string*, const std::string*> outputs[] = {
            {&options->out, &files.cohort}, {&options->scoresOut, &files.scores}, {&options->outcomesOut, &files.outcomes}};
        for (const auto& [path, bytes] : outputs) {
            if (path->empty())
                continue;
            if (auto written = writeFileAtomically(*path, *bytes); !written) {
                exitStatus = reportError(written.error());
                return;
            }
            std::cout << "wrote " << *path << '\n';
        }
        if (!options->xlsxOut.empty()) {
            if (auto written = writeCohortWorkbook(files.cells, options->xlsxOut); !written) {
                exitStatus = reportError(written.error());
                return;
            }
            std::cout << "wrote " << options->xlsxOut << '\n';
        }
        if (!options->dtaOut.empty()) {
            auto bytes = cohortStataFileBytes(files.cells, options->dtaOut);
            if (!bytes) {
                exitStatus = reportError(bytes.error());
                return;
            }
            if (auto written = writeFileAtomically(options->dtaOut, *bytes); !written) {
                exitStatus = reportError(written.error());
                return;
            }
            std::cout << "wrote " << options->dtaOut << '\n';
        }
        exitStatus = Done;
    });
}

} // namespace plumbline::cli
