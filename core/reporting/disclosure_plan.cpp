#include "reporting/disclosure_plan.hpp"

#include "reporting/site_disclosure.hpp"
#include "reporting/small_cell_protection.hpp"

#include <algorithm>
#include <cmath>
#include <map>
#include <numeric>
#include <optional>
#include <tuple>

namespace plumbline {

namespace {

using Cell = SmallCellProtection::Cell;

// Patients at or above each threshold, by outcome, for one model's risks.
struct FlaggedCounts {
    std::vector<double> sortedRisk;      // ascending
    std::vector<std::size_t> eventsFrom; // events among sortedRisk[i..]
    std::size_t events = 0, rows = 0;

    FlaggedCounts(const std::vector<double>& risk, const std::vector<std::uint8_t>& outcome)
    {
        std::vector<std::size_t> order(risk.size());
        std::iota(order.begin(), order.end(), std::size_t{0});
        std::sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) { return risk[a] < risk[b]; });
        rows = risk.size();
        sortedRisk.resize(rows);
        eventsFrom.assign(rows + 1, 0);
        for (std::size_t i = 0; i < rows; ++i)
            sortedRisk[i] = risk[order[i]];
        for (std::size_t i = rows; i-- > 0;)
            eventsFrom[i] = eventsFrom[i + 1] + outcome[order[i]];
        events = eventsFrom[0];
    }
    // TP, FP, TN, FN with risk >= t flagged.
    std::array<std::size_t, 4> at(double t) const
    {
        const std::size_t first = std::size_t(std::lower_bound(sortedRisk.begin(), sortedRisk.end(), t) - sortedRisk.begin());
        const std::size_t tp = eventsFrom[first], flagged = rows - first;
        const std::size_t fp = flagged - tp, fn = events - tp, tn = rows - flagged - fn;
        return {tp, fp, tn, fn};
    }
};

bool anySmall(const std::array<std::size_t, 4>& counts, std::size_t minimumCell)
{
    return std::any_of(counts.begin(), counts.end(), [&](std::size_t c) { return c > 0 && c < minimumCell; });
}

bool sameThreshold(double a, double b)
{
    return std::abs(a - b) < 1e-9;
}

} // namespace

bool DisclosurePlan::riskGroupWithheld(std::size_t model, std::size_t group) const
{
    const auto& g = riskGroups[model][group];
    return g[0].suppressed || g[1].suppressed;
}

bool DisclosurePlan::thresholdWithheld(std::size_t model, std::size_t threshold) const
{
    const auto& t = thresholds[model][threshold];
    return std::any_of(t.begin(), t.end(), [](const CountShown& c) { return c.suppressed; });
}

bool DisclosurePlan::subgroupWithheld(std::size_t result) const
{
    return subgroups[result][0].suppressed || subgroups[result][1].suppressed;
}

bool DisclosurePlan::periodWithheld(std::size_t result) const
{
    return periods[result][0].suppressed || periods[result][1].suppressed;
}

