#pragma once

#include "intake/input_error.hpp"
#include "intake/intake_settings.hpp"

#include <CLI/CLI.hpp>

#include <expected>
#include <string>

namespace plumbline::cli {

// The intake options shared by the commands that read a cohort (names from the interface page).
struct IntakeOptions {
    IntakeSettings settings;
    std::string outcomesFile;
    std::string idColumn;
    std::string outcomesIdColumn;
    std::string eventValue;
    std::string periodColumn;
    std::optional<std::string> clusterColumn;
    std::string scale = "probability";
    std::string delimiter;
    std::string sheet;
    std::string database;
    std::string query;
    std::string queryFile;

    // `required`: the CLI needs the file and columns; the window can ask for them in a dialog.
    void addTo(CLI::App& command, bool required = true);
    // Copies the parsed strings into settings; an InputError for a delimiter that is not one character.
    std::expected<IntakeSettings, InputError> resolved(const CLI::App& command) const;

private:
    bool m_fileRequired = true;
};

} // namespace plumbline::cli
