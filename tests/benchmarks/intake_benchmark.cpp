// plumbline-bench: times the core on a large simulated cohort and reports numbers (never a
// pass/fail test: shared machines make timings noisy). Driven by run_benchmarks.sh.
//
//   plumbline-bench intake FILE [REPEATS]   intake alone: wall seconds, peak memory / file size
//   plumbline-bench panel FILE [REPEATS]    the whole metric panel (ICI included) after intake,
//                                           for both score columns of a simulated cohort
//   plumbline-bench planner                 the sample-size planner: milliseconds per answer
//   plumbline-bench bootstrap FILE REPLICATES [curve]
//                                           the bootstrap of the supplier score's panel on 2
//                                           threads; with "curve" also ICI and both bands
#include "huge_pages.hpp"
#include "intake/intake.hpp"
#include "analyses/bootstrap_engine.hpp"
#include "analyses/sample_size.hpp"
#include "analyses/validation.hpp"

#include <sys/resource.h>

#include <algorithm>
#include <chrono>
#include <cstdio>
#include <cstdlib>
#include <cstring>
#include <filesystem>
#include <string>
#include <vector>

namespace {

// Resets the kernel's peak-resident counter (Linux /proc/self/clear_refs, value 5) so that the
// extra memory of one step can be read from VmHWM afterwards.
void resetPeakResident()
{
    if (std::FILE* f = std::fopen("/proc/self/clear_refs", "w")) {
        std::fputs("5", f);
        std::fclose(f);
    }
}

double statusMegabytes(const char* field)
{
    double kib = 0.0;
    if (std::FILE* f = std::fopen("/proc/self/status", "r")) {
        char line[256];
        const std::size_t length = std::strlen(field);
        while (std::fgets(line, sizeof line, f))
            if (std::strncmp(line, field, length) == 0)
                kib = std::atof(line + length + 1);
        std::fclose(f);
    }
    return kib / 1024.0;
}

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

int benchmarkPanel(const std::string& path, int repeats)
{
    plumbline::IntakeSettings settings;
    settings.cohortFile = path;
    settings.outcomeColumn = "readmitted_30d";
    settings.scoreColumns = {"supplier_score", "local_score"};
    const auto intake = plumbline::runIntake(settings);
    if (!intake) {
        std::fprintf(stderr, "intake failed: %s\n", intake.error().message().c_str());
        return 1;
    }
    std::vector<double> seconds;
    for (int r = 0; r < repeats; ++r) {
        const auto start = std::chrono::steady_clock::now();
        const auto result = plumbline::runValidation(intake->cohort, plumbline::PanelSettings{});
        const auto stop = std::chrono::steady_clock::now();
        seconds.push_back(std::chrono::duration<double>(stop - start).count());
        std::printf("  run %d: %.3f s (C %.4f, ICI %.4f, curve %s)\n", r + 1, seconds.back(),
                    *result.models[0].metric("c_statistic")->value, *result.models[0].metric("ici")->value,
                    result.models[0].calibrationCurveMethod.c_str());
    }
    std::sort(seconds.begin(), seconds.end());
    std::printf("plumbline panel: rows=%zu models=2 median_s=%.3f best_s=%.3f\n", intake->cohort.rows(),
                seconds[seconds.size() / 2], seconds.front());
    return 0;
}

// User and system CPU of this process so far, seconds (both threads count).
double cpuSeconds()
{
    rusage usage{};
    getrusage(RUSAGE_SELF, &usage);
    return double(usage.ru_utime.tv_sec + usage.ru_stime.tv_sec) + double(usage.ru_utime.tv_usec + usage.ru_stime.tv_usec) / 1e6;
}

int benchmarkBootstrap(const std::string& path, std::size_t replicates, bool curve)
{
    plumbline::IntakeSettings settings;
    settings.cohortFile = path;
    settings.outcomeColumn = "readmitted_30d";
    settings.scoreColumns = {"supplier_score"};
    const auto intake = plumbline::runIntake(settings);
    if (!intake) {
        std::fprintf(stderr, "intake failed: %s\n", intake.error().message().c_str());
        return 1;
    }
    const auto full = plumbline::runValidation(intake->cohort, plumbline::PanelSettings{});
    resetPeakResident();
    const double before = statusMegabytes("VmRSS");
    plumbline::BootstrapSettings bootstrap;
    bootstrap.replicates = replicates;
    bootstrap.smoothedCurve = curve;
    const double cpuBefore = cpuSeconds();
    const auto start = std::chrono::steady_clock::now();
    const auto result = plumbline::runBootstrap(intake->cohort, full, bootstrap, {}, {});
    const auto stop = std::chrono::steady_clock::now();
    const double cpu = cpuSeconds() - cpuBefore;
    const double extra = statusMegabytes("VmHWM") - before;
    std::size_t distinct = 0;
    {
        std::vector<double> risks = intake->cohort.models[0].values;
        std::sort(risks.begin(), risks.end());
        distinct = std::size_t(std::unique(risks.begin(), risks.end()) - risks.begin());
    }
    std::printf("plumbline bootstrap: rows=%zu distinct=%zu replicates=%zu curve=%s threads=2 wall_s=%.2f cpu_s=%.2f extra_peak_mb=%.1f "
                "extra_bytes_per_row=%.1f C_ci=[%.4f,%.4f]\n",
                intake->cohort.rows(), distinct, replicates, curve ? "yes" : "no",
                std::chrono::duration<double>(stop - start).count(), cpu, extra,
                extra * 1024 * 1024 / double(intake->cohort.rows()),
                result->models[0].metrics[0]->bca->first, result->models[0].metrics[0]->bca->second);
    return 0;
}

} // namespace

