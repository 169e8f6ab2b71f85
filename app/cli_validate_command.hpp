#pragma once

#include <CLI/CLI.hpp>

namespace plumbline::cli {

// `plumbline-cli validate`: reads the cohort, prints the audit and writes the result JSON.
void addValidateCommand(CLI::App& app, int& exitStatus);

} // namespace plumbline::cli
