#pragma once

#include "intake/cohort.hpp"
#include "metrics/chart_path.hpp"
#include "metrics/coding_shift_check.hpp"
#include "resampling/cusum_control_limit.hpp"
#include "analyses/monitoring_settings.hpp"
#include "analyses/period_analysis.hpp"

#include <cstddef>
#include <cstdint>
#include <optional>
#include <string>
#include <vector>

namespace plumbline {

// Watching a live model over time, per model, overall and per site: the cumulative
// expected-minus-observed chart, two risk-adjusted Bernoulli CUSUMs (worse, better) with control
// limits chosen by simulation, and per period the case mix (mean predicted risk beside the
// observed rate) and the scores' population stability index against the first year.
enum class CusumDirection { Worse, Better };

struct CusumSignal {
    std::size_t patient = 0;           // position in the scope's sequence, 1-based
    std::string date;                  // YYYY-MM-DD
    std::string site;                  // the signalling patient's site; empty without a site column
    CusumDirection chart = CusumDirection::Worse;
    std::size_t patientsSinceReset = 0; // the signalling patient included
};

struct CusumChart {
    CusumDirection direction = CusumDirection::Worse;
    double oddsRatio = 2.0;
    double targetRunLength = 0.0;      // patients: target years × patients per year (capped, see targetCapped)
    bool targetCapped = false;
    std::uint64_t seed = 0;
    ControlLimit limit;
    std::vector<PathPoint> path;       // thinned S_t
    std::vector<CusumSignal> signalList; // not "signals": a Qt keyword in the window
};

struct CaseMixRow {
    std::string period;
    bool firstYear = false;
    RiskAndRate values;
    double psi = 0.0;                  // against the scope's first year
};

struct MonitoringScope {
    std::string model;
    std::string site;                  // empty: the whole cohort
    std::size_t patients = 0;          // dated rows in the sequence
    std::string firstDate, lastDate;
    double patientsPerYear = 0.0;
    std::size_t pathPatients = 0;      // patients on the charts (= patients)
    std::vector<PathPoint> expectedMinusObserved; // thinned Σ(p − y)
    double finalExpectedMinusObserved = 0.0;
    std::vector<CusumChart> charts;    // worse, then better
    std::vector<CaseMixRow> periods;   // in time order
    std::vector<std::string> firstYearPeriods, latestYearPeriods;
    std::optional<double> latestYearPsi;
    std::optional<CodingShiftCheck> codingShift; // when there is a latest year after the first
    std::string question;              // the coding-shift question when flagged, else empty
};

struct MonitoringAnalysis {
    MonitoringSettings settings;
    PeriodUnit unit = PeriodUnit::Month;
    std::string siteColumn;            // empty without --cluster
    std::size_t undated = 0;           // rows without a usable date, left out
    std::vector<MonitoringScope> scopes; // per model: overall, then each site in level order
    std::vector<std::string> notes;
};

// Most simulated patients per control limit: the runs are reduced (to no fewer than 50) and then
// the target capped so that one limit costs at most this many simulated patients.
constexpr double monitoringSimulationBudget = 1.5e7;
constexpr std::size_t monitoringMinimumRuns = 50;

// `format`: how the dates are written (Iso when none was named). Sites with fewer dated rows
// than `minimumCell` get no scope of their own (a note says so).
MonitoringAnalysis analyseMonitoring(const Cohort& cohort, const DateColumn& dates, DateFormat format, PeriodUnit unit,
                                     double confidence, std::size_t minimumCell, const MonitoringSettings& settings);

const char* cusumDirectionKey(CusumDirection direction); // "worse" / "better"

} // namespace plumbline
