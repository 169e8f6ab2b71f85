#include "support/check_datasets.hpp"
#include "metrics/distributions.hpp"
#include "analyses/model_comparison.hpp"
#include "resampling/random_stream.hpp"
#include "analyses/validation.hpp"

#include <catch2/catch.hpp>

#include <cmath>

using namespace plumbline;
using namespace plumbline::test;
using Catch::Matchers::WithinAbs;

namespace {

Cohort twoModels(const CheckData& a, const CheckData& b)
{
    Cohort cohort;
    cohort.outcome = a.y;
    cohort.models.push_back({"A", a.p});
    cohort.models.push_back({"B", b.p});
    return cohort;
}

ModelComparison compareToy(const std::vector<double>& cuts)
{
    const Cohort cohort = twoModels(toy20A(), toy20B());
    const ValidationResult result = runValidation(cohort, PanelSettings{});
    return compareModels(cohort, result, PanelSettings{}, cuts).at(0);
}

} // namespace

// Check values: docs/methods.md §18, computed with numpy and scipy 1.10, Toy-20 with B the new
// model against A; paired DeLong (DeLong et al. 1988) and NRI/IDI with their SEs (Pencina et al.
// 2008), the covariance and the SEs from memory.
TEST_CASE("The paired DeLong test of B against A matches the Toy-20 check values", "[comparison]")
{
    const ModelComparison c = compareToy({0.2, 0.5});
    const DifferenceEstimate* delta = c.difference("c_statistic_difference");
    REQUIRE(delta);
    CHECK_THAT(*delta->estimate.value, WithinAbs(0.0885417, 1e-7));
    CHECK_THAT(*delta->estimate.se, WithinAbs(0.0447408, 1e-7));
    CHECK_THAT(*delta->pValue, WithinAbs(0.0478171, 1e-7));
}

TEST_CASE("Categorical and continuous NRI and IDI match the Toy-20 check values", "[comparison]")
{
    const ModelComparison c = compareToy({0.2, 0.5});
    CHECK_THAT(*c.difference("nri_events")->estimate.value, WithinAbs(0.125, 1e-12));
    CHECK_THAT(*c.difference("nri_non_events")->estimate.value, WithinAbs(0.0833333, 1e-7));
    const DifferenceEstimate* nri = c.difference("nri");
    CHECK_THAT(*nri->estimate.value, WithinAbs(0.2083333, 1e-7));
    CHECK_THAT(*nri->estimate.se, WithinAbs(0.2264677, 1e-7));                   // SE1
    CHECK_THAT(*nri->pValue, WithinAbs(twoSidedNormalP(0.8980265), 1e-7));      // z from SE0 = 0.2319902
    CHECK_THAT(*c.difference("nri_continuous_events")->estimate.value, WithinAbs(0.5, 1e-12));
    CHECK_THAT(*c.difference("nri_continuous_non_events")->estimate.value, WithinAbs(0.1666667, 1e-7));
    const DifferenceEstimate* continuous = c.difference("nri_continuous");
    CHECK_THAT(*continuous->estimate.value, WithinAbs(0.6666667, 1e-7));
    CHECK_THAT(*continuous->estimate.se, WithinAbs(0.4010980, 1e-7));
    CHECK_THAT(*continuous->pValue, WithinAbs(twoSidedNormalP(1.5118579), 1e-7));
    const DifferenceEstimate* idi = c.difference("idi");
    CHECK_THAT(*idi->estimate.value, WithinAbs(0.085, 1e-12));
    CHECK_THAT(*idi->estimate.se, WithinAbs(0.0284179, 1e-7));
    CHECK_THAT(*idi->estimate.value / *idi->estimate.se, WithinAbs(2.9910749, 1e-6));
}

TEST_CASE("The reclassification table counts patients by category under both models", "[comparison]")
{
    const ModelComparison c = compareToy({0.2, 0.5});
    std::size_t events = 0, nonEvents = 0, eventsUp = 0;
    for (std::size_t i = 0; i < 3; ++i)
        for (std::size_t j = 0; j < 3; ++j) {
            events += c.reclassification.events[i][j];
            nonEvents += c.reclassification.nonEvents[i][j];
            eventsUp += j > i ? c.reclassification.events[i][j] : 0;
        }
    CHECK(events == 8);
    CHECK(nonEvents == 12);
    CHECK(eventsUp == 2); // p_up among events 0.25 (docs/methods.md §18)
}

TEST_CASE("The paired DeLong variance agrees with a brute-force O(n^2) computation on tied data", "[comparison]")
{
    RandomStream random(606);
    for (int trial = 0; trial < 10; ++trial) {
        const std::size_t n = 40 + random.below(150);
        CheckData a, b;
        for (std::size_t i = 0; i < n; ++i) {
            const std::uint8_t y = random.uniform() < 0.35 ? 1 : 0;
            a.y.push_back(y);
            a.p.push_back(0.05 + 0.1 * double(random.below(8)) + (y ? 0.1 * double(random.below(2)) : 0.0));
            b.p.push_back(0.05 + 0.1 * double(random.below(6)) + (y ? 0.15 : 0.0));
        }
        a.y[0] = 1;
        a.y[1] = 0;
        b.y = a.y;
        // Brute force: placements by double loops, then S = S10/m + S01/n (DeLong 1988).
        auto psi = [](double u, double v) { return u > v ? 1.0 : u == v ? 0.5 : 0.0; };
        std::vector<std::size_t> ev, ne;
        for (std::size_t i = 0; i < n; ++i)
            (a.y[i] ? ev : ne).push_back(i);
        const double m = double(ev.size()), k = double(ne.size());
        auto placements = [&](const std::vector<double>& p, std::vector<double>& v10, std::vector<double>& v01) {
            v10.assign(ev.size(), 0.0);
            v01.assign(ne.size(), 0.0);
            for (std::size_t i = 0; i < ev.size(); ++i)
                for (std::size_t j = 0; j < ne.size(); ++j) {
                    const double s = psi(p[ev[i]], p[ne[j]]);
                    v10[i] += s / k;
                    v01[j] += s / m;
                }
        };
        std::vector<double> a10, a01, b10, b01;
        placements(a.p, a10, a01);
        placements(b.p, b10, b01);
        auto mean = [](const std::vector<double>& v) { double s = 0; for (double x : v) s += x; return s / double(v.size()); };
        auto cov = [&](const std::vector<double>& x, const std::vector<double>& z) {
            const double mx = mean(x), mz = mean(z);
            double s = 0;
            for (std::size_t i = 0; i < x.size(); ++i)
                s += (x[i] - mx) * (z[i] - mz);
            return s / double(x.size() - 1);
        };
        const double var = (cov(a10, a10) + cov(b10, b10) - 2 * cov(a10, b10)) / m
            + (cov(a01, a01) + cov(b01, b01) - 2 * cov(a01, b01)) / k;
        const Cohort cohort = twoModels(a, b);
        const ModelComparison c = compareModels(cohort, runValidation(cohort, PanelSettings{}), PanelSettings{}, {}).at(0);
        CHECK_THAT(*c.difference("c_statistic_difference")->estimate.value, WithinAbs(mean(b10) - mean(a10), 1e-12));
        CHECK_THAT(*c.difference("c_statistic_difference")->estimate.se, WithinAbs(std::sqrt(var), 1e-12));
    }
}
