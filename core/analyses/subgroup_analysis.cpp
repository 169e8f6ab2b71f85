#include "analyses/subgroup_analysis.hpp"

#include "metrics/distributions.hpp"
#include "analyses/two_threads.hpp"
#include "analyses/validation.hpp"

#include <boost/math/distributions/poisson.hpp>

#include <algorithm>
#include <cmath>
#include <numeric>

namespace plumbline {

double funnelLimit(double expected, double p, bool upper)
{
    // y_p: the p-quantile of Poisson(E), interpolated between integers so the limit is smooth in E.
    const double q = upper ? 1.0 - p : p;
    const boost::math::poisson_distribution<> poisson(expected);
    double r = std::floor(boost::math::quantile(poisson, q));
    while (r > 0 && boost::math::cdf(poisson, r - 1) >= q)
        r -= 1;
    while (boost::math::cdf(poisson, r) < q)
        r += 1;
    const double atR = boost::math::cdf(poisson, r);
    const double belowR = r > 0 ? boost::math::cdf(poisson, r - 1) : 0.0;
    const double alpha = (atR - q) / (atR - belowR);
    return std::max(0.0, r - alpha) / expected;
}

namespace {

Cohort levelCohort(const Cohort& cohort, const CategoricalColumn& column, std::uint32_t code)
{
    Cohort out;
    out.scale = cohort.scale;
    for (const auto& m : cohort.models)
        out.models.push_back({m.name, {}});
    for (std::size_t i = 0; i < cohort.rows(); ++i) {
        if (column.codes[i] != code)
            continue;
        out.outcome.push_back(cohort.outcome[i]);
        for (std::size_t m = 0; m < cohort.models.size(); ++m)
            out.models[m].values.push_back(cohort.models[m].values[i]);
    }
    return out;
}

HeterogeneityTest cochranQ(const std::string& column, const std::string& model, const std::string& metric,
                           const std::vector<std::pair<double, double>>& estimates)
{
    HeterogeneityTest t{column, model, metric, 0.0, 0, 1.0, estimates.size()};
    if (estimates.size() < 2)
        return t;
    double sumW = 0.0, sumWX = 0.0;
    for (const auto& [x, se] : estimates) {
        sumW += 1.0 / (se * se);
        sumWX += x / (se * se);
    }
    const double pooled = sumWX / sumW;
    for (const auto& [x, se] : estimates)
        t.q += (x - pooled) * (x - pooled) / (se * se);
    t.df = int(estimates.size()) - 1;
    t.pValue = chiSquaredUpperTail(t.q, double(t.df));
    return t;
}

} // namespace

SubgroupAnalysis analyseSubgroups(const Cohort& cohort, const PanelSettings& settings, std::size_t minimumCell,
                                  const std::vector<ScoreOrder>& orders)
{
    SubgroupAnalysis out;
    for (const CategoricalColumn& column : cohort.groups) {
        std::vector<std::vector<std::pair<double, double>>> citl(cohort.models.size()), logitC(cohort.models.size()),
            slope(cohort.models.size());
        // Levels in name order (age bands, sites), not in the order they first appear in the file.
        std::vector<std::uint32_t> codes(column.levels.size());
        std::iota(codes.begin(), codes.end(), 0u);
        std::sort(codes.begin(), codes.end(), [&](auto a, auto b) { return column.levels[a] < column.levels[b]; });
        // Each level's panel on its own rows, levels shared between two threads (each result
        // kept in its level's slot, so the outcome does not depend on the threads).
        struct LevelRun {
            std::size_t rows = 0, events = 0;
            ValidationResult result;
            std::vector<double> expected; // Σ risk per model
        };
        std::vector<LevelRun> runs(codes.size());
        // Each level's order per model, read off the whole cohort's: the cohort's order sorted by
        // (score, row), filtered to a level and renumbered, is the level's own ascendingOrder.
        const bool ordered = orders.size() == cohort.models.size();
        std::vector<std::vector<ScoreOrder>> levelOrders(column.levels.size());
        if (ordered) {
            std::vector<std::uint32_t> indexInLevel(cohort.rows());
            std::vector<std::uint32_t> seen(column.levels.size(), 0);
            for (std::size_t i = 0; i < cohort.rows(); ++i)
                indexInLevel[i] = seen[column.codes[i]]++;
            for (std::size_t level = 0; level < column.levels.size(); ++level)
                levelOrders[level].assign(cohort.models.size(), {});
            for (std::size_t m = 0; m < cohort.models.size(); ++m) {
                for (std::size_t level = 0; level < column.levels.size(); ++level)
                    levelOrders[level][m].reserve(seen[level]);
                for (const std::uint32_t row : orders[m])
                    levelOrders[column.codes[row]][m].push_back(indexInLevel[row]);
            }
            // The levels' runs need only their orders.
            std::vector<std::uint32_t>().swap(indexInLevel);
        }
        // A capacity belongs to the whole cohort (its team, its dates): levels run without it.
        PanelSettings levelSettings = settings;
        levelSettings.capacity.reset();
        onTwoThreads(codes.size(), [&](std::size_t i) {
            const Cohort level = levelCohort(cohort, column, codes[i]);
            runs[i].rows = level.rows();
            runs[i].events = level.events();
            runs[i].result = runValidation(level, levelSettings, 1, std::move(levelOrders[codes[i]]));
            for (const auto& model : level.models)
                runs[i].expected.push_back(std::accumulate(model.values.begin(), model.values.end(), 0.0));
        });
        for (std::size_t i = 0; i < codes.size(); ++i) {
            const std::uint32_t code = codes[i];
            const std::size_t rows = runs[i].rows, events = runs[i].events;
            const bool tooSmall = rows < minimumCell || events < minimumCell || rows - events < minimumCell;
            const ValidationResult& result = runs[i].result;
            for (std::size_t m = 0; m < cohort.models.size(); ++m) {
                const ModelValidation& panel = result.models[m];
                out.results.push_back({column.name, column.levels[code], cohort.models[m].name, rows, events, tooSmall, panel});
                if (tooSmall)
                    continue; // not in the heterogeneity test or the funnel, but shown
                const Estimate& a = panel.metrics[CalibrationIntercept].estimate;
                if (a.value && a.se)
                    citl[m].emplace_back(*a.value, *a.se);
                const Estimate& b = panel.metrics[CalibrationSlope].estimate;
                if (b.value && b.se && *b.se > 0.0)
                    slope[m].emplace_back(*b.value, *b.se);
                const Estimate& c = panel.metrics[CStatistic].estimate;
                if (c.value && c.se && *c.value > 0.0 && *c.value < 1.0)
                    logitC[m].emplace_back(std::log(*c.value / (1.0 - *c.value)), *c.se / (*c.value * (1.0 - *c.value)));
                if (scaleIsProbabilistic(cohort.scale)) {
                    const double expected = runs[i].expected[m];
                    if (expected > 0.0)
                        out.funnel.push_back({column.name, column.levels[code], cohort.models[m].name, double(events), expected,
                                              double(events) / expected, funnelLimit(expected, 0.025, false), funnelLimit(expected, 0.025, true),
                                              funnelLimit(expected, 0.001, false), funnelLimit(expected, 0.001, true)});
                }
            }
        }
        // Limits over the range of expected counts of this column's levels, on a log grid.
        double low = 1e300, high = 0.0;
        for (const auto& f : out.funnel)
            if (f.column == column.name) {
                low = std::min(low, f.expected);
                high = std::max(high, f.expected);
            }
        if (high > 0.0) {
            FunnelLimits limits;
            limits.column = column.name;
            const double from = std::max(1.0, low * 0.5), to = high * 1.5;
            for (int k = 0; k <= 60; ++k) {
                const double e = from * std::pow(to / from, k / 60.0);
                limits.expected.push_back(e);
                limits.lower95.push_back(funnelLimit(e, 0.025, false));
                limits.upper95.push_back(funnelLimit(e, 0.025, true));
                limits.lower998.push_back(funnelLimit(e, 0.001, false));
                limits.upper998.push_back(funnelLimit(e, 0.001, true));
            }
            out.funnelLimits.push_back(std::move(limits));
        }
        for (std::size_t m = 0; m < cohort.models.size(); ++m) {
            if (scaleIsProbabilistic(cohort.scale)) {
                out.heterogeneity.push_back(cochranQ(column.name, cohort.models[m].name, "calibration_intercept", citl[m]));
                out.heterogeneity.push_back(cochranQ(column.name, cohort.models[m].name, "calibration_slope", slope[m]));
            }
            out.heterogeneity.push_back(cochranQ(column.name, cohort.models[m].name, "c_statistic", logitC[m]));
        }
    }
    return out;
}

} // namespace plumbline
