// plumbline-cli: the headless entry point. Parses arguments, runs one command, and is the last
// line of defence: whatever escapes a command is reported once, with a non-crash exit status.
#include "cli_exit.hpp"
#include "cli_inspect_command.hpp"
#include "cli_plan_command.hpp"
#include "cli_simulate_command.hpp"
#include "cli_update_command.hpp"
#include "cli_validate_command.hpp"
#include "huge_pages.hpp"
#include "files/version.hpp"

#include <CLI/CLI.hpp>

#include <exception>
#include <iostream>

int main(int argc, char** argv)
{
    plumbline::restartWithHugePages(argv);
    using namespace plumbline::cli;
    CLI::App app{"Plumbline: validate binary-outcome clinical risk models on local data.", "plumbline-cli"};
    app.set_version_flag("--version", std::string("plumbline-cli ") + plumbline::versionString);
    app.require_subcommand(1);
    int exitStatus = Done;
    addInspectCommand(app, exitStatus);
    addValidateCommand(app, exitStatus);
    addSimulateCommand(app, exitStatus);
    addUpdateCommand(app, exitStatus);
    addPlanCommand(app, exitStatus);
    try {
        app.parse(argc, argv);
    } catch (const CLI::ParseError& error) {
        const int code = app.exit(error);
        return code == 0 ? Done : UnusableInput;
    } catch (const std::bad_alloc&) {
        std::cerr << "plumbline-cli: error: out of memory. What to do: close other programs or use a machine with more memory.\n";
        return InternalError;
    } catch (const std::exception& error) {
        std::cerr << "plumbline-cli: internal error: " << error.what()
                  << ". Please report it with the command line that caused it.\n";
        return InternalError;
    }
    return exitStatus;
}
