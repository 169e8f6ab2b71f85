#include "analyses/bootstrap_engine.hpp"
#include "resampling/bootstrap_interval.hpp"
#include "resampling/interval_choice.hpp"
#include "metrics/metric_reading.hpp"
#include "analyses/model_comparison.hpp"
#include "resampling/random_stream.hpp"
#include "analyses/validation.hpp"
#include "files/validation_json.hpp"

#include <catch2/catch.hpp>

#include <algorithm>
#include <cmath>

using namespace plumbline;
using Catch::Matchers::WithinAbs;

namespace {

// A small cohort of invented risks (test data only): `n` patients, the first `events` of them
// with the event, risks spread evenly around `meanRisk`.
Cohort smallCohort(std::size_t n, std::size_t events, double meanRisk, std::uint64_t seed)
{
    RandomStream random(seed);
    Cohort cohort;
    std::vector<double> risks;
    for (std::size_t i = 0; i < n; ++i) {
        cohort.outcome.push_back(i < events ? 1 : 0);
        risks.push_back(std::clamp(meanRisk * (0.2 + 1.6 * random.uniform()), 0.001, 0.999));
    }
    cohort.models.push_back({"model", risks});
    return cohort;
}

ValidationResult bootstrapped(const Cohort& cohort, std::size_t replicates, std::uint64_t seed,
                              BootstrapCi method = BootstrapCi::Bca)
{
    ValidationResult result = runValidation(cohort, PanelSettings{});
    BootstrapSettings settings;
    settings.replicates = replicates;
    settings.seed = seed;
    settings.method = method;
    const auto bootstrap = runBootstrap(cohort, result, settings, {}, {});
    REQUIRE(bootstrap);
    applyBootstrap(result, *bootstrap);
    return result;
}

const MetricEntry& entryOf(const ValidationResult& r, PanelMetric k)
{
    return r.models.at(0).metrics[k];
}

} // namespace

TEST_CASE("With few events the analytic or exact interval is reported and the bootstrap kept beside it", "[bootstrap][intervals]")
{
    // 40 patients with 1 event (the case an outside audit found: BCa 0.080-0.283 against exact
    // Poisson 0.0025-0.546 for O/E).
    const ValidationResult result = bootstrapped(smallCohort(40, 1, 0.25, 3), 500, 11);
    const MetricEntry& oe = entryOf(result, OeRatio);
    CHECK(oe.estimate.ciMethod == CiMethod::ExactPoisson);
    REQUIRE(oe.analytic);
    CHECK(*oe.estimate.lower == *oe.analytic->lower);
    CHECK(*oe.estimate.upper == *oe.analytic->upper);
    REQUIRE(oe.bootstrap);
    CHECK(oe.intervalNote.find("too few of one class for the bootstrap (1 event, 39 non-events") != std::string::npos);
    const MetricEntry& slope = entryOf(result, CalibrationSlope);
    REQUIRE(slope.estimate.value);
    CHECK(slope.estimate.ciMethod == CiMethod::Wald);
    CHECK(slope.reading == metricReading("calibration_slope", slope.estimate)); // read on the interval reported
    // 25 patients with 6 events: still the exact Poisson interval for O/E.
    const ValidationResult six = bootstrapped(smallCohort(25, 6, 0.3, 4), 500, 12);
    CHECK(entryOf(six, OeRatio).estimate.ciMethod == CiMethod::ExactPoisson);
    bool said = false;
    for (const auto& w : six.warnings)
        said = said || w.find("small for the bootstrap") != std::string::npos;
    CHECK(said);
    // With enough events the bootstrap interval is reported as asked.
    const ValidationResult large = bootstrapped(smallCohort(600, 150, 0.25, 5), 200, 13);
    CHECK(entryOf(large, OeRatio).estimate.ciMethod == CiMethod::BootstrapBca);
    CHECK(entryOf(large, OeRatio).intervalNote.empty());
}

