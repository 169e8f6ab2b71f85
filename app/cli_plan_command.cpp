#include "cli_plan_command.hpp"

#include "cli_exit.hpp"
#include "sample_size.hpp"

#include <iomanip>
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
    std::cout << "Minimum sample size for an external validation (Riley et al. 2021 criteria)\n"
              << "  anticipated outcome proportion " << options.prevalence << ", C statistic " << options.c << "\n"
              << "  linear predictor assumed Normal(" << std::fixed << std::setprecision(4) << plan->mu << ", "
              << plan->sigma << "^2), calibration assumed perfect\n\n";
    std::cout << "  " << std::left << std::setw(26) << "criterion" << std::right << std::setw(11) << "target SE" << std::setw(12)
              << "patients" << std::setw(10) << "events\n";
    for (const auto& c : plan->criteria)
        std::cout << "  " << std::left << std::setw(26) << c.name << std::right << std::setw(11) << std::setprecision(5) << c.targetSe
                  << std::setw(12) << c.patients << std::setw(10) << std::setprecision(0) << c.events << '\n';
    std::cout << "\n  Minimum: " << plan->minimum << " patients (about " << std::setprecision(0) << double(plan->minimum) * options.prevalence
              << " events), driven by the " << plan->driver << " criterion.\n"
              << "  Targets: CI widths 0.2 for O/E and slope, 0.1 for C, 0.2 for standardised net benefit (common choices; "
                 "set them with --oe-width, --slope-width, --c-width, --nb-width).\n";
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
