#include "cli_plan_command.hpp"

#include "cli_exit.hpp"
#include "analyses/sample_size.hpp"

#include <iostream>
#include <memory>

namespace plumbline::cli {

namespace {
struct PlanOptions {
    double prevalence = 0.0;
    double c = 0.0;
    std::vector<double> thresholds{0.1};
    SampleSizeTargets targets;
};

int runPlan(const PlanOptions& options)
{
    SampleSizeTargets targets = options.targets;
    targets.thresholds = options.thresholds;
    const auto plan = planSampleSize(options.prevalence, options.c, targets);
    if (!plan) {
        InputError error;
        error.problem = "the prevalence must lie between 0 and 1 and the C statistic between 0.5 and 1.";
        error.remedy = "give e.g. --prevalence 0.15 --c-statistic 0.70.";
        return reportError(error);
    }
    std::cout << describePlan(*plan, options.prevalence, options.c, targets)
              << "  Set the targets with --oe-width, --slope-width, --c-width and --nb-width.\n";
    return Done;
}
} // namespace

void addPlanCommand(CLI::App& app, int& exitStatus)
{
    auto options = std::make_shared<PlanOptions>();
    CLI::App* command = app.add_subcommand("plan", "Minimum sample size for validating a model (Riley et al. 2021).");
    command->add_option("--prevalence", options->prevalence, "Anticipated outcome proportion")->required();
    command->add_option("--c-statistic", options->c, "Anticipated C statistic")->required();
    command->add_option("--threshold", options->thresholds, "Threshold(s) for the net-benefit criterion (default 0.1)");
    command->add_option("--oe-width", options->targets.oeWidth, "Target CI width of O/E");
    command->add_option("--slope-width", options->targets.slopeWidth, "Target CI width of the calibration slope");
    command->add_option("--c-width", options->targets.cWidth, "Target CI width of the C statistic");
    command->add_option("--nb-width", options->targets.netBenefitWidth, "Target CI width of standardised net benefit");
    command->callback([options, &exitStatus] { exitStatus = runPlan(*options); });
}

} // namespace plumbline::cli
