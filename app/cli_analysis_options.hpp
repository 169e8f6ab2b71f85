#pragma once

#include "files/analysis_file.hpp"
#include "cli_bootstrap_options.hpp"
#include "cli_intake_options.hpp"
#include "cli_panel_options.hpp"

#include <CLI/CLI.hpp>

#include <expected>
#include <string>

namespace plumbline::cli {

// Every option that defines an analysis: intake, panel, bootstrap, updating, report text and
// the small-cell rule, plus --settings (start from a saved analysis; options given on the
// command line override it) and --save-settings (write the analysis file).
struct AnalysisOptions {
    IntakeOptions intake;
    PanelOptions panel;
    BootstrapOptions bootstrap;
    std::string addUpdated;
    std::size_t minimumCell = AnalysisFile{}.minimumCell;
    ReportFields report;
    std::string settingsFile;
    std::string saveSettingsFile;
    bool allowOutsidePaths = false;
    bool strictInputs = false;

    void addTo(CLI::App& command);
    // The analysis as the user asked for it; warnings about the saved analysis's inputs go to
    // `warnings`.
    std::expected<AnalysisFile, InputError> resolved(const CLI::App& command, std::vector<std::string>& warnings) const;
};

} // namespace plumbline::cli
