#pragma once

#include "intake/cohort.hpp"
#include "metrics/capacity_threshold.hpp"
#include "metrics/estimate.hpp"
#include "metrics/score_order.hpp"
#include "metrics/threshold_metrics.hpp"
#include "analyses/capacity_spec.hpp"
#include "analyses/period_analysis.hpp"

#include <optional>
#include <string>
#include <vector>

namespace plumbline {

// One model at the threshold that flags a capacity's patients, over the cohort or one period
// (docs/methods.md, "Operating by capacity"): the classification there, with Wilson (or
// Clopper–Pearson, as the panel's binomial interval) intervals for sensitivity, specificity and
// PPV, and net benefit NB = TP/N − FP/N · t/(1−t) (Vickers & Elkin 2006, Med Decis Making 26:565).
struct CapacityResult {
    std::string model;
    std::string period;             // empty for the whole cohort
    std::size_t patients = 0, events = 0;
    double capacity = 0.0;          // patients the capacity allows here, before rounding down
    CapacityThreshold at;           // at.requested = ⌊capacity⌋
    std::size_t tp = 0, fp = 0, tn = 0, fn = 0;
    ProportionWithCi sensitivity, specificity, ppv;
    std::optional<double> netBenefit;          // probabilities only, at the capacity threshold
    std::optional<double> eventsPer100Flagged; // 100 · TP / flagged
    // Periods only: patients of this period the whole cohort's threshold flags, and whether that
    // is more than this period's capacity by more than overCapacityMargin (a busy month
    // overflowing a fixed threshold, not one patient over).
    std::optional<std::size_t> flaggedByOverallThreshold;
    bool overallThresholdOverflows = false;
};

// A period is "over capacity" when the whole cohort's threshold flags more than its capacity by
// more than this share: 10 %, common practice for a tolerance on a workload (not from a source).
inline constexpr double overCapacityMargin = 0.10;
bool overflowsCapacity(std::size_t flagged, std::size_t requested);

struct CapacityAnalysis {
    CapacitySpec spec;
    std::string text;                          // the capacity as typed back ("40/week")
    // A rate's dates: the first and last date of the cohort's dated rows and the span they make
    // in days (last − first + 1); the number of patients is rate × span / unit length.
    std::optional<std::string> firstDate, lastDate;
    std::optional<double> spanDays;
    std::size_t undated = 0;                   // rows without a usable date (in no period)
    PeriodUnit periodUnit = PeriodUnit::Month;
    std::vector<CapacityResult> overall;       // one per model
    std::vector<CapacityResult> periods;       // by model, then period in time order
    std::string definition;                    // how the number of patients was reached, in words
    std::vector<std::string> warnings;
};

// The first and last date of the cohort's dated rows (ISO text) and the span they make in days
// (last − first + 1); nullopt without a period column or when no date reads.
struct DateSpan {
    std::string first, last;
    double days = 0.0;
    std::size_t undated = 0;
};
std::optional<DateSpan> cohortDateSpan(const Cohort& cohort, std::optional<DateFormat> dateFormat);

// The capacity for every model over the cohort and, when it has dates, each period. `orders`
// are the models' ascendingOrder over the cohort. An InputError when a rate is asked for and the
// cohort has no readable dates.
std::expected<CapacityAnalysis, InputError> analyseCapacity(const Cohort& cohort, const CapacitySpec& spec,
                                                            const std::vector<ScoreOrder>& orders, double confidence,
                                                            CiMethod binomialMethod, std::optional<DateFormat> dateFormat,
                                                            PeriodUnit unit);

} // namespace plumbline
