#include "analyses/model_updating.hpp"

#include "intake/cohort.hpp"
#include "metrics/logistic_recalibration.hpp"
#include "resampling/random_stream.hpp"
#include "resampling/weighted_panel.hpp"

#include <algorithm>
#include <array>
#include <cmath>
#include <cstdio>
#include <numeric>

namespace plumbline {

std::string_view updateMethodName(UpdateMethod method)
{
    switch (method) {
    case UpdateMethod::Intercept: return "intercept";
    case UpdateMethod::Logistic: return "logistic";
    case UpdateMethod::ClosedTest: return "closed-test";
    }
    return "closed-test";
}

std::string_view updateChoiceName(UpdateChoice choice)
{
    switch (choice) {
    case UpdateChoice::None: return "no update";
    case UpdateChoice::Intercept: return "recalibration in the large";
    case UpdateChoice::Logistic: return "logistic recalibration";
    }
    return "no update";
}

double UpdateFit::updatedRisk(double risk) const
{
    const double p = std::clamp(risk, 1e-12, 1.0 - 1e-12);
    return 1.0 / (1.0 + std::exp(-(intercept + slope * std::log(p / (1.0 - p)))));
}

std::string UpdateFit::formula() const
{
    char buffer[128];
    std::snprintf(buffer, sizeof buffer, "logit(p_updated) = %.4f + %.4f x logit(p)", intercept, slope);
    return buffer;
}

std::optional<UpdateFit> fitUpdate(std::span<const double> risks, std::span<const double> events,
                                   std::span<const double> trials, UpdateMethod method, double alpha)
{
    const std::vector<double> lp = clampedLogits(risks);
    // As in validation: patients whose outcome contradicts a risk of 0 or 1 are not fitted.
    std::vector<double> agreeingEvents(events.begin(), events.end()), agreeingTrials(trials.begin(), trials.end());
    for (std::size_t k = 0; k < risks.size(); ++k) {
        if (contradictsOutcome(risks[k], true)) {
            agreeingTrials[k] -= agreeingEvents[k];
            agreeingEvents[k] = 0.0;
        }
        if (contradictsOutcome(risks[k], false))
            agreeingTrials[k] = agreeingEvents[k];
    }
    const BinomialPoints points{lp, agreeingEvents, agreeingTrials};
    const auto intercept = fitCalibrationIntercept(points);
    if (!intercept)
        return std::nullopt;
    UpdateFit fit;
    if (method == UpdateMethod::Intercept) {
        fit.choice = UpdateChoice::Intercept;
        fit.intercept = intercept->alpha;
        return fit;
    }
    const auto slope = fitCalibrationSlope(points);
    if (!slope)
        return std::nullopt;
    if (method == UpdateMethod::Logistic) {
        fit.choice = UpdateChoice::Logistic;
        fit.intercept = slope->intercept;
        fit.slope = slope->slope;
        return fit;
    }
    // Closed test: keep the model unless intercept and slope jointly differ from (0, 1); then the
    // intercept update unless the slope adds significantly to it.
    fit.tests = calibrationLikelihoodRatioTests(logLikelihoodOfLogits(points), *intercept, &*slope);
    if (fit.tests->joint->pValue >= alpha) {
        fit.choice = UpdateChoice::None;
    } else if (fit.tests->slopeGivenIntercept->pValue >= alpha) {
        fit.choice = UpdateChoice::Intercept;
        fit.intercept = intercept->alpha;
    } else {
        fit.choice = UpdateChoice::Logistic;
        fit.intercept = slope->intercept;
        fit.slope = slope->slope;
    }
    return fit;
}

namespace {

constexpr std::array<PanelMetric, 5> optimismMetrics{CStatistic, CalibrationIntercept, CalibrationSlope, Brier, OeRatio};

// The updated model's support points: the same patients at transformed risks, re-sorted when
// a negative slope reverses the order.
ModelSupport updatedSupport(const ModelSupport& original, const UpdateFit& fit, std::vector<std::size_t>& order)
{
    const std::size_t d = original.x.size();
    std::vector<double> x(d);
    for (std::size_t k = 0; k < d; ++k)
        x[k] = fit.updatedRisk(original.x[k]);
    order.resize(d);
    std::iota(order.begin(), order.end(), std::size_t{0});
    std::stable_sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) { return x[a] < x[b]; });
    ModelSupport out;
    for (std::size_t k : order)
        out.x.push_back(x[k]);
    addRiskTerms(out);
    return out;
}

SupportCounts reordered(const SupportCounts& counts, const std::vector<std::size_t>& order)
{
    SupportCounts out;
    for (std::size_t k : order) {
        out.events.push_back(counts.events[k]);
        out.nonEvents.push_back(counts.nonEvents[k]);
    }
    return out;
}

PanelValues performance(const ModelSupport& original, const UpdateFit& fit, const SupportCounts& counts)
{
    std::vector<std::size_t> order;
    const ModelSupport updated = updatedSupport(original, fit, order);
    return weightedPanel(updated, reordered(counts, order), FitStart{}, nullptr);
}

