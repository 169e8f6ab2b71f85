#pragma once

#include "intake/input_error.hpp"

#include <expected>
#include <string>
#include <string_view>

namespace plumbline {

// What a network calls acceptable performance in a new site, on the three pooled measures:
// C ≥ cMinimum, oeLow ≤ O/E ≤ oeHigh and slopeLow ≤ calibration slope ≤ slopeHigh. The defaults
// are the criteria the issue names as an example, not a standard (common practice).
struct AcceptableCriteria {
    double cMinimum = 0.70;
    double oeLow = 0.8, oeHigh = 1.2;
    double slopeLow = 0.8, slopeHigh = 1.2;

    bool operator==(const AcceptableCriteria&) const = default;
};

// The criteria as typed: "c=0.70,oe=0.8:1.2,slope=0.8:1.2", any of the three, in any order;
// a measure not named keeps its default. `name` names the setting in messages ("--acceptable").
std::expected<AcceptableCriteria, InputError> parseAcceptableCriteria(std::string_view text, std::string_view name);

// The same criteria as that text (shortest exact numbers), so a saved analysis re-reads them.
std::string acceptableCriteriaText(const AcceptableCriteria& criteria);

// Empty when the criteria can be used; otherwise what is wrong, in words that follow the
// setting's name ("… takes c between 0 and 1").
std::string acceptableCriteriaProblem(const AcceptableCriteria& criteria);

} // namespace plumbline
