#include "cli_simulate_command.hpp"

#include "files/atomic_file.hpp"
#include "cli_exit.hpp"
#include "files/cohort_simulator.hpp"

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
    command->callback([options, &exitStatus] {
        const bool split = !options->scoresOut.empty() || !options->outcomesOut.empty();
        const SimulatedFiles files = simulateCohort({options->rows, options->seed, options->decimals}, split);
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
        exitStatus = Done;
    });
}

} // namespace plumbline::cli
