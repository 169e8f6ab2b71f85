#pragma once

#include "intake/cohort.hpp"
#include "metrics/estimate.hpp"
#include "analyses/validation.hpp"

#include <optional>
#include <string>
#include <vector>

namespace plumbline {

// What a committee needs on one page, per model side by side: discrimination, calibration and
// accuracy with their intervals, the mean predicted risk beside the event rate, and what acting
// at the care team's threshold would gain against flagging everyone.
struct DecisionSummaryModel {
    std::string name;
    Estimate c, oe, calibrationInTheLarge, calibrationSlope, scaledBrier;
    double meanRisk = 0.0;                 // mean predicted risk (probability scales only)
    bool risks = true;                     // false for a points score: no calibration, no net benefit
    std::optional<double> netBenefit;      // at the decision threshold, risk >= t flagged
    std::optional<double> netBenefitTreatAll;
    double flagged = 0.0;                  // share of patients flagged at the decision threshold
    bool netBenefitWithheld = false;       // a count behind it is suppressed in the report
};

// A finding in plain words and the report section that shows it.
struct DecisionFinding {
    std::string text;
    std::string section;
};

struct DecisionSummary {
    std::size_t patients = 0, events = 0;
    double eventRate = 0.0;
    double decisionThreshold = 0.2;
    std::vector<DecisionSummaryModel> models;
    std::vector<DecisionFinding> findings;
};

// The findings are judged on the reported intervals, as the readings are: a difference is a
// finding only when its interval excludes no difference. `sections` name where each kind of
// result is shown (results, subgroups, comparisons), so each finding can point to it. Where
// `netBenefitWithheld[m]`, model m's net benefit (and share flagged) at the threshold is left out
// and the findings say so: a report's small-cell rule withholds it.
struct DecisionSections {
    std::string results = "Results";
    std::string subgroups = "Subgroups";
    std::string comparisons = "Comparisons";
};
DecisionSummary summariseForDecision(const Cohort& cohort, const ValidationResult& result, double decisionThreshold,
                                     const DecisionSections& sections = {}, const std::vector<bool>& netBenefitWithheld = {});

} // namespace plumbline
