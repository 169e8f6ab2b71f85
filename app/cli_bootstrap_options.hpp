#pragma once

#include "analyses/bootstrap_engine.hpp"

#include <CLI/CLI.hpp>

#include <string>

namespace plumbline::cli {

// The bootstrap options of `validate` (interface page), plus --stratified-bootstrap.
struct BootstrapOptions {
    BootstrapSettings settings;
    std::string ciMethod{bootstrapCiName(BootstrapSettings{}.method)}; // the core's default

    void addTo(CLI::App& command);
    BootstrapSettings resolved() const;
};

// Prints "bootstrap: 40 % (400 of 1000)" on stderr when it is a terminal; silent otherwise.
BootstrapProgress terminalProgress();

} // namespace plumbline::cli
