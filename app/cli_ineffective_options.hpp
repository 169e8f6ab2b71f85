#pragma once

#include "files/analysis_file.hpp"

#include <CLI/CLI.hpp>

#include <string>
#include <vector>

namespace plumbline::cli {

// Options given on the command line that the analysis cannot use, each with what they need:
// the monitoring options without --period, --acceptable without --cluster. Printed as warnings
// so that a setting is never silently ignored.
std::vector<std::string> ineffectiveOptionWarnings(const CLI::App& command, const AnalysisFile& analysis);

} // namespace plumbline::cli