DisclosurePlan planDisclosure(const Cohort& cohort, const ValidationResult& result, double decisionThreshold,
                              std::size_t minimumCell)
{
    SmallCellProtection cells;
    const std::size_t n = cohort.rows(), events = cohort.events();
    const Cell all = cells.published(n), withEvent = cells.published(events), withoutEvent = cells.published(n - events);
    const Cell zero = cells.published(0);

    // Risk groups: patients = events + non-events; each column adds up to the cohort.
    std::vector<std::vector<std::array<Cell, 2>>> groupCells(result.models.size());
    for (std::size_t m = 0; m < result.models.size(); ++m) {
        std::vector<Cell> patients, eventCells;
        for (const auto& g : result.models[m].riskGroups) {
            const Cell p = cells.printed(g.n), e = cells.printed(g.events), ne = cells.unprinted(g.n - g.events);
            cells.sumOf(std::array{e, ne}, p);
            patients.push_back(p);
            eventCells.push_back(e);
            groupCells[m].push_back({p, e});
        }
        if (!patients.empty()) {
            cells.sumOf(patients, all);
            cells.sumOf(eventCells, withEvent);
        }
    }

    // Threshold table: TP + FN = events, FP + TN = non-events.
    std::vector<std::vector<std::array<Cell, 4>>> thresholdCells(result.models.size());
    for (std::size_t m = 0; m < result.models.size(); ++m)
        for (const auto& t : result.models[m].thresholds) {
            const std::array<Cell, 4> c{cells.printed(t.tp), cells.printed(t.fp), cells.printed(t.tn), cells.printed(t.fn)};
            cells.sumOf(std::array{c[0], c[3]}, withEvent);
            cells.sumOf(std::array{c[1], c[2]}, withoutEvent);
            thresholdCells[m].push_back(c);
        }
    auto modelIndex = [&](const std::string& name) -> std::optional<std::size_t> {
        for (std::size_t m = 0; m < result.models.size(); ++m)
            if (result.models[m].name == name)
                return m;
        return std::nullopt;
    };
    // The threshold table's cell of patients flagged at `cut` (TP for events, FP for non-events),
    // or one unprinted cell per model, cut and class holding that count where the table has no
    // such threshold.
    std::map<std::tuple<long, long, bool>, Cell> flaggedUnprinted;
    auto flaggedCell = [&](std::optional<std::size_t> m, double cut, bool eventsSide, std::size_t value, long comparison) {
        if (m)
            for (std::size_t k = 0; k < result.models[*m].thresholds.size(); ++k)
                if (sameThreshold(result.models[*m].thresholds[k].threshold, cut))
                    return thresholdCells[*m][k][eventsSide ? 0 : 1];
        const auto key = std::tuple{m ? long(*m) : -1 - comparison, std::lround(cut * 1e9), eventsSide};
        if (auto found = flaggedUnprinted.find(key); found != flaggedUnprinted.end())
            return found->second;
        return flaggedUnprinted.emplace(key, cells.unprinted(value)).first->second;
    };

    // Reclassification: each row (column) adds up to the patients model A (B) puts in that
    // category, which the threshold table gives as differences of flagged counts; the NRI's
    // estimate and Wald interval give the counts moved up and moved down.
    struct ComparisonCells {
        std::vector<std::vector<Cell>> ev, nev;
        std::array<Cell, 4> moved{}; // up-minus-down pairs: events up, events down, non-events up, non-events down
        bool categorical = false;
    };
    std::vector<ComparisonCells> comparisonCells;
    for (const auto& c : result.comparisons) {
        ComparisonCells out;
        const auto& r = c.reclassification;
        const std::size_t k = r.events.size();
        const auto a = modelIndex(c.modelA), b = modelIndex(c.modelB);
        for (int side = 0; side < 2; ++side) {
            const auto& counts = side == 0 ? r.events : r.nonEvents;
            auto& grid = side == 0 ? out.ev : out.nev;
            grid.assign(k, std::vector<Cell>(k, 0));
            for (std::size_t i = 0; i < k; ++i)
                for (std::size_t j = 0; j < k; ++j)
                    grid[i][j] = cells.printed(counts[i][j]);
            const Cell classTotal = side == 0 ? withEvent : withoutEvent;
            for (int byRow = 0; byRow < 2; ++byRow) {
                // Flagged at cut q: the patients in categories above q.
                auto flaggedAt = [&](std::size_t q) {
                    std::size_t total = 0;
                    for (std::size_t i = q + 1; i < k; ++i)
                        for (std::size_t j = 0; j < k; ++j)
                            total += byRow == 0 ? counts[i][j] : counts[j][i];
                    return total;
                };
                for (std::size_t i = 0; i < k; ++i) {
                    std::vector<Cell> parts;
                    for (std::size_t j = 0; j < k; ++j)
                        parts.push_back(byRow == 0 ? grid[i][j] : grid[j][i]);
                    const auto model = byRow == 0 ? a : b;
                    const Cell below = i == 0 ? classTotal : flaggedCell(model, r.cutPoints[i - 1], side == 0, flaggedAt(i - 1), long(comparisonCells.size()) * 2 + byRow);
                    if (i + 1 < k)
                        parts.push_back(flaggedCell(model, r.cutPoints[i], side == 0, flaggedAt(i), long(comparisonCells.size()) * 2 + byRow));
                    cells.sumOf(parts, below);
                }
            }
            if (!r.cutPoints.empty()) {
                std::vector<Cell> up, down;
                std::size_t upCount = 0, downCount = 0;
                for (std::size_t i = 0; i < k; ++i)
                    for (std::size_t j = 0; j < k; ++j) {
                        if (j > i) {
                            up.push_back(grid[i][j]);
                            upCount += counts[i][j];
                        } else if (j < i) {
                            down.push_back(grid[i][j]);
                            downCount += counts[i][j];
                        }
                    }
                out.moved[side * 2] = cells.printed(upCount);
                out.moved[side * 2 + 1] = cells.printed(downCount);
                cells.sumOf(up, out.moved[side * 2]);
                cells.sumOf(down, out.moved[side * 2 + 1]);
                out.categorical = true;
            }
        }
        comparisonCells.push_back(out);
    }
    // The category-free NRI: its parts give the patients whose risk rose and fell; with those
    // unchanged they add up to each class.
    std::vector<std::array<Cell, 4>> continuousCells;
    for (const auto& c : result.comparisons) {
        const auto a = modelIndex(c.modelA), b = modelIndex(c.modelB);
        std::array<std::size_t, 6> moved{}; // events up, down, same; non-events up, down, same
        if (a && b && *a < cohort.models.size() && *b < cohort.models.size())
            for (std::size_t i = 0; i < n; ++i) {
                const double change = cohort.models[*b].values[i] - cohort.models[*a].values[i];
                const std::size_t base = cohort.outcome[i] ? 0 : 3;
                ++moved[base + (change > 0 ? 0 : change < 0 ? 1 : 2)];
            }
        std::array<Cell, 4> printedMoves{};
        for (int side = 0; side < 2; ++side) {
            const Cell up = cells.printed(moved[side * 3]), down = cells.printed(moved[side * 3 + 1]);
            const Cell same = cells.unprinted(moved[side * 3 + 2]);
            cells.sumOf(std::array{up, down, same}, side == 0 ? withEvent : withoutEvent);
            printedMoves[side * 2] = up;
            printedMoves[side * 2 + 1] = down;
        }
        continuousCells.push_back(printedMoves);
    }

    // Subgroup levels: the same patients under every model; each column adds up to the cohort.
    std::map<std::pair<std::string, std::string>, std::array<Cell, 2>> levelCells;
    std::map<std::string, std::pair<std::vector<Cell>, std::vector<Cell>>> columnLevels;
    std::vector<std::array<Cell, 2>> subgroupCells;
    if (result.subgroups)
        for (const auto& r : result.subgroups->results) {
            const auto key = std::pair{r.column, r.level};
            auto found = levelCells.find(key);
            if (found == levelCells.end()) {
                const Cell p = cells.printed(r.n), e = cells.printed(r.events), ne = cells.unprinted(r.n - r.events);
                cells.sumOf(std::array{e, ne}, p);
                found = levelCells.emplace(key, std::array{p, e}).first;
                columnLevels[r.column].first.push_back(p);
                columnLevels[r.column].second.push_back(e);
            }
            subgroupCells.push_back(found->second);
        }
    for (const auto& [column, parts] : columnLevels) {
        std::size_t patients = 0, levelEvents = 0;
        for (Cell p : parts.first)
            patients += cells.value(p);
        for (Cell e : parts.second)
            levelEvents += cells.value(e);
        // Every row has a level ("(missing)" included), so the levels add up to the cohort.
        cells.sumOf(parts.first, patients == n ? all : cells.unprinted(patients));
        cells.sumOf(parts.second, levelEvents == events ? withEvent : cells.unprinted(levelEvents));
    }

    // Periods: the same patients under every model; with the undated rows (published) they add
    // up to the cohort. The first year's O/E interval gives its events.
    std::map<std::string, std::array<Cell, 2>> periodCells;
    std::vector<std::array<Cell, 2>> periodResultCells;
    std::optional<Cell> firstYearEvents, latestYearEvents;
    if (result.periods) {
        std::vector<Cell> patients, eventCells;
        for (const auto& p : result.periods->results) {
            auto found = periodCells.find(p.period);
            if (found == periodCells.end()) {
                const Cell pc = cells.printed(p.n), e = cells.printed(p.events), ne = cells.unprinted(p.n - p.events);
                cells.sumOf(std::array{e, ne}, pc);
                found = periodCells.emplace(p.period, std::array{pc, e}).first;
                patients.push_back(pc);
                eventCells.push_back(e);
            }
            periodResultCells.push_back(found->second);
        }
        const std::size_t undated = result.periods->undated;
        if (undated > 0) {
            std::size_t datedEvents = 0;
            for (Cell e : eventCells)
                datedEvents += cells.value(e);
            const Cell undatedRows = cells.published(undated);
            const Cell undatedEvents = cells.unprinted(events - std::min(events, datedEvents));
            const Cell undatedNonEvents = cells.unprinted(undated - cells.value(undatedEvents));
            cells.sumOf(std::array{undatedEvents, undatedNonEvents}, undatedRows);
            patients.push_back(undatedRows);
            eventCells.push_back(undatedEvents);
        }
        if (!patients.empty()) {
            cells.sumOf(patients, all);
            cells.sumOf(eventCells, withEvent);
        }
        // The first year's and the latest months' O/E intervals give their events: sums of periods.
        auto pooledEvents = [&](const std::vector<std::string>& periods) -> std::optional<Cell> {
            std::vector<Cell> parts;
            std::size_t count = 0;
            for (const auto& period : periods)
                if (auto found = periodCells.find(period); found != periodCells.end()) {
                    parts.push_back(found->second[1]);
                    count += cells.value(found->second[1]);
                }
            if (parts.empty())
                return std::nullopt;
            const Cell pooled = cells.printed(count);
            cells.sumOf(parts, pooled);
            return pooled;
        };
        firstYearEvents = pooledEvents(result.periods->firstYearPeriods);
        latestYearEvents = pooledEvents(result.periods->latestYearPeriods);
    }
    (void)zero;

    cells.protect(minimumCell);

    DisclosurePlan plan;
    plan.minimumCell = minimumCell;
    plan.events = events;
    plan.nonEvents = n - events;
    auto shown = [&](Cell c) { return CountShown{cells.value(c), cells.suppressed(c), cells.primary(c) && cells.suppressed(c)}; };
    for (const auto& model : groupCells) {
        plan.riskGroups.emplace_back();
        for (const auto& g : model)
            plan.riskGroups.back().push_back({shown(g[0]), shown(g[1])});
    }
    for (const auto& model : thresholdCells) {
        plan.thresholds.emplace_back();
        for (const auto& t : model)
            plan.thresholds.back().push_back({shown(t[0]), shown(t[1]), shown(t[2]), shown(t[3])});
    }
    // Net benefit is TP/N − FP/N·t/(1−t): withheld where a count behind it is small, or is
    // suppressed in the threshold table at the same threshold.
    for (std::size_t m = 0; m < result.models.size(); ++m) {
        const bool scored = m < cohort.models.size() && cohort.models[m].name == result.models[m].name;
        const std::optional<FlaggedCounts> counts = scored ? std::optional<FlaggedCounts>(std::in_place, cohort.models[m].values, cohort.outcome)
                                                           : std::nullopt;
        auto withheldAt = [&](double t) {
            if (!counts || anySmall(counts->at(t), minimumCell))
                return true;
            for (std::size_t k = 0; k < result.models[m].thresholds.size(); ++k)
                if (sameThreshold(result.models[m].thresholds[k].threshold, t) && plan.thresholdWithheld(m, k))
                    return true;
            return false;
        };
        plan.decisionCurveWithheld.emplace_back();
        for (const auto& p : result.models[m].decisionCurve)
            plan.decisionCurveWithheld.back().push_back(withheldAt(p.threshold));
        plan.decisionThresholdWithheld.push_back(withheldAt(decisionThreshold));
    }
    for (std::size_t c = 0; c < comparisonCells.size(); ++c) {
        const auto& cc = comparisonCells[c];
        auto grid = [&](const std::vector<std::vector<Cell>>& g) {
            std::vector<std::vector<CountShown>> out;
            for (const auto& row : g) {
                out.emplace_back();
                for (Cell cell : row)
                    out.back().push_back(shown(cell));
            }
            return out;
        };
        plan.reclassEvents.push_back(grid(cc.ev));
        plan.reclassNonEvents.push_back(grid(cc.nev));
        const auto& moves = continuousCells[c];
        plan.nriWithheld.push_back({cc.categorical && (cells.suppressed(cc.moved[0]) || cells.suppressed(cc.moved[1])),
                                    cc.categorical && (cells.suppressed(cc.moved[2]) || cells.suppressed(cc.moved[3])),
                                    cells.suppressed(moves[0]) || cells.suppressed(moves[1]),
                                    cells.suppressed(moves[2]) || cells.suppressed(moves[3])});
    }
    for (const auto& s : subgroupCells)
        plan.subgroups.push_back({shown(s[0]), shown(s[1])});
    for (const auto& p : periodResultCells)
        plan.periods.push_back({shown(p[0]), shown(p[1])});
    plan.firstYearEventsWithheld = firstYearEvents && cells.suppressed(*firstYearEvents);
    plan.latestYearEventsWithheld = latestYearEvents && cells.suppressed(*latestYearEvents);
    // As the tables show them (a subgroup level's counts once per model row).
    auto tally = [&](const CountShown& c) { plan.suppressedCells += c.suppressed ? 1 : 0; };
    for (const auto* table : {&plan.riskGroups})
        for (const auto& model : *table)
            for (const auto& row : model)
                std::for_each(row.begin(), row.end(), tally);
    for (const auto& model : plan.thresholds)
        for (const auto& row : model)
            std::for_each(row.begin(), row.end(), tally);
    for (const auto* grids : {&plan.reclassEvents, &plan.reclassNonEvents})
        for (const auto& grid : *grids)
            for (const auto& row : grid)
                std::for_each(row.begin(), row.end(), tally);
    for (const auto* rows : {&plan.subgroups, &plan.periods})
        for (const auto& row : *rows)
            std::for_each(row.begin(), row.end(), tally);
    plan.unprotectable = cells.unprotectable();
    return plan;
}

