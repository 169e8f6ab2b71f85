#include "cli_exit.hpp"

#include <iostream>

namespace plumbline::cli {

int reportError(const InputError& error)
{
    std::cerr << "plumbline-cli: error: " << error.message() << '\n';
    return error.kind == ErrorKind::ImpossibleAnalysis ? ImpossibleAnalysis : UnusableInput;
}

} // namespace plumbline::cli
