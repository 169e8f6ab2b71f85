#pragma once

#include <CLI/CLI.hpp>

namespace plumbline::cli {

// `plumbline-cli simulate`: writes an invented cohort of any size, deterministically.
void addSimulateCommand(CLI::App& app, int& exitStatus);

} // namespace plumbline::cli
