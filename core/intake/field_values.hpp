#pragma once

#include <optional>
#include <string>
#include <string_view>

namespace plumbline {

// Leading and trailing spaces and tabs removed.
std::string_view trimmed(std::string_view text);

// ASCII lower-case copy (outcome labels and missing tokens are compared case-insensitively).
std::string lowerAscii(std::string_view text);

// True for the tokens that mean "no value": empty, NA, N/A, NULL, ".", NaN (any case, trimmed).
bool isMissingToken(std::string_view field);

// Parses a decimal number ("0.25", "-1.5e-3", "+2"); with decimalComma "0,25" reads as 0.25 and
// a point is refused. Infinity and NaN spellings parse (to be refused later as non-finite).
// nullopt when the text is not a number at all.
std::optional<double> parseNumber(std::string_view field, bool decimalComma);

} // namespace plumbline
