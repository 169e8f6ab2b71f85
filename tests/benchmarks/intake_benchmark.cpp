// plumbline-bench: times the core on a large simulated cohort and reports numbers (never a
// pass/fail test: shared machines make timings noisy). Driven by run_benchmarks.sh.
//
//   plumbline-bench intake FILE [REPEATS]
//
// Prints one line per repeat and a summary: wall seconds (median), peak resident memory of the
// process and its ratio to the file size.
#include "intake.hpp"

#include <sys/resource.h>

#include <algorithm>
#include <chrono>
#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <string>
#include <vector>

namespace {

double peakResidentMegabytes()
{
    rusage usage{};
    getrusage(RUSAGE_SELF, &usage);
    return double(usage.ru_maxrss) / 1024.0; // ru_maxrss is in KiB on Linux
}

int benchmarkIntake(const std::string& path, int repeats)
{
    plumbline::IntakeSettings settings;
    settings.cohortFile = path;
    settings.outcomeColumn = "readmitted_30d";
    settings.scoreColumns = {"supplier_score", "local_score"};
    const double fileMegabytes = double(std::filesystem::file_size(path)) / (1024.0 * 1024.0);
    std::vector<double> seconds;
    std::size_t rows = 0;
    for (int r = 0; r < repeats; ++r) {
        const auto start = std::chrono::steady_clock::now();
        const auto result = plumbline::runIntake(settings);
        const auto stop = std::chrono::steady_clock::now();
        if (!result) {
            std::fprintf(stderr, "intake failed: %s\n", result.error().message().c_str());
            return 1;
        }
        rows = result->audit.rowsRead;
        seconds.push_back(std::chrono::duration<double>(stop - start).count());
        std::printf("  run %d: %.3f s\n", r + 1, seconds.back());
    }
    std::sort(seconds.begin(), seconds.end());
    const double peak = peakResidentMegabytes();
    std::printf("plumbline intake: rows=%zu file_mb=%.1f median_s=%.3f best_s=%.3f peak_rss_mb=%.1f rss_over_file=%.2f\n",
                rows, fileMegabytes, seconds[seconds.size() / 2], seconds.front(), peak, peak / fileMegabytes);
    return 0;
}

} // namespace

int main(int argc, char** argv)
{
    if (argc < 3 || std::string(argv[1]) != "intake") {
        std::fprintf(stderr, "usage: plumbline-bench intake FILE [REPEATS]\n");
        return 2;
    }
    const int repeats = argc > 3 ? std::max(1, std::atoi(argv[3])) : 5;
    return benchmarkIntake(argv[2], repeats);
}
