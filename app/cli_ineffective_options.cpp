#include "cli_ineffective_options.hpp"

namespace plumbline::cli {

std::vector<std::string> ineffectiveOptionWarnings(const CLI::App& command, const AnalysisFile& analysis)
{
    std::vector<std::string> out;
    auto given = [&](const char* option) { return command.count(option) > 0; };
    if (!analysis.intake.periodColumn)
        for (const char* option : {"--cusum-odds", "--cusum-years"})
            if (given(option))
                out.push_back(std::string(option) + " has no effect without --period: monitoring needs a date column; "
                              "name one with --period COLUMN.");
    if (!analysis.intake.clusterColumn && given("--acceptable"))
        out.push_back("--acceptable has no effect without --cluster: the acceptability of a new site needs a site column; "
                      "name one with --cluster COLUMN.");
    return out;
}

} // namespace plumbline::cli
