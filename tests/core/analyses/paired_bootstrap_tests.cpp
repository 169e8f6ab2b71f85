#include "analyses/bootstrap_engine.hpp"
#include "support/check_datasets.hpp"
#include "analyses/model_comparison.hpp"
#include "analyses/paired_bootstrap.hpp"
#include "resampling/random_stream.hpp"
#include "metrics/threshold_metrics.hpp"
#include "analyses/validation.hpp"

#include <catch2/catch.hpp>

#include <algorithm>
#include <bit>
#include <cstdint>

using namespace plumbline;
using namespace plumbline::test;
using Catch::Matchers::WithinAbs;

namespace {

Cohort toyPair()
{
    Cohort cohort;
    cohort.outcome = toy20A().y;
    cohort.models.push_back({"A", toy20A().p});
    cohort.models.push_back({"B", toy20B().p});
    return cohort;
}

Cohort expanded(const Cohort& cohort, const std::vector<std::uint16_t>& counts)
{
    Cohort out;
    out.models = {{"A", {}}, {"B", {}}};
    for (std::size_t i = 0; i < counts.size(); ++i)
        for (int k = 0; k < counts[i]; ++k) {
            out.outcome.push_back(cohort.outcome[i]);
            out.models[0].values.push_back(cohort.models[0].values[i]);
            out.models[1].values.push_back(cohort.models[1].values[i]);
        }
    return out;
}

} // namespace

TEST_CASE("Replicate NRI parts and net benefit equal those of the explicitly resampled rows", "[bootstrap][comparison]")
{
    const Cohort cohort = toyPair();
    const std::vector<double> cuts{0.2, 0.5};
    const PairMoves moves = pairMoves(cohort.models[0].values, cohort.models[1].values, 0, 1, cuts);
    RandomStream random(808);
    for (int trial = 0; trial < 20; ++trial) {
        std::vector<std::uint16_t> counts(20, 0);
        for (int k = 0; k < 20; ++k)
            ++counts[random.below(20)];
        const Cohort rows = expanded(cohort, counts);
        const std::size_t events = std::size_t(std::count(rows.outcome.begin(), rows.outcome.end(), 1));
        if (events < 2 || events + 2 > rows.outcome.size())
            continue;
        PanelSettings settings;
        settings.thresholds = {0.1, 0.25, 0.4};
        const ValidationResult result = runValidation(rows, settings);
        const ModelComparison reference = compareModels(rows, result, settings, cuts).at(0);
        const PairReplicate weighted = pairReplicate(moves, cohort.outcome, counts);
        CHECK_THAT(weighted.nriEvents, WithinAbs(*reference.difference("nri_events")->estimate.value, 1e-12));
        CHECK_THAT(weighted.nriNonEvents, WithinAbs(*reference.difference("nri_non_events")->estimate.value, 1e-12));
        CHECK_THAT(weighted.nriContinuousEvents, WithinAbs(*reference.difference("nri_continuous_events")->estimate.value, 1e-12));
        for (std::size_t m = 0; m < 2; ++m) {
            const ModelSupport support = buildModelSupport(cohort.models[m].values, ascendingOrder(cohort.models[m].values), true);
            SupportCounts supportCounts;
            countRows(support, cohort.outcome, counts, supportCounts);
            const auto nb = netBenefitAt(support, supportCounts, settings.thresholds);
            for (std::size_t t = 0; t < nb.size(); ++t)
                CHECK_THAT(nb[t], WithinAbs(result.models[m].thresholds[t].netBenefit, 1e-12));
        }
    }
}

TEST_CASE("The paired bootstrap gives every difference an interval on the same resamples", "[bootstrap][comparison]")
{
    Cohort cohort;
    const CheckData gen = gen1000();
    cohort.outcome = gen.y;
    cohort.models.push_back({"A", gen.p});
    std::vector<double> other(gen.p.size());
    for (std::size_t i = 0; i < other.size(); ++i)
        other[i] = 0.6 * gen.p[i] + 0.4 * (0.05 + 0.9 * double((i * 31) % 97) / 96.0); // a blurred second model
    cohort.models.push_back({"B", other});
    ValidationResult result = runValidation(cohort, PanelSettings{});
    BootstrapSettings settings;
    settings.replicates = 400;
    applyBootstrap(result, *runBootstrap(cohort, result, settings, {}, {}));
    const ModelComparison& c = result.comparisons.at(0);
    for (const auto& d : c.differences) {
        INFO(d.key);
        REQUIRE(d.bootstrap);
        CHECK(d.estimate.ciMethod == CiMethod::BootstrapPercentile);
        CHECK(*d.estimate.lower <= *d.estimate.upper);
    }
    // The paired bootstrap SE of ΔC agrees with the paired DeLong SE (both estimate the same thing).
    const DifferenceEstimate* delta = c.difference("c_statistic_difference");
    CHECK_THAT(delta->bootstrap->se, WithinAbs(*delta->analytic->se, 0.25 * *delta->analytic->se));
    REQUIRE(c.netBenefitDifferences.size() == 3);
    CHECK(c.netBenefitDifferences[0].bootstrap);
}

TEST_CASE("Net benefit from one sweep gives the same bits as a table of counts at or above each point", "[bootstrap][decision]")
{
    // The sweep adds the counts from the top in the order the table's suffix sums did; thresholds
    // come in any order, equal to a risk, between risks, below the lowest and above the highest.
    RandomStream random(77);
    for (int trial = 0; trial < 100; ++trial) {
        const std::size_t rows = 3 + random.below(300);
        std::vector<double> p;
        std::vector<std::uint8_t> y;
        for (std::size_t i = 0; i < rows; ++i) {
            p.push_back(double(1 + random.below(trial % 2 ? 20 : 5000)) / 5001.0);
            y.push_back(static_cast<std::uint8_t>(random.below(4) == 0));
        }
        std::vector<std::uint16_t> counts(rows, 0);
        for (std::size_t k = 0; k < rows; ++k)
            ++counts[random.below(rows)];
        const ModelSupport support = buildModelSupport(p, ascendingOrder(p), true);
        SupportCounts c;
        countRows(support, y, counts, c);
        std::vector<double> thresholds{0.5, 0.01, 0.99, 1e-6, 0.3};
        for (int j = 0; j < 5; ++j)
            thresholds.push_back(support.x[random.below(support.x.size())]);
        const auto swept = netBenefitAt(support, c, thresholds);
        const std::size_t d = support.x.size();
        std::vector<double> eventsAbove(d + 1, 0.0), nonEventsAbove(d + 1, 0.0);
        for (std::size_t k = d; k > 0; --k) {
            eventsAbove[k - 1] = eventsAbove[k] + c.events[k - 1];
            nonEventsAbove[k - 1] = nonEventsAbove[k] + c.nonEvents[k - 1];
        }
        const double n = eventsAbove[0] + nonEventsAbove[0];
        REQUIRE(swept.size() == thresholds.size());
        for (std::size_t j = 0; j < thresholds.size(); ++j) {
            const double t = thresholds[j];
            const auto k = static_cast<std::size_t>(std::lower_bound(support.x.begin(), support.x.end(), t) - support.x.begin());
            const double table = eventsAbove[k] / n - nonEventsAbove[k] / n * t / (1.0 - t);
            INFO("trial " << trial << " threshold " << t);
            REQUIRE(std::bit_cast<std::uint64_t>(swept[j]) == std::bit_cast<std::uint64_t>(table));
        }
    }
}
