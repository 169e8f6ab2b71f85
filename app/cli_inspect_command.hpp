#pragma once

#include <CLI/CLI.hpp>

namespace plumbline::cli {

// `plumbline-cli inspect FILE`: each column's sniffed type, counts, range and problems.
void addInspectCommand(CLI::App& app, int& exitStatus);

} // namespace plumbline::cli
