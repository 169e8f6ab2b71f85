#pragma once

#include "intake/input_error.hpp"

#include <cstddef>
#include <expected>
#include <optional>
#include <string>
#include <vector>

namespace plumbline {

// One distinct non-missing value of the outcome column, as first seen, with how often it occurs.
struct OutcomeLevel {
    std::string text;         // trimmed, as written in the file (first spelling seen)
    std::string folded;       // lower-cased, the identity used for comparison
    std::size_t count = 0;
    std::size_t firstLine = 0;
};

// Which level means "event".
struct OutcomeCoding {
    std::size_t eventLevel = 0;
    std::size_t nonEventLevel = 1;
};

// Decides the event level: a recognised pair (0/1, yes/no, y/n, true/false, any case), or the
// user's --event value. Refuses more than two levels (listing them), a single level, an unknown
// pair without --event, and an --event value that does not occur.
std::expected<OutcomeCoding, InputError> codeOutcome(const std::vector<OutcomeLevel>& levels,
                                                     const std::optional<std::string>& eventValue,
                                                     const std::string& file, const std::string& column);

} // namespace plumbline
