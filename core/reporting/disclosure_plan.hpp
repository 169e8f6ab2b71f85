#pragma once

#include "intake/cohort.hpp"
#include "analyses/validation.hpp"

#include <array>
#include <string>
#include <cstddef>
#include <vector>

namespace plumbline {

// How one printed count is shown: as itself, as "<minimum" (primary: it is small), or as
// "suppressed" (complementary: it would let a reader work out a small one).
struct CountShown {
    std::size_t value = 0;
    bool suppressed = false;
    bool primary = false;
};

// Which counts of a report are suppressed and which derived numbers (rates, intervals, ratios,
// tests, net benefits) are withheld because they would reveal one. Laid out like the
// ValidationResult it was planned from. The cohort's patients and events, rows excluded for a
// data-quality reason and undated rows are published as they are (stated in the report).
struct DisclosurePlan {
    std::size_t minimumCell = 11;
    std::size_t events = 0, nonEvents = 0;                            // the cohort's, for reading the ROC curve as counts
    std::vector<std::vector<std::array<CountShown, 2>>> riskGroups;   // [model][group]: patients, events
    std::vector<std::vector<std::array<CountShown, 4>>> thresholds;   // [model][threshold]: TP, FP, TN, FN
    std::vector<std::vector<bool>> decisionCurveWithheld;             // [model][point]
    std::vector<bool> decisionThresholdWithheld;                      // [model]: net benefit at the care team's threshold
    std::vector<std::vector<std::vector<CountShown>>> reclassEvents;  // [comparison][A category][B category]
    std::vector<std::vector<std::vector<CountShown>>> reclassNonEvents;
    // [comparison]: the NRI's events and non-events parts at the cut-points, then the category-free NRI's
    std::vector<std::array<bool, 4>> nriWithheld;
    std::vector<std::array<CountShown, 2>> subgroups;                 // [subgroup result]: patients, events
    std::vector<std::array<CountShown, 2>> periods;                   // [period result]: patients, events
    bool firstYearEventsWithheld = false;                             // the first year's O/E interval would show its events
    bool latestYearEventsWithheld = false;                            // so would the latest months' (monthly periods)
    std::size_t suppressedCells = 0;                                  // printed counts suppressed, primary and complementary
    std::size_t unprotectable = 0;

    bool riskGroupWithheld(std::size_t model, std::size_t group) const;
    bool thresholdWithheld(std::size_t model, std::size_t threshold) const;
    bool subgroupWithheld(std::size_t result) const;
    bool periodWithheld(std::size_t result) const;
};

// Plans the report's suppression from the cohort analysed and its result (see
// SmallCellProtection). `decisionThreshold` is the care team's threshold shown on page 1.
DisclosurePlan planDisclosure(const Cohort& cohort, const ValidationResult& result, double decisionThreshold,
                              std::size_t minimumCell);

// The result as a report may show it: what the plan withholds removed or emptied (risk groups,
// decision-curve points and funnel points left out; estimates of suppressed subgroup levels and
// periods, the NRI parts, net-benefit differences and the Hosmer-Lemeshow test emptied), so that
// charts and findings drawn from it cannot reveal a suppressed count.
ValidationResult redactedForReport(const ValidationResult& result, const DisclosurePlan& plan);

// The rule in words, for the report.
std::string disclosureRuleText(const DisclosurePlan& plan);

} // namespace plumbline
