#include "resampling/cusum_control_limit.hpp"

#include "metrics/bernoulli_cusum.hpp"
#include "resampling/random_stream.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

namespace plumbline {

namespace {

// One simulated in-control run, resumable: its stream, position, chart value and record highs.
struct SimulatedRun {
    RandomStream stream;
    std::size_t patients = 0;
    double s = 0.0;
    std::vector<double> recordValue;        // increasing
    std::vector<std::size_t> recordPatient; // the patient (1-based) at which it was reached
    double best() const { return recordValue.empty() ? 0.0 : recordValue.back(); }
};

} // namespace

ControlLimit chooseControlLimit(const std::vector<double>& risks, const ControlLimitSettings& settings)
{
    ControlLimit out;
    out.runs = settings.runs;
    const double target = std::max(1.0, settings.targetRunLength);
    out.runCap = std::size_t(std::min(1e12, std::ceil(settings.capMultiple * target)));
    if (risks.empty() || settings.runs == 0) {
        out.reached = false;
        return out;
    }
    // The two weights of each observed risk, computed once.
    std::vector<double> eventWeight(risks.size()), noEventWeight(risks.size());
    for (std::size_t i = 0; i < risks.size(); ++i) {
        eventWeight[i] = cusumWeight(risks[i], true, settings.oddsRatio);
        noEventWeight[i] = cusumWeight(risks[i], false, settings.oddsRatio);
    }
    std::vector<SimulatedRun> runs;
    runs.reserve(settings.runs);
    for (std::size_t r = 0; r < settings.runs; ++r)
        runs.push_back({RandomStream(settings.seed, r + 1), 0, 0.0, {}, {}});
    const std::uint64_t n = risks.size();
    // Extends a run until its chart reaches `upper` or the cap.
    auto extend = [&](SimulatedRun& run, double upper) {
        while (run.best() < upper && run.patients < out.runCap) {
            const std::uint64_t j = run.stream.below(n);
            const bool event = run.stream.uniform() < risks[j];
            run.s = std::max(0.0, run.s + (event ? eventWeight[j] : noEventWeight[j]));
            ++run.patients;
            if (run.s > run.best()) {
                run.recordValue.push_back(run.s);
                run.recordPatient.push_back(run.patients);
            }
        }
    };
    auto runLength = [&](const SimulatedRun& run, double h) -> std::pair<double, bool> {
        const auto at = std::lower_bound(run.recordValue.begin(), run.recordValue.end(), h);
        if (at == run.recordValue.end())
            return {double(run.patients), true}; // censored (only at the cap, once extended to h)
        return {double(run.recordPatient[std::size_t(at - run.recordValue.begin())]), false};
    };
    auto average = [&](double h) {
        double sum = 0.0;
        for (const auto& run : runs)
            sum += runLength(run, h).first;
        return sum / double(runs.size());
    };
    // Raise the upper bound until its average run length reaches the target. The weight of an
    // event is at most |log R| + |log(1−p+Rp)|, so a chart climbs by a bounded step; a step of 0.5
    // in h keeps the overshoot in simulated patients moderate.
    double upper = 0.5;
    bool allCapped = false;
    for (;;) {
        for (auto& run : runs)
            extend(run, upper);
        allCapped = std::all_of(runs.begin(), runs.end(), [&](const SimulatedRun& run) { return run.best() < upper; });
        if (average(upper) >= target || allCapped || upper > 1e6)
            break;
        upper += 0.5;
    }
    // No run reaching the bound means the chart hardly moves (risks of 0 or 1): no limit gives
    // the target honestly, so the bound is kept and the result says so.
    double lower = 0.0;
    if (allCapped || average(upper) < target) {
        out.reached = false;
        lower = upper;
    }
    // Bisection for the smallest h with average ≥ target (average is a non-decreasing step
    // function of h on these runs); 60 halvings leave an interval far below any printed digit.
    for (int k = 0; k < 60 && out.reached; ++k) {
        const double mid = 0.5 * (lower + upper);
        if (average(mid) >= target)
            upper = mid;
        else
            lower = mid;
    }
    out.limit = upper;
    double sum = 0.0, sumSquares = 0.0;
    for (const auto& run : runs) {
        const auto [length, censored] = runLength(run, out.limit);
        sum += length;
        sumSquares += length * length;
        out.censoredRuns += censored ? 1 : 0;
    }
    // A censored run makes the average an underestimate: the target is then not known to be met.
    out.reached = out.reached && out.censoredRuns == 0;
    const double m = double(runs.size());
    out.averageRunLength = sum / m;
    const double variance = m > 1 ? std::max(0.0, (sumSquares - sum * sum / m) / (m - 1)) : 0.0;
    out.standardError = std::sqrt(variance / m);
    return out;
}

} // namespace plumbline
