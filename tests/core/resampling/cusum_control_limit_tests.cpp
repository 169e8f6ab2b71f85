#include "resampling/cusum_control_limit.hpp"

#include <catch2/catch.hpp>

#include <algorithm>
#include <cmath>
#include <random>

using namespace plumbline;

namespace {

// Observed risks of a made-up cohort: 400 risks spread between 0.02 and 0.6.
std::vector<double> observedRisks()
{
    std::vector<double> risks;
    for (int i = 0; i < 400; ++i)
        risks.push_back(0.02 + 0.58 * std::pow((i + 0.5) / 400.0, 2.0));
    return risks;
}

// An independent simulation of the in-control run length of a risk-adjusted CUSUM with limit h:
// std::mt19937_64 and the standard library's distributions (not the project's RandomStream),
// the weight written out here from Steiner et al. 2000 (Biostatistics 1:441).
std::pair<double, double> independentRunLength(const std::vector<double>& risks, double odds, double h, int runs)
{
    std::mt19937_64 engine(987654321);
    std::uniform_int_distribution<std::size_t> pick(0, risks.size() - 1);
    std::uniform_real_distribution<double> unit(0.0, 1.0);
    double sum = 0.0, squares = 0.0;
    for (int r = 0; r < runs; ++r) {
        double s = 0.0;
        long length = 0;
        while (s < h) {
            const double p = risks[pick(engine)];
            const bool event = unit(engine) < p;
            s = std::max(0.0, s + (event ? std::log(odds) : 0.0) - std::log(1.0 - p + odds * p));
            ++length;
        }
        sum += double(length);
        squares += double(length) * double(length);
    }
    const double mean = sum / runs;
    return {mean, std::sqrt((squares / runs - mean * mean) / runs)};
}

} // namespace

TEST_CASE("The chosen control limit gives the target in-control run length in an independent simulation", "[monitoring]")
{
    const auto risks = observedRisks();
    for (const double odds : {2.0, 0.5}) {
        ControlLimitSettings settings;
        settings.oddsRatio = odds;
        settings.targetRunLength = 1500.0;
        settings.runs = 400;
        settings.seed = 20240101;
        const ControlLimit limit = chooseControlLimit(risks, settings);
        REQUIRE(limit.reached);
        CHECK(limit.limit > 0.5);
        CHECK(limit.runs == 400);
        CHECK(limit.censoredRuns == 0);
        // The achieved average on its own runs is the smallest at or above the target.
        CHECK(limit.averageRunLength >= 1500.0);
        CHECK(limit.averageRunLength < 1500.0 * 1.1);
        // Monte Carlo SE of a mean of roughly exponential run lengths: about mean/√runs.
        CHECK(limit.standardError > 0.6 * limit.averageRunLength / std::sqrt(400.0));
        CHECK(limit.standardError < 1.4 * limit.averageRunLength / std::sqrt(400.0));
        // The true ARL at this h lies within Monte Carlo error of the target: both simulations'
        // errors combined, four standard errors.
        const auto [mean, se] = independentRunLength(risks, odds, limit.limit, 3000);
        CHECK(std::abs(mean - 1500.0) < 4.0 * std::sqrt(se * se + limit.standardError * limit.standardError));
        // A limit 0.3 lower gives a clearly shorter run length (the check can fail).
        CHECK(independentRunLength(risks, odds, limit.limit - 0.3, 2000).first < 1500.0 * 0.9);
    }
}

TEST_CASE("The control limit is the same for the same seed and differs for another", "[monitoring]")
{
    const auto risks = observedRisks();
    ControlLimitSettings settings;
    settings.targetRunLength = 500.0;
    settings.runs = 100;
    const ControlLimit a = chooseControlLimit(risks, settings), b = chooseControlLimit(risks, settings);
    CHECK(a.limit == b.limit);
    CHECK(a.averageRunLength == b.averageRunLength);
    settings.seed = 7;
    CHECK(chooseControlLimit(risks, settings).limit != a.limit);
}

TEST_CASE("Risks of zero never signal: the control limit says the target was not reached", "[monitoring]")
{
    ControlLimitSettings settings;
    settings.targetRunLength = 100.0;
    settings.runs = 20;
    const ControlLimit limit = chooseControlLimit(std::vector<double>(50, 0.0), settings);
    CHECK_FALSE(limit.reached);
    CHECK(limit.censoredRuns == 20);
    CHECK(limit.averageRunLength == double(limit.runCap));
}
