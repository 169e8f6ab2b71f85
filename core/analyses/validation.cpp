#include "analyses/validation.hpp"

#include "analyses/monitoring_warnings.hpp"
#include "analyses/subgroup_analysis.hpp"
#include "metrics/panel_keys.hpp"

#include <algorithm>
#include <exception>
#include <thread>

namespace plumbline {

namespace {

// Precision cautions about the cohort as a whole.
std::vector<std::string> cohortWarnings(const Cohort& cohort)
{
    std::vector<std::string> out;
    const std::size_t events = cohort.events();
    const std::size_t nonEvents = cohort.rows() - events;
    const std::size_t smaller = std::min(events, nonEvents);
    if (smaller < 100)
        out.push_back("Only " + std::to_string(smaller) + " patients in the smaller outcome class: estimates are imprecise; at least 100 events, ideally 200, are recommended for external validation (Collins, Ogundimu & Altman 2016, Stat Med 35:214).");
    else if (smaller < 200 && scaleIsProbabilistic(cohort.scale))
        out.push_back("Fewer than 200 events or non-events: the smoothed calibration curve is imprecise (Van Calster et al. 2016 suggest 200 of each; from memory).");
    return out;
}

} // namespace

const ModelValidation* ValidationResult::model(const std::string& name) const
{
    for (const auto& m : models)
        if (m.name == name)
            return &m;
    return nullptr;
}

ValidationResult runValidation(const Cohort& cohort, const PanelSettings& settings, unsigned threads)
{
    return runValidation(cohort, settings, threads, {});
}

ValidationResult runValidation(const Cohort& cohort, const PanelSettings& settings, unsigned threads,
                               std::vector<ScoreOrder> orders)
{
    // Each model's order is sorted once (when not given) and shared by its panel, the
    // comparisons and the subgroup levels. The sorts run one after another, each on the threads
    // given: a sort of ten million rows holds 240 MB while it runs, two at once would not fit
    // the memory such a cohort is allowed.
    orders.resize(cohort.models.size());
    for (std::size_t m = 0; m < cohort.models.size(); ++m)
        if (orders[m].size() != cohort.models[m].values.size())
            orders[m] = ascendingOrder(cohort.models[m].values, threads);
    ValidationResult result;
    result.settings = settings;
    result.models.resize(cohort.models.size());
    const std::size_t workers = std::clamp<std::size_t>(threads, 1, std::max<std::size_t>(1, cohort.models.size()));
    // Model m goes to worker m % workers; each writes only its own slot. A failure in a worker
    // (out of memory, a library error) is carried back and rethrown here, never lost.
    std::vector<std::exception_ptr> failures(workers);
    auto work = [&](std::size_t w) {
        try {
            for (std::size_t m = w; m < cohort.models.size(); m += workers)
                result.models[m] = validateModel(cohort.outcome, cohort.models[m], cohort.scale, settings, cohort.sourceLines, orders[m]);
        } catch (...) {
            failures[w] = std::current_exception();
        }
    };
    std::vector<std::thread> pool;
    for (std::size_t w = 1; w < workers; ++w)
        pool.emplace_back(work, w);
    work(0);
    for (auto& thread : pool)
        thread.join();
    for (const auto& failure : failures)
        if (failure)
            std::rethrow_exception(failure);
    result.comparisons = compareModels(cohort, result, settings, settings.cutPoints(), &orders, threads);
    if (!cohort.groups.empty())
        result.subgroups = analyseSubgroups(cohort, settings, settings.minimumCell, orders);
    std::string periodProblem;
    if (cohort.period) {
        // The command line refuses such a run before it starts; the window still shows the rest
        // of the validation and says why there is no view over time.
        if (auto periods = analysePeriods(cohort, *cohort.period, settings.dateFormat, settings.periodUnit, settings.confidence,
                                           false, &orders))
            result.periods = std::move(*periods);
        else
            periodProblem = "No view over time: " + periods.error().message();
    }
    // Operating by capacity: the threshold that flags what the team can take, per model and period.
    std::string capacityProblem;
    if (settings.capacity) {
        if (auto capacity = analyseCapacity(cohort, *settings.capacity, orders, settings.confidence, settings.binomialInterval,
                                            settings.dateFormat, settings.periodUnit))
            result.capacity = std::move(*capacity);
        else
            capacityProblem = "No capacity threshold: " + capacity.error().message();
    }
    if (cohort.cluster)
        result.sites = analyseSites(cohort, *cohort.cluster, settings);
    // Monitoring reads the same dates, so it runs only when the view over time could read them.
    if (result.periods)
        result.monitoring = analyseMonitoring(cohort, *cohort.period, settings.dateFormat.value_or(DateFormat::Iso), settings.periodUnit,
                                              settings.confidence, settings.minimumCell, settings.monitoring);
    // Achieved precision beside the widths commonly aimed at (Riley et al. 2021 examples; from memory).
    for (const auto& model : result.models)
        for (const auto& [metric, target] : {std::pair<PanelMetric, double>{CStatistic, 0.1}, {OeRatio, 0.2}, {CalibrationSlope, 0.2}}) {
            const Estimate& e = model.metrics[metric].estimate;
            if (e.lower && e.upper)
                result.precision.push_back({model.name, std::string(panelKeys[metric]), *e.upper - *e.lower, target});
        }
    result.warnings = cohortWarnings(cohort);
    if (!periodProblem.empty())
        result.warnings.push_back(periodProblem);
    if (!capacityProblem.empty())
        result.warnings.push_back(capacityProblem);
    if (result.capacity)
        result.warnings.insert(result.warnings.end(), result.capacity->warnings.begin(), result.capacity->warnings.end());
    if (result.periods)
        result.warnings.insert(result.warnings.end(), result.periods->warnings.begin(), result.periods->warnings.end());
    if (result.sites)
        result.warnings.insert(result.warnings.end(), result.sites->warnings.begin(), result.sites->warnings.end());
    for (const auto& model : result.models)
        result.warnings.insert(result.warnings.end(), model.warnings.begin(), model.warnings.end());
    // Monitoring's findings belong in the summary, not only in its own section.
    if (result.monitoring)
        for (auto& warning : monitoringWarnings(*result.monitoring))
            result.warnings.push_back(std::move(warning));
    return result;
}

} // namespace plumbline
