#pragma once

#include "intake/input_error.hpp"

#include <expected>
#include <string>
#include <string_view>

namespace plumbline {

// What a care team can act on, as typed: a share of the patients ("10%") or a number per unit of
// time ("40/week", also /day and /month). A rate needs the cohort's dates (--period) to become a
// number of patients; docs/methods.md ("Operating by capacity") states how.
struct CapacitySpec {
    enum class Kind { Share, Rate };
    enum class Unit { Day, Week, Month };
    Kind kind = Kind::Share;
    double amount = 10.0; // percent of patients for a share; patients per unit for a rate
    Unit unit = Unit::Week;

    // The length of the unit in days: a month is 365.25 / 12 = 30.4375 days, so that twelve
    // months make an average year whatever the months are.
    double unitDays() const;
    bool operator==(const CapacitySpec&) const = default;
};

// The largest rate accepted, so that no typed number can overflow a count.
inline constexpr double maxCapacityRate = 1e9;

// "10%", "2.5%", "40/week", "5/day", "120/month" (a plain decimal number, no exponent; spaces
// around the text and before '%' or around '/' ignored). A share must lie in (0, 100], a rate in (0, 1e9]. `name` is how the user gave it
// ("--capacity"), for the message.
std::expected<CapacitySpec, InputError> parseCapacity(std::string_view text, std::string_view name);

// The text parseCapacity reads back to the same spec ("10%", "40/week"): the analysis file's value.
std::string capacityText(const CapacitySpec& spec);

} // namespace plumbline