TEST_CASE("Every reported interval holds its estimate or there is none", "[bootstrap][intervals]")
{
    // Small cohorts where lopsided replicate distributions are common (E90 0.175 with BCa
    // 0.1216-0.1749 was found on 25 patients): no reported interval may miss its estimate.
    std::size_t withoutInterval = 0, checked = 0;
    for (std::uint64_t seed = 1; seed <= 12; ++seed) {
        const ValidationResult result = bootstrapped(smallCohort(25 + 5 * seed, 8 + seed, 0.35, seed), 300, seed);
        for (const auto& entry : result.models.at(0).metrics) {
            if (!entry.estimate.value)
                continue;
            ++checked;
            if (!entry.estimate.lower) {
                ++withoutInterval;
                continue;
            }
            INFO(entry.key << " seed " << seed << " " << *entry.estimate.value << " in " << *entry.estimate.lower << " to "
                           << *entry.estimate.upper << " " << entry.intervalNote);
            CHECK(*entry.estimate.lower <= *entry.estimate.value + 1e-12);
            CHECK(*entry.estimate.value <= *entry.estimate.upper + 1e-12);
            CHECK(*entry.estimate.upper - *entry.estimate.lower > 0.0);
        }
    }
    CHECK(checked > 100);
    CHECK(withoutInterval < checked);
}

TEST_CASE("An extreme bias correction falls back to the percentile then the analytic interval then none", "[bootstrap][intervals]")
{
    MetricBootstrap b;
    b.replicatesUsed = 1000;
    b.percentile = {0.1757, 0.5009};
    b.bca = std::pair{0.1216, 0.1749};
    b.z0 = -1.98;
    const BootstrapEvidence plenty{100, 100, 0, 1000};
    // E90 has no analytic interval: both bootstrap intervals miss 0.175, so none is reported.
    const ChosenInterval none = chooseInterval(Estimate::point(0.175), b, BootstrapCi::Bca, plenty);
    CHECK_FALSE(none.estimate.lower);
    CHECK(none.note.find("z0 = -1.98") != std::string::npos);
    // A metric with an analytic interval gets it.
    const Estimate wald{0.175, 0.05, 0.077, 0.273, CiMethod::Wald};
    const ChosenInterval analytic = chooseInterval(wald, b, BootstrapCi::Bca, plenty);
    CHECK(analytic.estimate.ciMethod == CiMethod::Wald);
    // A percentile interval that holds the estimate is the first fallback.
    b.percentile = {0.15, 0.5};
    const ChosenInterval percentile = chooseInterval(Estimate::point(0.175), b, BootstrapCi::Bca, plenty);
    CHECK(percentile.estimate.ciMethod == CiMethod::BootstrapPercentile);
    CHECK(percentile.note.find("percentile interval") == 0);
    // A moderate bias correction with the estimate inside: BCa as asked, no note.
    b.bca = std::pair{0.16, 0.3};
    b.z0 = 0.4;
    const ChosenInterval bca = chooseInterval(Estimate::point(0.175), b, BootstrapCi::Bca, plenty);
    CHECK(bca.estimate.ciMethod == CiMethod::BootstrapBca);
    CHECK(bca.note.empty());
}

TEST_CASE("An interval of zero width is no interval and never meets a precision target", "[intervals]")
{
    Cohort cohort;
    for (int i = 0; i < 40; ++i) {
        cohort.outcome.push_back(i % 4 == 0 ? 1 : 0);
    }
    cohort.models.push_back({"constant", std::vector<double>(40, 0.25)});
    const ValidationResult result = runValidation(cohort, PanelSettings{});
    const MetricEntry& c = result.models.at(0).metrics[CStatistic];
    REQUIRE(c.estimate.value);
    CHECK(*c.estimate.value == 0.5);
    CHECK_FALSE(c.estimate.lower);
    CHECK(c.intervalNote.find("zero width") != std::string::npos);
    for (const auto& row : result.precision)
        CHECK(row.metric != "c_statistic");
    const auto json = modelsJson(result);
    CHECK(json.at(0).at("metrics").at("c_statistic").at("ci_lower").is_null());
}

