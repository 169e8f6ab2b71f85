#include "cli_exit.hpp"

#include <algorithm>
#include <cstdio>
#include <fstream>
#include <iostream>
#include <string>
#include <sys/stat.h>

namespace plumbline::cli {

int reportError(const InputError& error)
{
    std::cerr << "plumbline-cli: error: " << error.message() << '\n';
    return error.kind == ErrorKind::ImpossibleAnalysis ? ImpossibleAnalysis : UnusableInput;
}

int reportOutOfMemory(const std::string& cohortFile)
{
    struct stat status {};
    const double bytes = ::stat(cohortFile.c_str(), &status) == 0 ? double(status.st_size) : 0.0;
    std::ifstream file(cohortFile, std::ios::binary);
    std::string sample(1 << 16, '\0');
    file.read(sample.data(), std::streamsize(sample.size()));
    sample.resize(std::size_t(file.gcount()));
    const double lines = double(std::count(sample.begin(), sample.end(), '\n'));
    const double rows = lines > 1 ? bytes / (double(sample.size()) / lines) : 0.0;
    char text[512];
    if (bytes == 0.0) {
        std::cerr << "plumbline-cli: error: the run ran out of memory. What to do: close other programs, use a machine with more "
                     "memory, or validate a sample or one period at a time.\n";
        return UnusableInput;
    }
    std::snprintf(text, sizeof text,
                  "plumbline-cli: error: %s: the run ran out of memory on a cohort of about %.0f rows (%.0f MB). What to do: a run of "
                  "that size needs about %.0f MB of free memory (about three times the file); close other programs, use a machine "
                  "with more memory, or validate a sample or one period at a time.\n",
                  cohortFile.c_str(), rows, bytes / 1e6, 3.0 * bytes / 1e6 + 200.0);
    std::cerr << text;
    return UnusableInput;
}

} // namespace plumbline::cli