std::optional<UpdateFit> fitOn(const ModelSupport& support, const SupportCounts& counts, const UpdateSettings& settings)
{
    std::vector<double> trials(support.x.size());
    for (std::size_t k = 0; k < trials.size(); ++k)
        trials[k] = counts.events[k] + counts.nonEvents[k];
    return fitUpdate(support.x, counts.events, trials, settings.method, settings.alpha);
}

} // namespace

std::optional<ModelUpdate> updateModel(std::span<const std::uint8_t> outcome, std::span<const double> risk,
                                       const std::string& name, const UpdateSettings& settings, std::stop_token stop)
{
    const ModelSupport support = buildModelSupport(risk, ascendingOrder(risk), true);
    const SupportCounts sample = sampleCounts(support, outcome);
    const auto fit = fitOn(support, sample, settings);
    if (!fit)
        return std::nullopt;
    ModelUpdate out;
    out.model = name;
    out.method = settings.method;
    out.fit = *fit;
    const PanelValues apparent = performance(support, *fit, sample);

    std::array<double, optimismMetrics.size()> optimismSum{};
    std::vector<std::uint16_t> counts(outcome.size());
    SupportCounts replicate;
    for (std::size_t r = 0; r < settings.optimismReplicates; ++r) {
        if (stop.stop_requested())
            return std::nullopt;
        RandomStream random(settings.seed, r + 1);
        std::fill(counts.begin(), counts.end(), 0);
        for (std::size_t k = 0; k < outcome.size(); ++k)
            ++counts[random.below(outcome.size())];
        countRows(support, outcome, counts, replicate);
        const auto refit = fitOn(support, replicate, settings); // the whole procedure, closed test included
        if (!refit)
            continue;
        const PanelValues onBootstrap = performance(support, *refit, replicate);
        const PanelValues onOriginal = performance(support, *refit, sample);
        bool complete = true;
        for (PanelMetric k : optimismMetrics)
            complete = complete && onBootstrap[k] && onOriginal[k];
        if (!complete)
            continue;
        for (std::size_t j = 0; j < optimismMetrics.size(); ++j)
            optimismSum[j] += *onBootstrap[optimismMetrics[j]] - *onOriginal[optimismMetrics[j]];
        ++out.replicatesUsed;
    }
    out.replicates = settings.optimismReplicates;
    for (std::size_t j = 0; j < optimismMetrics.size(); ++j) {
        const PanelMetric k = optimismMetrics[j];
        if (!apparent[k])
            continue;
        const double optimism = out.replicatesUsed > 0 ? optimismSum[j] / double(out.replicatesUsed) : 0.0;
        out.optimism.push_back({std::string(panelKeys[k]), *apparent[k], optimism, *apparent[k] - optimism});
    }
    std::vector<double> updated(risk.size());
    for (std::size_t i = 0; i < risk.size(); ++i)
        updated[i] = fit->updatedRisk(risk[i]);
    out.originalGroups = riskGroups(outcome, risk, settings.riskGroups, settings.confidence, CiMethod::Wilson);
    out.updatedGroups = riskGroups(outcome, updated, settings.riskGroups, settings.confidence, CiMethod::Wilson);
    out.updatedOperatingPoints = operatingPoints(outcome, updated, ascendingOrder(updated), 0.005);
    out.cautions.push_back("The updated model is judged on the patients it was fitted on: its apparent performance is "
                           "optimistic; read the optimism-corrected column, and confirm on later patients.");
    out.cautions.push_back("Updating the intercept or the slope does not change how the model ranks patients: the C statistic "
                           "stays the same (or reverses with a negative slope).");
    return out;
}

} // namespace plumbline

namespace plumbline {

std::vector<ModelUpdate> addUpdatedModels(Cohort& cohort, const std::string& method, const UpdateSettings& base)
{
    std::vector<ModelUpdate> updates;
    if (method.empty() || !scaleIsProbabilistic(cohort.scale))
        return updates;
    UpdateSettings settings = base;
    settings.method = method == "intercept" ? UpdateMethod::Intercept
        : method == "logistic"              ? UpdateMethod::Logistic
                                            : UpdateMethod::ClosedTest;
    const std::size_t originals = cohort.models.size();
    for (std::size_t m = 0; m < originals; ++m) {
        const ModelScores original = cohort.models[m];
        const auto fitted = updateModel(cohort.outcome, original.values, original.name, settings);
        if (!fitted)
            continue;
        ModelScores updated{original.name + "_updated", std::vector<double>(original.values.size())};
        for (std::size_t i = 0; i < original.values.size(); ++i)
            updated.values[i] = fitted->fit.updatedRisk(original.values[i]);
        cohort.models.push_back(std::move(updated));
        updates.push_back(*fitted);
    }
    return updates;
}

} // namespace plumbline
