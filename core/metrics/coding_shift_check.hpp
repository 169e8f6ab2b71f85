#pragma once

#include <cstddef>
#include <cstdint>
#include <optional>
#include <string>
#include <vector>

namespace plumbline {

// Mean predicted risk and observed rate of one stretch of patients, with intervals: the mean's
// is normal (mean ± z·sd/√n), the rate's Wilson.
struct RiskAndRate {
    std::size_t n = 0, events = 0;
    double meanPredicted = 0.0, meanLower = 0.0, meanUpper = 0.0;
    double observedRate = 0.0, rateLower = 0.0, rateUpper = 0.0;
};

RiskAndRate riskAndRate(const std::vector<double>& risks, const std::vector<std::uint8_t>& outcomes, double confidence);

// Predicted risk rose while the observed rate did not, between a first and a latest year. It
// holds when all three do:
//  (a) the latest mean predicted risk is at least (1 + rise) times the first year's;
//  (b) the two means' intervals do not overlap (latest lower end above the first's upper end);
//  (c) the observed rate did not rise significantly: the latest rate's interval does not lie
//      wholly above the first year's (its lower end is at or below the first's upper end).
// Sicker patients raise both; coding or documentation that grows more intensive raises only the
// scores. The result is a question to investigate, never a finding.
struct CodingShiftCheck {
    RiskAndRate firstYear, latestYear;
    double predictedRatio = 0.0;   // latest mean predicted / first
    bool predictedRose = false;    // (a) and (b)
    bool observedRose = false;     // not (c)
    bool flagged = false;
};

CodingShiftCheck checkCodingShift(const RiskAndRate& firstYear, const RiskAndRate& latestYear, double rise);

} // namespace plumbline
