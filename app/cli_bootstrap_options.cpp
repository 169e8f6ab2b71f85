#include "cli_bootstrap_options.hpp"

#include <unistd.h>

#include <cstdio>

namespace plumbline::cli {

void BootstrapOptions::addTo(CLI::App& command)
{
    command.add_option("--bootstrap", settings.replicates, "Bootstrap replicates (0 = analytic intervals only)")
        ->check(CLI::Range(std::size_t{0}, std::size_t{20000}));
    command.add_option("--seed", settings.seed, "Seed of the resampling; the same seed gives the same results")
        ->check(CLI::NonNegativeNumber);
    command.add_option("--threads", settings.threads, "Threads for the bootstrap; results do not depend on it")
        ->check(CLI::Range(1u, 256u));
    command.add_option("--ci-method", ciMethod, "Bootstrap interval type")->check(CLI::IsMember({"percentile", "bca"}));
    command.add_flag("--stratified-bootstrap", settings.stratified,
                     "Resample events and non-events separately (their numbers stay fixed)");
}

BootstrapSettings BootstrapOptions::resolved() const
{
    BootstrapSettings out = settings;
    out.method = ciMethod == "percentile" ? BootstrapCi::Percentile : BootstrapCi::Bca;
    return out;
}

BootstrapProgress terminalProgress()
{
    if (!::isatty(STDERR_FILENO))
        return {};
    return [](std::size_t done, std::size_t total) {
        std::fprintf(stderr, "\rbootstrap: %3zu %% (%zu of %zu replicates)", total ? done * 100 / total : 100, done, total);
        if (done == total)
            std::fprintf(stderr, "\n");
        std::fflush(stderr);
    };
}

} // namespace plumbline::cli
