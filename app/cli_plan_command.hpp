#pragma once

#include <CLI/CLI.hpp>

namespace plumbline::cli {

// `plumbline-cli plan`: the minimum sample size of an external validation study.
void addPlanCommand(CLI::App& app, int& exitStatus);

} // namespace plumbline::cli
