#include "analyses/paired_bootstrap.hpp"

#include "resampling/bootstrap_interval.hpp"
#include "analyses/model_comparison.hpp"

#include <algorithm>
#include <cmath>
#include <utility>

namespace plumbline {

PairMoves pairMoves(std::span<const double> riskA, std::span<const double> riskB, std::size_t a, std::size_t b,
                    const std::vector<double>& cutPoints)
{
    PairMoves moves;
    moves.modelA = a;
    moves.modelB = b;
    moves.categorical.resize(riskA.size());
    moves.continuous.resize(riskA.size());
    for (std::size_t i = 0; i < riskA.size(); ++i) {
        const std::size_t ca = riskCategory(riskA[i], cutPoints), cb = riskCategory(riskB[i], cutPoints);
        moves.categorical[i] = static_cast<std::int8_t>(cb > ca ? 1 : cb < ca ? -1 : 0);
        moves.continuous[i] = static_cast<std::int8_t>(riskB[i] > riskA[i] ? 1 : riskB[i] < riskA[i] ? -1 : 0);
    }
    return moves;
}

PairReplicate pairReplicate(const PairMoves& moves, std::span<const std::uint8_t> outcome,
                            std::span<const std::uint16_t> rowCounts)
{
    // Branch-free (which rows are events is random): every term is a whole number, so the sums
    // are exact and equal to adding each row to its own class's sums only.
    double events = 0, nonEvents = 0, catEvents = 0, catNonEvents = 0, contEvents = 0, contNonEvents = 0;
    for (std::size_t i = 0; i < outcome.size(); ++i) {
        const double c = rowCounts[i];
        const double y = outcome[i] ? 1.0 : 0.0;
        const double eventCount = c * y, nonEventCount = c - c * y;
        events += eventCount;
        nonEvents += nonEventCount;
        catEvents += eventCount * moves.categorical[i];
        contEvents += eventCount * moves.continuous[i];
        catNonEvents -= nonEventCount * moves.categorical[i];
        contNonEvents -= nonEventCount * moves.continuous[i];
    }
    return {catEvents / events, catNonEvents / nonEvents, contEvents / events, contNonEvents / nonEvents};
}

std::vector<double> netBenefitAt(const ModelSupport& support, const SupportCounts& counts,
                                 std::span<const double> thresholds)
{
    FromTheTop request;
    request.thresholdSets = {thresholds};
    double events = 0.0, nonEvents = 0.0;
    for (std::size_t k = 0; k < support.x.size(); ++k) {
        events += counts.events[k];
        nonEvents += counts.nonEvents[k];
    }
    sweepFromTheTop(support, counts, events, nonEvents, request);
    return std::move(request.netBenefit[0]);
}

MetricBootstrap pairedSummary(const std::vector<double>& replicates, double confidence)
{
    std::vector<double> sorted;
    for (double v : replicates)
        if (std::isfinite(v))
            sorted.push_back(v);
    std::sort(sorted.begin(), sorted.end());
    MetricBootstrap b;
    b.replicatesUsed = sorted.size();
    if (sorted.size() < 2)
        return b;
    b.se = replicateStandardDeviation(sorted);
    b.percentile = percentileInterval(sorted, confidence);
    b.accelerationMethod = "none (percentile interval of paired differences)";
    return b;
}

} // namespace plumbline
