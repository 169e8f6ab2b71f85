#include "analyses/bootstrap_engine.hpp"
#include "support/check_datasets.hpp"
#include "files/cohort_simulator.hpp"
#include "support/intake_test_support.hpp"
#include "resampling/random_stream.hpp"
#include "files/validation_json.hpp"

#include <catch2/catch.hpp>

#include <algorithm>
#include <chrono>
#include <thread>

using namespace plumbline;
using namespace plumbline::test;
using Catch::Matchers::WithinAbs;

namespace {

Cohort cohortOf(const CheckData& data)
{
    Cohort cohort;
    cohort.outcome = data.y;
    cohort.models.push_back({"model", data.p});
    return cohort;
}

std::string bootstrappedJson(const Cohort& cohort, BootstrapSettings settings)
{
    ValidationResult result = runValidation(cohort, PanelSettings{});
    const auto bootstrap = runBootstrap(cohort, result, settings, {}, {});
    REQUIRE(bootstrap);
    applyBootstrap(result, *bootstrap);
    return modelsJson(result).dump();
}

} // namespace

TEST_CASE("The same seed gives identical results with one thread or two", "[bootstrap][engine]")
{
    Cohort cohort = cohortOf(gen1000());
    cohort.models.push_back({"second", toy20B().p});
    cohort.models.back().values.resize(1000);
    for (std::size_t i = 20; i < 1000; ++i)
        cohort.models.back().values[i] = 0.05 + 0.9 * double((i * 37) % 101) / 100.0;
    BootstrapSettings settings;
    settings.replicates = 120;
    settings.seed = 77;
    settings.threads = 1;
    const std::string one = bootstrappedJson(cohort, settings);
    settings.threads = 2;
    CHECK(bootstrappedJson(cohort, settings) == one);
    settings.threads = 3;
    CHECK(bootstrappedJson(cohort, settings) == one);
    settings.seed = 78;
    CHECK(bootstrappedJson(cohort, settings) != one);
}

TEST_CASE("Every metric gets a percentile and a BCa interval around its estimate", "[bootstrap][engine]")
{
    const Cohort cohort = cohortOf(gen1000());
    ValidationResult result = runValidation(cohort, PanelSettings{});
    BootstrapSettings settings;
    settings.replicates = 300;
    const auto bootstrap = runBootstrap(cohort, result, settings, {}, {});
    REQUIRE(bootstrap);
    applyBootstrap(result, *bootstrap);
    const ModelValidation& m = result.models[0];
    for (const auto& entry : m.metrics) {
        INFO(entry.key);
        REQUIRE(entry.bootstrap);
        CHECK(entry.bootstrap->replicatesUsed == 300);
        CHECK(entry.bootstrap->percentile.first <= entry.bootstrap->percentile.second);
        CHECK(entry.estimate.ciMethod == CiMethod::BootstrapBca);
        CHECK(*entry.estimate.lower <= *entry.estimate.upper);
        CHECK_FALSE(entry.bootstrap->accelerationMethod.empty());
    }
    // The bootstrap SE of C is close to DeLong's 0.0173344 (docs/methods.md §4) on 1,000 patients.
    CHECK_THAT(m.metrics[CStatistic].bootstrap->se, WithinAbs(0.0173344, 0.004));
    CHECK(m.metrics[CStatistic].analytic->ciMethod == CiMethod::DeLongLogit);
    CHECK(m.calibrationBand.x.size() == m.calibrationCurve.size());
    CHECK(m.rocBand.x.size() == 101);
    for (std::size_t j = 0; j < m.rocBand.x.size(); ++j)
        CHECK(m.rocBand.lower[j] <= m.rocBand.upper[j]);
    REQUIRE(result.bootstrap);
    CHECK(result.bootstrap->seed == settings.seed);
}

TEST_CASE("Draws without events are redrawn and counted and stratified draws never need it", "[bootstrap][engine]")
{
    CheckData tiny;
    for (int i = 0; i < 30; ++i) {
        tiny.y.push_back(i == 3 || i == 17 ? 1 : 0);
        tiny.p.push_back(0.02 + 0.03 * i);
    }
    const Cohort cohort = cohortOf(tiny);
    const ValidationResult result = runValidation(cohort, PanelSettings{});
    BootstrapSettings settings;
    settings.replicates = 200;
    settings.smoothedCurve = false;
    const auto plain = runBootstrap(cohort, result, settings, {}, {});
    REQUIRE(plain);
    CHECK(plain->redrawn > 0); // P(no event in 30 draws) = (28/30)^30 ≈ 0.13 per draw
    settings.stratified = true;
    const auto stratified = runBootstrap(cohort, result, settings, {}, {});
    REQUIRE(stratified);
    CHECK(stratified->redrawn == 0);
}

TEST_CASE("Progress is reported at every percent in order", "[bootstrap][engine]")
{
    const Cohort cohort = cohortOf(gen1000());
    const ValidationResult result = runValidation(cohort, PanelSettings{});
    BootstrapSettings settings;
    settings.replicates = 250;
    settings.smoothedCurve = false;
    std::vector<std::size_t> seen;
    const auto bootstrap = runBootstrap(cohort, result, settings,
                                        [&](std::size_t done, std::size_t total) {
                                            CHECK(total == 250);
                                            seen.push_back(done);
                                        },
                                        {});
    REQUIRE(bootstrap);
    REQUIRE(seen.size() >= 101);
    CHECK(seen.front() == 0);
    CHECK(seen.back() == 250);
    for (std::size_t i = 1; i < seen.size(); ++i) {
        CHECK(seen[i] > seen[i - 1]);
        CHECK(seen[i] - seen[i - 1] <= 3); // 1 % of 250 replicates is 2.5
    }
}

TEST_CASE("A cancel request stops the bootstrap within 100 ms", "[timing]")
{
    // Three cancels at different moments; the median latency must stay under 100 ms, so that one
    // scheduling hiccup of a shared machine does not decide the result.
    const auto files = simulateCohort({200000, 99}, false);
    const auto intake = intakeOf(settingsFor({"supplier_score", "local_score"}, "readmitted_30d"), files.cohort);
    REQUIRE(intake);
    const ValidationResult result = runValidation(intake->cohort, PanelSettings{});
    BootstrapSettings settings;
    settings.replicates = 10000; // far more than can finish before the cancel
    std::vector<long long> latencies;
    for (int trial = 0; trial < 3; ++trial) {
        std::stop_source stop;
        std::optional<BootstrapResult> outcome;
        std::chrono::steady_clock::time_point finished;
        std::jthread runner([&] {
            outcome = runBootstrap(intake->cohort, result, settings, [](std::size_t, std::size_t) {}, stop.get_token());
            finished = std::chrono::steady_clock::now();
        });
        std::this_thread::sleep_for(std::chrono::milliseconds(200 + 90 * trial));
        const auto requested = std::chrono::steady_clock::now();
        stop.request_stop();
        runner.join();
        CHECK_FALSE(outcome.has_value());
        latencies.push_back(std::chrono::duration_cast<std::chrono::milliseconds>(finished - requested).count());
    }
    std::sort(latencies.begin(), latencies.end());
    INFO("latencies " << latencies[0] << ", " << latencies[1] << ", " << latencies[2] << " ms");
    CHECK(latencies[1] <= 100);
}