TEST_CASE("Wald intervals of bounded differences stay within the quantity's range", "[comparison][intervals]")
{
    // Five events, four of which move up a category under model B: the NRI events part is 0.8
    // with SE 0.179, so its Wald interval would run to 1.15, above the largest possible value 1.
    Cohort cohort;
    std::vector<double> a, b;
    for (int i = 0; i < 5; ++i) {
        cohort.outcome.push_back(1);
        a.push_back(0.15);
        b.push_back(i < 4 ? 0.35 : 0.15);
    }
    for (int i = 0; i < 30; ++i) {
        cohort.outcome.push_back(0);
        a.push_back(0.05 + 0.01 * (i % 10));
        b.push_back(0.05 + 0.01 * (i % 10));
    }
    cohort.models.push_back({"a", a});
    cohort.models.push_back({"b", b});
    const ValidationResult result = runValidation(cohort, PanelSettings{});
    const DifferenceEstimate* events = result.comparisons.at(0).difference("nri_events");
    REQUIRE(events);
    CHECK_THAT(*events->estimate.value, WithinAbs(0.8, 1e-12));
    CHECK(*events->estimate.upper == 1.0);
    CHECK(events->truncated);
    CHECK(*events->estimate.lower >= -1.0);
}

TEST_CASE("Replicates within rounding of an estimate of zero count as ties not as one side", "[bootstrap][intervals]")
{
    // An estimate of -1.4e-16 is 0 in exact arithmetic; replicates of exactly 0 and above must not
    // all count as lying above it (BCa would be undefined and a warning raised).
    std::vector<double> sorted{0.0, 0.0, 0.0, 0.001, 0.002, 0.003, 0.004, 0.005};
    const auto levels = bcaLevels(sorted, -1.4e-16, 0.0, 0.95);
    REQUIRE(levels);
    CHECK(levels->z0 > -2.0);
}

TEST_CASE("Every documented test key is present and null when it cannot be computed", "[json][intervals]")
{
    // Risks that separate the outcomes: no slope, so no joint or slope test, but the
    // calibration-in-the-large test stays, and the slope difference key is there as null.
    Cohort cohort;
    std::vector<double> a, b;
    for (int i = 0; i < 30; ++i) {
        cohort.outcome.push_back(i < 10 ? 1 : 0);
        a.push_back(i < 10 ? 0.6 + 0.01 * i : 0.1 + 0.01 * (i - 10));
        b.push_back(0.2 + 0.001 * i);
    }
    cohort.models.push_back({"separating", a});
    cohort.models.push_back({"other", b});
    const ValidationResult result = runValidation(cohort, PanelSettings{});
    const auto models = modelsJson(result);
    const auto& tests = models.at(0).at("tests");
    CHECK(tests.at("likelihood_ratio_joint").is_null());
    CHECK(tests.at("likelihood_ratio_slope_given_intercept").is_null());
    CHECK_FALSE(tests.at("likelihood_ratio_calibration_in_the_large").is_null());
    const auto comparisons = comparisonsJson(result);
    CHECK(comparisons.at(0).at("metrics").at("calibration_slope_difference").at("estimate").is_null());
    for (const char* key : {"nri", "nri_events", "idi", "ici_difference"})
        CHECK(comparisons.at(0).at("metrics").contains(key));
}

TEST_CASE("The bootstrap counts as unreliable when either class is small or too many draws were redrawn", "[bootstrap][intervals]")
{
    // The rule's edges (IntervalRule: 20 of each class, 1 % of draws redrawn; common practice).
    CHECK(BootstrapEvidence{1, 39, 0, 1000}.sparse());
    CHECK(BootstrapEvidence{39, 1, 0, 1000}.sparse());
    CHECK(BootstrapEvidence{19, 500, 0, 1000}.sparse());
    CHECK_FALSE(BootstrapEvidence{20, 20, 0, 1000}.sparse());
    CHECK_FALSE(BootstrapEvidence{100, 100, 10, 1000}.sparse());
    CHECK(BootstrapEvidence{100, 100, 11, 1000}.sparse());
}
