#pragma once

#include "input_error.hpp"
#include "panel_settings.hpp"

#include <CLI/CLI.hpp>

#include <expected>
#include <string>

namespace plumbline::cli {

// The metric-panel options of `validate` (names from the interface page, plus our own two).
struct PanelOptions {
    std::string thresholds = "0.1,0.2,0.3";
    std::size_t groups = 10;
    double confidence = 0.95;
    std::string cInterval = "logit";
    std::string binomialInterval = "wilson";
    std::string nriCuts;
    std::string decisionRange = "0.05,0.50,0.01";
    std::string periodUnit = "month";
    std::string dateFormat = "iso";

    void addTo(CLI::App& command);
    std::expected<PanelSettings, InputError> resolved() const;
};

} // namespace plumbline::cli