// The sample-size planner as the window uses it: one answer per change a person types. Walks a
// grid of prevalences and C statistics (with three net-benefit thresholds) and reports the mean
// and the slowest answer.
int benchmarkPlanner()
{
    std::vector<double> millis;
    plumbline::SampleSizeTargets targets;
    targets.thresholds = {0.1, 0.2, 0.3};
    for (double prevalence : {0.01, 0.05, 0.1, 0.15, 0.2, 0.3, 0.5})
        for (double c : {0.55, 0.6, 0.65, 0.7, 0.75, 0.8, 0.85, 0.9, 0.95}) {
            const auto start = std::chrono::steady_clock::now();
            const auto plan = plumbline::planSampleSize(prevalence, c, targets);
            const std::string text = plan ? plumbline::describePlan(*plan, prevalence, c, targets) : std::string();
            millis.push_back(std::chrono::duration<double, std::milli>(std::chrono::steady_clock::now() - start).count());
            if (text.empty())
                return 1;
        }
    double total = 0.0;
    for (double m : millis)
        total += m;
    std::printf("planner: changes=%zu mean_ms=%.1f max_ms=%.1f\n", millis.size(), total / double(millis.size()),
                *std::max_element(millis.begin(), millis.end()));
    return 0;
}

int main(int argc, char** argv)
{
    plumbline::restartWithHugePages(argv); // as the entry points do
    const std::string mode = argc > 1 ? argv[1] : "";
    if (mode == "planner")
        return benchmarkPlanner();
    if (mode == "bootstrap" && argc >= 4)
        return benchmarkBootstrap(argv[2], std::strtoul(argv[3], nullptr, 10), argc > 4 && std::string(argv[4]) == "curve");
    if (argc < 3 || (mode != "intake" && mode != "panel")) {
        std::fprintf(stderr, "usage: plumbline-bench intake|panel FILE [REPEATS] | bootstrap FILE REPLICATES [curve] | planner\n");
        return 2;
    }
    const int repeats = argc > 3 ? std::max(1, std::atoi(argv[3])) : 5;
    return mode == "intake" ? benchmarkIntake(argv[2], repeats) : benchmarkPanel(argv[2], repeats);
}
