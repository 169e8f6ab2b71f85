#pragma once

#include <CLI/CLI.hpp>

namespace plumbline::cli {

// `plumbline-cli update`: updates one model for the local population and writes the ids with
// the original and the updated scores.
void addUpdateCommand(CLI::App& app, int& exitStatus);

} // namespace plumbline::cli
