#include "analyses/monitoring_analysis.hpp"

#include "analyses/dated_sequence.hpp"
#include "analyses/two_threads.hpp"

#include "intake/score_scale.hpp"
#include "metrics/bernoulli_cusum.hpp"
#include "metrics/observed_minus_expected.hpp"
#include "metrics/population_stability.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <numeric>

namespace plumbline {

namespace {

constexpr double daysPerYear = 365.25;

struct MonthOfDay {
    int year = 0, month = 0;
};

MonthOfDay monthOf(std::int64_t day)
{
    const std::string iso = isoDate(day);
    return {std::stoi(iso.substr(0, 4)), std::stoi(iso.substr(5, 2))};
}

std::string periodName(MonthOfDay m, PeriodUnit unit)
{
    char buffer[32];
    if (unit == PeriodUnit::Month)
        std::snprintf(buffer, sizeof buffer, "%04d-%02d", m.year, m.month);
    else
        std::snprintf(buffer, sizeof buffer, "%04d-Q%d", m.year, (m.month - 1) / 3 + 1);
    return buffer;
}

// One scope's work: the rows of one model and one site (or all), in monitoring order.
struct ScopeInput {
    std::size_t model = 0;
    std::string site;
    DatedSequence sequence;
};

void fillCaseMix(MonitoringScope& scope, const std::vector<double>& p, const std::vector<std::uint8_t>& y,
                 const std::vector<std::int64_t>& days, PeriodUnit unit, double confidence, double rise)
{
    // Months as year·12 + month − 1; the first year is the scope's first 12 calendar months with
    // data, the latest year its last 12 months after the first year (all of them when fewer), as
    // in the performance over time (period_analysis).
    std::vector<int> month(days.size());
    for (std::size_t i = 0; i < days.size(); ++i) {
        const MonthOfDay m = monthOf(days[i]);
        month[i] = m.year * 12 + m.month - 1;
    }
    const int firstMonth = month.front(), lastMonth = month.back();
    const int latestFrom = std::max(firstMonth + 12, lastMonth - 11);
    std::vector<double> firstP, latestP;
    std::vector<std::uint8_t> firstY, latestY;
    for (std::size_t i = 0; i < p.size(); ++i) {
        if (month[i] < firstMonth + 12) {
            firstP.push_back(p[i]);
            firstY.push_back(y[i]);
        } else if (month[i] >= latestFrom) {
            latestP.push_back(p[i]);
            latestY.push_back(y[i]);
        }
    }
    const std::vector<double> edges = decileEdges(firstP);
    // Periods: consecutive runs of the sequence (it is in date order, so a period's rows are adjacent).
    std::size_t from = 0;
    while (from < p.size()) {
        const std::string name = periodName(monthOf(days[from]), unit);
        std::size_t to = from + 1;
        while (to < p.size() && periodName(monthOf(days[to]), unit) == name)
            ++to;
        const std::vector<double> periodP(p.begin() + std::ptrdiff_t(from), p.begin() + std::ptrdiff_t(to));
        const std::vector<std::uint8_t> periodY(y.begin() + std::ptrdiff_t(from), y.begin() + std::ptrdiff_t(to));
        CaseMixRow row;
        row.period = name;
        row.firstYear = month[from] < firstMonth + 12;
        row.values = riskAndRate(periodP, periodY, confidence);
        row.psi = populationStabilityIndex(edges, firstP, periodP);
        if (row.firstYear)
            scope.firstYearPeriods.push_back(name);
        else if (month[from] >= latestFrom)
            scope.latestYearPeriods.push_back(name);
        scope.periods.push_back(std::move(row));
        from = to;
    }
    if (!latestP.empty()) {
        scope.latestYearPsi = populationStabilityIndex(edges, firstP, latestP);
        scope.codingShift = checkCodingShift(riskAndRate(firstP, firstY, confidence), riskAndRate(latestP, latestY, confidence), rise);
        if (scope.codingShift->flagged)
            scope.question = "Predicted risk rose while the observed rate did not (PSI measures the spread of the scores, not their "
                             "level): has coding or documentation changed?";
    }
}

CusumChart cusumChart(CusumDirection direction, double oddsRatio, const std::vector<double>& p, const std::vector<std::uint8_t>& y,
                      double target, const MonitoringSettings& settings)
{
    CusumChart chart;
    chart.direction = direction;
    chart.oddsRatio = oddsRatio;
    chart.seed = settings.seed;
    ControlLimitSettings simulation;
    simulation.oddsRatio = oddsRatio;
    simulation.seed = settings.seed;
    simulation.runs = std::min(settings.simulatedRuns,
                               std::max(monitoringMinimumRuns, std::size_t(monitoringSimulationBudget / std::max(1.0, target))));
    const double largest = monitoringSimulationBudget / double(simulation.runs);
    chart.targetCapped = target > largest;
    chart.targetRunLength = std::min(target, largest);
    simulation.targetRunLength = chart.targetRunLength;
    chart.limit = chooseControlLimit(p, simulation);
    PathThinner path(p.size(), settings.chartPoints);
    const CusumRun run = runCusum(p, y, oddsRatio, chart.limit.limit, [&](double s) { path.add(s); });
    chart.path = path.points();
    for (std::size_t k = 0; k < run.signals.size(); ++k)
        chart.signalList.push_back({run.signals[k] + 1, {}, {}, direction, run.sinceReset[k]});
    return chart;
}

} // namespace

const char* cusumDirectionKey(CusumDirection direction)
{
    return direction == CusumDirection::Worse ? "worse" : "better";
}

MonitoringAnalysis analyseMonitoring(const Cohort& cohort, const DateColumn& dates, DateFormat format, PeriodUnit unit,
                                     double confidence, std::size_t minimumCell, const MonitoringSettings& settings)
{
    MonitoringAnalysis out;
    out.settings = settings;
    out.unit = unit;
    if (!scaleIsProbabilistic(cohort.scale)) {
        out.notes.push_back("Monitoring needs risks: the scores are points, so there is no expected count to compare with "
                            "what happened. Recalibrate the points to risks (or give the model's probabilities) to monitor it.");
        return out;
    }
    const DatedSequence all = datedSequence(cohort, dates, format);
    out.undated = all.undated;
    if (all.rows.empty()) {
        out.notes.push_back("No row has a usable date: nothing to monitor.");
        return out;
    }
    if (all.undated > 0)
        out.notes.push_back(std::to_string(all.undated) + " rows without a usable date are left out of the monitoring charts.");
    // Sites: each level's dated rows, in the overall order (a subsequence keeps it).
    std::vector<std::pair<std::string, DatedSequence>> sites;
    if (cohort.cluster) {
        out.siteColumn = cohort.cluster->name;
        std::vector<DatedSequence> bySite(cohort.cluster->levels.size());
        for (std::size_t k = 0; k < all.rows.size(); ++k) {
            DatedSequence& site = bySite[cohort.cluster->codes[all.rows[k]]];
            site.rows.push_back(all.rows[k]);
            site.days.push_back(all.days[k]);
        }
        for (std::size_t level = 0; level < bySite.size(); ++level) {
            if (bySite[level].rows.empty())
                continue;
            if (bySite[level].rows.size() < minimumCell) {
                out.notes.push_back("Site '" + cohort.cluster->levels[level] + "' has fewer than " + std::to_string(minimumCell)
                                    + " dated patients: it is monitored only within the whole cohort.");
                continue;
            }
            sites.emplace_back(cohort.cluster->levels[level], std::move(bySite[level]));
        }
    }
    std::vector<ScopeInput> inputs;
    for (std::size_t m = 0; m < cohort.models.size(); ++m) {
        inputs.push_back({m, {}, all});
        for (const auto& [name, sequence] : sites)
            inputs.push_back({m, name, sequence});
    }
    out.scopes.resize(inputs.size());
    onTwoThreads(inputs.size(), [&](std::size_t s) {
        const ScopeInput& input = inputs[s];
        MonitoringScope& scope = out.scopes[s];
        scope.model = cohort.models[input.model].name;
        scope.site = input.site;
        const auto& rows = input.sequence.rows;
        std::vector<double> p(rows.size());
        std::vector<std::uint8_t> y(rows.size());
        for (std::size_t k = 0; k < rows.size(); ++k) {
            p[k] = cohort.models[input.model].values[rows[k]];
            y[k] = cohort.outcome[rows[k]];
        }
        scope.patients = rows.size();
        scope.pathPatients = rows.size();
        scope.firstDate = isoDate(input.sequence.days.front());
        scope.lastDate = isoDate(input.sequence.days.back());
        // The volume over the span of days with data, both ends counted, and at least a month, so
        // that a cohort of a single day does not ask for an endless simulation.
        const double span = std::max(double(input.sequence.days.back() - input.sequence.days.front() + 1), daysPerYear / 12.0);
        scope.patientsPerYear = double(rows.size()) / (span / daysPerYear);
        PathThinner vlad(p.size(), settings.chartPoints);
        scope.finalExpectedMinusObserved = cumulativeExpectedMinusObserved(p, y, [&](double v) { vlad.add(v); });
        scope.expectedMinusObserved = vlad.points();
        const double target = settings.targetYears * scope.patientsPerYear;
        scope.charts.push_back(cusumChart(CusumDirection::Worse, settings.worseOdds, p, y, target, settings));
        scope.charts.push_back(cusumChart(CusumDirection::Better, settings.betterOdds, p, y, target, settings));
        for (auto& chart : scope.charts)
            for (auto& signal : chart.signalList) {
                const std::uint32_t row = rows[signal.patient - 1];
                signal.date = isoDate(input.sequence.days[signal.patient - 1]);
                if (cohort.cluster)
                    signal.site = cohort.cluster->levels[cohort.cluster->codes[row]];
            }
        fillCaseMix(scope, p, y, input.sequence.days, unit, confidence, settings.codingShiftRise);
    });
    for (const auto& scope : out.scopes)
        for (const auto& chart : scope.charts)
            if (chart.targetCapped) {
                out.notes.push_back("The in-control run length aimed at is capped at "
                                    + std::to_string(std::llround(chart.targetRunLength))
                                    + " patients where the volume would ask for more: a larger target would take too long to simulate.");
                return out;
            }
    return out;
}

} // namespace plumbline
