#pragma once

#include "intake/input_error.hpp"

namespace plumbline::cli {

// Exit statuses of plumbline-cli (the interface page): 0 done, 1 internal error,
// 2 unusable input or setting, 3 analysis impossible on these data.
enum ExitStatus : int { Done = 0, InternalError = 1, UnusableInput = 2, ImpossibleAnalysis = 3 };

// Prints the error on stderr in the one format every command shares and returns its status.
int reportError(const InputError& error);

// Running out of memory on a cohort is the size of the data, not a bug: says how many rows the
// file holds (estimated from its first lines) and how much memory a run of that size needs.
int reportOutOfMemory(const std::string& cohortFile);

} // namespace plumbline::cli
