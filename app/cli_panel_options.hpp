#pragma once

#include "intake/input_error.hpp"
#include "analyses/panel_settings.hpp"

#include <CLI/CLI.hpp>

#include <expected>
#include <string>

namespace plumbline::cli {

// The metric-panel options of `validate` (names from the interface page, plus our own two).
struct PanelOptions {
    // Defaults come from PanelSettings{}: the one source of defaults for the CLI, the window and
    // the analysis-file reader.
    PanelOptions();

    std::string thresholds;
    std::size_t groups;
    double confidence;
    double decisionThreshold;
    std::string cInterval;
    std::string binomialInterval;
    std::string nriCuts;
    std::string decisionRange;
    std::string periodUnit;
    std::string dateFormat;
    std::string capacity; // empty: no capacity
    std::string acceptable;
    std::string cusumOdds;
    double cusumYears;

    void addTo(CLI::App& command);
    std::expected<PanelSettings, InputError> resolved() const;
};

} // namespace plumbline::cli
