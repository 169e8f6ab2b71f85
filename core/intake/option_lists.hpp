#pragma once

#include "intake/input_error.hpp"

#include <expected>
#include <string>
#include <string_view>
#include <vector>

namespace plumbline {

// Lists of risks typed by a person ("0.1, 0.2, 0.3") as the command line and the window's
// settings read them, with the same messages. `name` names the setting in the message
// ("--thresholds" on the command line, "Thresholds" in the window).

// Every item a risk strictly between 0 and 1; an empty text is an empty list.
std::expected<std::vector<double>, InputError> parseRiskList(std::string_view text, std::string_view name);

// The decision curve's thresholds: "from, to, step" with 0 < from < to < 1 and step > 0.
struct DecisionRange {
    double from = 0.0, to = 0.0, step = 0.0;
};
std::expected<DecisionRange, InputError> parseDecisionRange(std::string_view text, std::string_view name);

// The two CUSUMs' odds ratios as typed ("2,0.5"): two positive numbers; their bounds (worse
// above 1, better below) are the settings check's.
struct OddsRatioPair {
    double worse = 0.0, better = 0.0;
};
std::expected<OddsRatioPair, InputError> parseOddsRatioPair(std::string_view text, std::string_view name);

// A list as it is typed: "0.1, 0.2, 0.3" (shortest exact form of each number).
std::string riskListText(const std::vector<double>& values, std::string_view separator = ", ");

} // namespace plumbline
