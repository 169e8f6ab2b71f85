#include "analyses/bootstrap_engine.hpp"

#include "analyses/decision_curve.hpp"
#include "resampling/interval_choice.hpp"
#include "metrics/logistic_recalibration.hpp"
#include "metrics/metric_reading.hpp"
#include "resampling/panel_acceleration.hpp"
#include "resampling/random_stream.hpp"
#include "resampling/weighted_panel.hpp"

#include <algorithm>
#include <atomic>
#include <cmath>
#include <exception>
#include <limits>
#include <mutex>
#include <thread>

namespace plumbline {

namespace {

constexpr double undefinedValue = std::numeric_limits<double>::quiet_NaN();

// Everything a worker reads: prepared once, shared read-only.
struct PreparedModel {
    ModelSupport support;
    FitStart start;
    std::vector<std::size_t> curvePoints; // support indices of the full curve's predicted risks
};

struct Shared {
    const Cohort& cohort;
    const BootstrapSettings& settings;
    std::vector<PreparedModel> models{};
    std::vector<std::uint32_t> eventRows{}, nonEventRows{};
    std::vector<double> rocRates{};
    LoessOptions loess{};
    // Results, written by replicate index: [model][metric or point][replicate].
    std::vector<std::array<std::vector<double>, PanelMetricCount>> values{};
    std::vector<std::vector<std::vector<double>>> curves{};
    std::vector<std::vector<std::vector<double>>> rocs{};
    std::vector<std::size_t> redraws{};
    // Paired pieces: net benefit per [model][threshold][replicate], NRI parts per [pair][part][replicate].
    std::vector<double> thresholds{};
    std::vector<PairMoves> pairs{};
    std::vector<std::vector<std::vector<double>>> netBenefit{};
    std::vector<double> decisionThresholds{};
    std::vector<std::vector<std::vector<double>>> decision{}; // [model][threshold][replicate]
    std::vector<std::array<std::vector<double>, 4>> pairValues{};
};

PreparedModel prepareModel(const Cohort& cohort, std::size_t m, const ModelValidation& full)
{
    PreparedModel p;
    const auto& values = cohort.models[m].values;
    p.support = buildModelSupport(values, ascendingOrder(values), scaleIsProbabilistic(cohort.scale));
    auto start = [&](std::string_view key, double fallback) {
        const Estimate* e = full.metric(key);
        return e && e->value ? *e->value : fallback;
    };
    p.start = {start("calibration_intercept", 0.0), start("recalibration_intercept", 0.0), start("calibration_slope", 1.0)};
    if (p.support.risks)
        addStartRisks(p.support, p.start);
    packRowsInOrder(p.support, cohort.outcome);
    for (const auto& point : full.calibrationCurve) {
        const auto at = std::lower_bound(p.support.x.begin(), p.support.x.end(), point.predicted);
        p.curvePoints.push_back(static_cast<std::size_t>(at - p.support.x.begin()));
    }
    return p;
}

// Multinomial counts over the rows, redrawn while a class is missing (non-stratified).
void drawCounts(const Shared& shared, RandomStream& random, std::vector<std::uint16_t>& counts, std::size_t& redraws)
{
    const std::size_t n = shared.cohort.outcome.size();
    for (;;) {
        std::fill(counts.begin(), counts.end(), 0);
        if (shared.settings.stratified) {
            for (std::size_t k = 0; k < shared.eventRows.size(); ++k)
                ++counts[shared.eventRows[random.below(shared.eventRows.size())]];
            for (std::size_t k = 0; k < shared.nonEventRows.size(); ++k)
                ++counts[shared.nonEventRows[random.below(shared.nonEventRows.size())]];
            return;
        }
        for (std::size_t k = 0; k < n; ++k)
            ++counts[random.below(n)];
        // The events drawn, counted afterwards over the event rows (in ascending order, a read
        // the processor streams) rather than by reading each drawn row's outcome at random.
        std::size_t events = 0;
        for (const std::uint32_t row : shared.eventRows)
            events += counts[row];
        if (events > 0 && events < n)
            return;
        ++redraws;
    }
}

// False when a stop was requested part-way (the replicate is then incomplete and discarded).
bool runReplicate(Shared& shared, std::size_t r, std::vector<std::uint16_t>& counts, SupportCounts& supportCounts,
                  CurveSample& curve, const std::stop_token& stop)
{
    RandomStream random(shared.settings.seed, r + 1);
    drawCounts(shared, random, counts, shared.redraws[r]);
    for (std::size_t m = 0; m < shared.models.size(); ++m) {
        if (stop.stop_requested())
            return false;
        const PreparedModel& model = shared.models[m];
        countRows(model.support, shared.cohort.outcome, counts, supportCounts);
        const bool withCurve = shared.settings.smoothedCurve && !model.curvePoints.empty();
        curve.at = model.curvePoints;
        curve.values.clear();
        // The ROC band and the net benefits come from the sweep that gives the average precision.
        thread_local FromTheTop fromTop;
        fromTop.falsePositiveRates = shared.rocRates;
        fromTop.thresholdSets.clear();
        if (model.support.risks)
            fromTop.thresholdSets = {shared.thresholds, shared.decisionThresholds};
        const PanelValues v = weightedPanel(model.support, supportCounts, model.start, withCurve ? &shared.loess : nullptr,
                                            withCurve ? &curve : nullptr, &fromTop);
        for (std::size_t k = 0; k < PanelMetricCount; ++k)
            shared.values[m][k][r] = v[k] ? *v[k] : undefinedValue;
        for (std::size_t j = 0; j < model.curvePoints.size(); ++j)
            shared.curves[m][j][r] = curve.values.empty() ? undefinedValue : curve.values[j];
        for (std::size_t j = 0; j < fromTop.sensitivity.size(); ++j)
            shared.rocs[m][j][r] = fromTop.sensitivity[j];
        if (model.support.risks) {
            for (std::size_t j = 0; j < fromTop.netBenefit[0].size(); ++j)
                shared.netBenefit[m][j][r] = fromTop.netBenefit[0][j];
            for (std::size_t j = 0; j < fromTop.netBenefit[1].size(); ++j)
                shared.decision[m][j][r] = fromTop.netBenefit[1][j];
        }
    }
    for (std::size_t p = 0; p < shared.pairs.size(); ++p) {
        const PairReplicate v = pairReplicate(shared.pairs[p], shared.cohort.outcome, counts);
        shared.pairValues[p][0][r] = v.nriEvents;
        shared.pairValues[p][1][r] = v.nriNonEvents;
        shared.pairValues[p][2][r] = v.nriContinuousEvents;
        shared.pairValues[p][3][r] = v.nriContinuousNonEvents;
    }
    return true;
}

std::vector<double> finiteSorted(const std::vector<double>& values)
{
    std::vector<double> out;
    out.reserve(values.size());
    for (double v : values)
        if (std::isfinite(v))
            out.push_back(v);
    std::sort(out.begin(), out.end());
    return out;
}

MetricBootstrap summarise(const std::vector<double>& sorted, double estimate, const Acceleration& acceleration,
                          double confidence)
{
    MetricBootstrap b;
    b.replicatesUsed = sorted.size();
    b.se = replicateStandardDeviation(sorted);
    b.percentile = percentileInterval(sorted, confidence);
    b.acceleration = acceleration.value;
    b.accelerationMethod = acceleration.method;
    if (const auto levels = bcaLevels(sorted, estimate, acceleration.value, confidence)) {
        b.z0 = levels->z0;
        b.bca = std::pair{sortedQuantile(sorted, levels->alpha1), sortedQuantile(sorted, levels->alpha2)};
    }
    return b;
}

CurveBand band(const std::vector<std::vector<double>>& replicates, const std::vector<double>& x, double confidence)
{
    CurveBand out;
    for (std::size_t j = 0; j < x.size(); ++j) {
        const auto sorted = finiteSorted(replicates[j]);
        if (sorted.empty())
            continue;
        const auto [lower, upper] = percentileInterval(sorted, confidence);
        out.x.push_back(x[j]);
        out.lower.push_back(lower);
        out.upper.push_back(upper);
    }
    return out;
}

FullSampleFits fullSampleFits(const Cohort& cohort, std::size_t m, const FitStart& start)
{
    FullSampleFits fits;
    fits.start = start;
    if (!scaleIsProbabilistic(cohort.scale))
        return fits;
    const auto& risks = cohort.models[m].values;
    const auto lp = clampedLogits(risks);
    std::vector<double> weights(risks.size());
    for (std::size_t i = 0; i < risks.size(); ++i)
        weights[i] = contradictsOutcome(risks[i], cohort.outcome[i] != 0) ? 0.0 : 1.0;
    if (const auto slope = fitCalibrationSlope(cohort.outcome, lp, weights, start.recalibrationIntercept, start.slope)) {
        std::copy(std::begin(slope->information), std::end(slope->information), fits.slopeInformation);
        fits.hasSlope = true;
    }
    return fits;
}

ModelBootstrap summariseModel(const Shared& shared, const Cohort& cohort, std::size_t m, const ModelValidation& full,
                              double confidence, BootstrapResult& result)
{
    const PreparedModel& model = shared.models[m];
    const SupportCounts counts = sampleCounts(model.support, cohort.outcome);
    const PanelValues fullValues = weightedPanel(model.support, counts, model.start,
                                                 shared.settings.smoothedCurve ? &shared.loess : nullptr);
    const PanelAccelerations accelerations = panelAccelerations(
        model.support, counts, fullValues, fullSampleFits(cohort, m, model.start), cohort.outcome,
        shared.settings.smoothedCurve ? &shared.loess : nullptr);
    ModelBootstrap out;
    for (std::size_t k = 0; k < PanelMetricCount; ++k) {
        const Estimate* estimate = full.metric(panelKeys[k]);
        if (!estimate || !estimate->value || !accelerations[k])
            continue;
        const auto sorted = finiteSorted(shared.values[m][k]);
        const std::size_t missing = shared.settings.replicates - sorted.size();
        if (sorted.size() < 2)
            continue;
        if (missing > 0)
            result.warnings.push_back("Model '" + full.name + "': " + std::to_string(missing) + " of "
                                      + std::to_string(shared.settings.replicates) + " bootstrap replicates could not compute "
                                      + metricLabel(panelKeys[k]) + "; its interval uses the others.");
        out.metrics[k] = summarise(sorted, *estimate->value, *accelerations[k], confidence);
    }
    std::vector<double> curveX;
    for (const auto& point : full.calibrationCurve)
        curveX.push_back(point.predicted);
    out.calibrationBand = band(shared.curves[m], curveX, confidence);
    out.rocBand = band(shared.rocs[m], shared.rocRates, confidence);
    out.decisionBand = band(shared.decision[m], shared.decisionThresholds, confidence);
    return out;
}

// Paired differences per replicate, model_b − model_a, and their percentile summaries.
std::vector<PairBootstrap> summarisePairs(const Shared& shared, double confidence)
{
    std::vector<PairBootstrap> out;
    const std::size_t B = shared.settings.replicates;
    for (std::size_t p = 0; p < shared.pairs.size(); ++p) {
        const std::size_t a = shared.pairs[p].modelA, b = shared.pairs[p].modelB;
        PairBootstrap pair;
        auto difference = [&](const std::string& key, auto valueAt) {
            std::vector<double> replicates(B);
            for (std::size_t r = 0; r < B; ++r)
                replicates[r] = valueAt(r);
            pair.differences.emplace_back(key, pairedSummary(replicates, confidence));
        };
        auto metric = [&](PanelMetric k) {
            return [&, k](std::size_t r) { return shared.values[b][k][r] - shared.values[a][k][r]; };
        };
        const auto& parts = shared.pairValues[p];
        difference("c_statistic_difference", metric(CStatistic));
        difference("brier_difference", metric(Brier));
        difference("calibration_slope_difference", metric(CalibrationSlope));
        difference("ici_difference", metric(Ici));
        difference("idi", metric(DiscriminationSlope));
        difference("nri_events", [&](std::size_t r) { return parts[0][r]; });
        difference("nri_non_events", [&](std::size_t r) { return parts[1][r]; });
        difference("nri", [&](std::size_t r) { return parts[0][r] + parts[1][r]; });
        difference("nri_continuous_events", [&](std::size_t r) { return parts[2][r]; });
        difference("nri_continuous_non_events", [&](std::size_t r) { return parts[3][r]; });
        difference("nri_continuous", [&](std::size_t r) { return parts[2][r] + parts[3][r]; });
        for (std::size_t t = 0; t < shared.thresholds.size(); ++t) {
            std::vector<double> replicates(B);
            for (std::size_t r = 0; r < B; ++r)
                replicates[r] = shared.netBenefit[b][t][r] - shared.netBenefit[a][t][r];
            pair.netBenefitDifferences.push_back(pairedSummary(replicates, confidence));
        }
        out.push_back(std::move(pair));
    }
    return out;
}

} // namespace

std::optional<BootstrapResult> runBootstrap(const Cohort& cohort, const ValidationResult& full,
                                            const BootstrapSettings& settings, const BootstrapProgress& progress,
                                            std::stop_token stop)
{
    const std::size_t B = settings.replicates;
    if (B < 2 || cohort.models.size() != full.models.size()) {
        BootstrapResult nothing;
        nothing.settings = settings;
        nothing.models.resize(full.models.size());
        nothing.warnings.push_back("The bootstrap needs at least 2 replicates; intervals are analytic only.");
        return nothing;
    }
    Shared shared{cohort, settings};
    shared.loess.stop = stop;
    for (std::size_t m = 0; m < cohort.models.size(); ++m)
        shared.models.push_back(prepareModel(cohort, m, full.models[m]));
    for (std::size_t i = 0; i < cohort.rows(); ++i)
        (cohort.outcome[i] ? shared.eventRows : shared.nonEventRows).push_back(static_cast<std::uint32_t>(i));
    for (std::size_t j = 0; j < settings.rocBandPoints; ++j)
        shared.rocRates.push_back(double(j) / double(settings.rocBandPoints - 1));
    shared.values.resize(cohort.models.size());
    shared.curves.resize(cohort.models.size());
    shared.rocs.resize(cohort.models.size());
    for (std::size_t m = 0; m < cohort.models.size(); ++m) {
        for (auto& metric : shared.values[m])
            metric.assign(B, undefinedValue);
        shared.curves[m].assign(shared.models[m].curvePoints.size(), std::vector<double>(B, undefinedValue));
        shared.rocs[m].assign(shared.rocRates.size(), std::vector<double>(B, undefinedValue));
    }
    shared.redraws.assign(B, 0);
    shared.thresholds = full.settings.thresholds;
    shared.decisionThresholds = decisionGrid(full.settings.decisionFrom, full.settings.decisionTo, full.settings.decisionStep);
    shared.decision.assign(cohort.models.size(), std::vector<std::vector<double>>(shared.decisionThresholds.size(), std::vector<double>(B, undefinedValue)));
    shared.netBenefit.assign(cohort.models.size(), std::vector<std::vector<double>>(shared.thresholds.size(), std::vector<double>(B, undefinedValue)));
    if (scaleIsProbabilistic(cohort.scale))
        for (const auto& comparison : full.comparisons) {
            const auto a = static_cast<std::size_t>(std::find_if(cohort.models.begin(), cohort.models.end(), [&](const ModelScores& s) { return s.name == comparison.modelA; }) - cohort.models.begin());
            const auto b = static_cast<std::size_t>(std::find_if(cohort.models.begin(), cohort.models.end(), [&](const ModelScores& s) { return s.name == comparison.modelB; }) - cohort.models.begin());
            shared.pairs.push_back(pairMoves(cohort.models[a].values, cohort.models[b].values, a, b, full.settings.cutPoints()));
            shared.pairValues.emplace_back();
            for (auto& part : shared.pairValues.back())
                part.assign(B, undefinedValue);
        }

    // Workers take replicates in turn and check the stop token between them. Progress is
    // reported by whichever worker finishes a replicate that crosses a whole percent: under a
    // mutex it reports every percent crossed since the last report, in order, each with the
    // first count that reaches it (that many replicates have finished). Reporting only its own
    // count let a worker that crossed the next percent first hide the one before, when the other
    // worker had crossed it but not yet taken the mutex.
    std::atomic<std::size_t> nextReplicate{0}, done{0};
    std::atomic<bool> failed{false};
    std::mutex mutex;
    std::size_t reportedPercent = 0, reportedCount = 0;
    std::exception_ptr failure;
    if (progress)
        progress(0, B);
    auto report = [&](std::size_t finished) {
        if (!progress || (finished * 100 / B == (finished - 1) * 100 / B && finished != B))
            return;
        const std::lock_guard lock(mutex);
        const std::size_t finishedNow = done.load();
        for (std::size_t percent = reportedPercent + 1; percent <= finishedNow * 100 / B; ++percent) {
            const std::size_t count = (percent * B + 99) / 100; // the first count at this percent
            if (count > reportedCount) {
                reportedCount = count;
                progress(count, B);
            }
            reportedPercent = percent;
        }
    };
    auto worker = [&] {
        std::vector<std::uint16_t> counts(cohort.rows());
        SupportCounts supportCounts;
        CurveSample curve;
        try {
            for (std::size_t r; !failed && !stop.stop_requested() && (r = nextReplicate++) < B;) {
                if (!runReplicate(shared, r, counts, supportCounts, curve, stop))
                    break;
                report(++done);
            }
        } catch (...) {
            const std::lock_guard lock(mutex);
            failure = std::current_exception();
            failed = true;
        }
    };
    {
        std::vector<std::jthread> pool;
        for (unsigned t = 1; t < std::max(1u, settings.threads); ++t)
            pool.emplace_back(worker);
        worker(); // the calling thread works too
    } // joins
    if (failure)
        std::rethrow_exception(failure);
    if (done < B || stop.stop_requested())
        return std::nullopt;

    BootstrapResult result;
    result.settings = settings;
    result.confidence = full.settings.confidence;
    for (std::size_t r : shared.redraws)
        result.redrawn += r;
    result.events = shared.eventRows.size();
    result.nonEvents = shared.nonEventRows.size();
    for (std::size_t m = 0; m < cohort.models.size(); ++m) {
        if (stop.stop_requested())
            return std::nullopt;
        result.models.push_back(summariseModel(shared, cohort, m, full.models[m], full.settings.confidence, result));
    }
    result.pairs = summarisePairs(shared, full.settings.confidence);
    if (result.redrawn > 0)
        result.warnings.push_back(std::to_string(result.redrawn)
                                  + " bootstrap draws lacked events or non-events and were redrawn.");
    return result;
}

void applyBootstrap(ValidationResult& result, const BootstrapResult& bootstrap)
{
    const BootstrapEvidence evidence{bootstrap.events, bootstrap.nonEvents, bootstrap.redrawn, bootstrap.settings.replicates};
    for (std::size_t m = 0; m < result.models.size(); ++m) {
        ModelValidation& model = result.models[m];
        model.calibrationBand = bootstrap.models[m].calibrationBand;
        model.rocBand = bootstrap.models[m].rocBand;
        const CurveBand& decision = bootstrap.models[m].decisionBand;
        for (auto& point : model.decisionCurve)
            for (std::size_t j = 0; j < decision.x.size(); ++j)
                if (decision.x[j] == point.threshold) {
                    point.lower = decision.lower[j];
                    point.upper = decision.upper[j];
                }
        for (std::size_t k = 0; k < PanelMetricCount; ++k) {
            const auto& b = bootstrap.models[m].metrics[k];
            MetricEntry& entry = model.metrics[k];
            if (!b)
                continue;
            entry.bootstrap = *b;
            entry.analytic = entry.estimate;
            // The interval reported follows the rule of interval_choice; `se` stays the analytic
            // SE (the bootstrap's is in `bootstrap`), so each field keeps one meaning.
            const ChosenInterval chosen = chooseInterval(entry.estimate, *b, bootstrap.settings.method, evidence);
            entry.estimate = chosen.estimate;
            entry.intervalNote = chosen.note;
            if (chosen.note.starts_with("no interval"))
                result.warnings.push_back("Model '" + model.name + "': " + metricLabel(entry.key) + ": " + chosen.note + ".");
        }
        readMetrics(model.metrics);
        if (evidence.sparse())
            result.warnings.push_back("Model '" + model.name + "': the cohort is small for the bootstrap (" + std::to_string(evidence.events)
                                      + " events, " + std::to_string(evidence.nonEvents) + " non-events, " + std::to_string(evidence.redrawn)
                                      + " draws redrawn): analytic or exact intervals are reported where a metric has one, the bootstrap "
                                        "intervals stay beside them in the result.");
    }
    for (std::size_t p = 0; p < result.comparisons.size() && p < bootstrap.pairs.size(); ++p) {
        ModelComparison& comparison = result.comparisons[p];
        auto attach = [&evidence](DifferenceEstimate& d, const MetricBootstrap& b) {
            if (b.replicatesUsed < 2 || !d.estimate.value)
                return;
            d.bootstrap = b;
            if (d.estimate.lower)
                d.analytic = d.estimate;
            const ChosenInterval chosen = chooseDifferenceInterval(d.estimate, b, evidence);
            d.estimate = chosen.estimate;
            d.intervalNote = chosen.note;
            if (d.estimate.ciMethod != CiMethod::Wald && d.estimate.ciMethod != CiMethod::DeLongPlain)
                d.truncated = false; // a bootstrap interval never leaves the quantity's range
        };
        for (auto& d : comparison.differences)
            for (const auto& [key, b] : bootstrap.pairs[p].differences)
                if (key == d.key)
                    attach(d, b);
        for (std::size_t t = 0; t < comparison.netBenefitDifferences.size() && t < bootstrap.pairs[p].netBenefitDifferences.size(); ++t)
            attach(comparison.netBenefitDifferences[t], bootstrap.pairs[p].netBenefitDifferences[t]);
    }
    result.bootstrap = BootstrapSummary{bootstrap.settings.replicates, bootstrap.settings.seed,
                                        std::string(bootstrapCiName(bootstrap.settings.method)),
                                        bootstrap.settings.stratified, bootstrap.redrawn};
    result.warnings.insert(result.warnings.end(), bootstrap.warnings.begin(), bootstrap.warnings.end());
}

} // namespace plumbline