ValidationResult redactedForReport(const ValidationResult& result, const DisclosurePlan& plan)
{
    ValidationResult out = result;
    for (std::size_t m = 0; m < out.models.size(); ++m) {
        ModelValidation& model = out.models[m];
        std::vector<RiskGroup> groups;
        bool anyGroupWithheld = false;
        for (std::size_t g = 0; g < model.riskGroups.size(); ++g) {
            if (plan.riskGroupWithheld(m, g))
                anyGroupWithheld = true;
            else
                groups.push_back(model.riskGroups[g]);
        }
        model.riskGroups = groups;
        // The Hosmer-Lemeshow statistic is a sum over the groups' counts: with the others printed
        // it could be solved for a suppressed one.
        if (anyGroupWithheld)
            model.hosmerLemeshow.reset();
        std::vector<DecisionCurvePoint> curve;
        for (std::size_t k = 0; k < model.decisionCurve.size(); ++k)
            if (!plan.decisionCurveWithheld[m][k])
                curve.push_back(model.decisionCurve[k]);
        model.decisionCurve = curve;
        // The ROC curve's vertices are cumulative counts (sensitivity x events, 1 - specificity x
        // non-events): drawn finely they bracket a suppressed risk group within a few patients.
        // A vertex is kept only when both counts have moved by at least the minimum since the last.
        if (!model.roc.empty()) {
            std::vector<RocPoint> thinned{model.roc.front()};
            auto tp = [&](const RocPoint& p) { return p.sensitivity * double(plan.events); };
            auto fp = [&](const RocPoint& p) { return (1.0 - p.specificity) * double(plan.nonEvents); };
            for (std::size_t k = 1; k + 1 < model.roc.size(); ++k)
                if (std::abs(tp(model.roc[k]) - tp(thinned.back())) >= double(plan.minimumCell)
                    && std::abs(fp(model.roc[k]) - fp(thinned.back())) >= double(plan.minimumCell))
                    thinned.push_back(model.roc[k]);
            if (model.roc.size() > 1) {
                // The last kept vertex must also stand the minimum away from the curve's end.
                const RocPoint& end = model.roc.back();
                if (thinned.size() > 1
                    && (std::abs(tp(end) - tp(thinned.back())) < double(plan.minimumCell)
                        || std::abs(fp(end) - fp(thinned.back())) < double(plan.minimumCell)))
                    thinned.pop_back();
                thinned.push_back(end);
            }
            model.roc = thinned;
        }
    }
    auto empty = [](DifferenceEstimate& d) {
        d.estimate = Estimate{};
        d.pValue.reset();
        d.bootstrap.reset();
        d.analytic.reset();
        d.intervalNote.clear();
    };
    auto index = [&](const std::string& name) {
        for (std::size_t m = 0; m < result.models.size(); ++m)
            if (result.models[m].name == name)
                return m;
        return result.models.size();
    };
    for (std::size_t c = 0; c < out.comparisons.size(); ++c) {
        ModelComparison& comparison = out.comparisons[c];
        const auto& nri = plan.nriWithheld[c];
        for (auto& d : comparison.differences) {
            if ((d.key == "nri_events" && nri[0]) || (d.key == "nri_non_events" && nri[1]) || (d.key == "nri" && (nri[0] || nri[1]))
                || (d.key == "nri_continuous_events" && nri[2]) || (d.key == "nri_continuous_non_events" && nri[3])
                || (d.key == "nri_continuous" && (nri[2] || nri[3])))
                empty(d);
        }
        // A difference of net benefits gives one model's from the other's.
        const std::size_t a = index(comparison.modelA), b = index(comparison.modelB);
        for (std::size_t t = 0; t < comparison.netBenefitDifferences.size(); ++t)
            for (std::size_t m : {a, b}) {
                if (m >= result.models.size())
                    continue;
                const auto& thresholds = result.models[m].thresholds;
                for (std::size_t k = 0; k < thresholds.size(); ++k)
                    if (std::abs(thresholds[k].threshold - comparison.netBenefitThresholds[t]) < 1e-9 && plan.thresholdWithheld(m, k))
                        empty(comparison.netBenefitDifferences[t]);
            }
    }
    if (out.subgroups) {
        for (std::size_t r = 0; r < out.subgroups->results.size(); ++r)
            if (plan.subgroupWithheld(r) || out.subgroups->results[r].tooSmall) {
                SubgroupResult& level = out.subgroups->results[r];
                level.tooSmall = true;
                for (auto& metric : level.panel.metrics)
                    metric.estimate = Estimate{};
                level.panel.riskGroups.clear();
                level.panel.calibrationCurve.clear();
            }
        std::vector<FunnelPoint> funnel;
        for (const auto& f : out.subgroups->funnel) {
            bool withheld = false;
            for (std::size_t r = 0; r < out.subgroups->results.size(); ++r) {
                const auto& level = out.subgroups->results[r];
                if (level.column == f.column && level.level == f.level && level.model == f.model)
                    withheld = plan.subgroupWithheld(r);
            }
            if (!withheld)
                funnel.push_back(f);
        }
        out.subgroups->funnel = funnel;
    }
    if (out.periods) {
        for (std::size_t r = 0; r < out.periods->results.size(); ++r)
            if (plan.periodWithheld(r)) {
                PeriodResult& p = out.periods->results[r];
                p.c = p.oe = p.calibrationIntercept = Estimate{};
                p.outsideFirstYear = false;
            }
        for (auto [withheld, references] : {std::pair{plan.firstYearEventsWithheld, &out.periods->firstYear},
                                            std::pair{plan.latestYearEventsWithheld, &out.periods->latestYear}})
            if (withheld)
                for (auto& reference : *references) {
                    reference.oe.lower.reset();
                    reference.oe.upper.reset();
                }
    }
    if (out.sites)
        withholdSmallSites(*out.sites, plan.minimumCell);
    return out;
}

std::string disclosureRuleText(const DisclosurePlan& plan)
{
    const std::string minimum = std::to_string(plan.minimumCell);
    std::string text = "Small cells: a count of 1 to ";
    text += std::to_string(plan.minimumCell - 1);
    text += " patients (below ";
    text += minimum;
    text += ") is shown as \"suppressed\", and so are further counts wherever a reader could otherwise work a small count "
            "out from the totals, the other tables or the intervals (complementary suppression, checked across the whole "
            "report; one marker for both, so the small cell cannot be told from its complement), and "
            "rates, intervals, tests and net benefits built on a suppressed count are withheld. The cohort's patients and "
            "events, rows excluded for a data-quality reason and rows without a date are shown as they are. ";
    text += std::to_string(plan.suppressedCells);
    text += plan.suppressedCells == 1 ? " count is suppressed in this report." : " counts are suppressed in this report.";
    if (plan.unprotectable > 0) {
        text += " ";
        text += std::to_string(plan.unprotectable);
        text += " small counts equal a published total and could not be protected.";
    }
    return text;
}

} // namespace plumbline
