#include "intake/outcome_coding.hpp"

#include "intake/field_values.hpp"

#include <array>
#include <utility>

namespace plumbline {

namespace {

// Recognised (non-event, event) spellings, compared lower-cased.
constexpr std::array<std::pair<const char*, const char*>, 4> knownPairs{{
    {"0", "1"}, {"no", "yes"}, {"n", "y"}, {"false", "true"},
}};

std::string listLevels(const std::vector<OutcomeLevel>& levels)
{
    constexpr std::size_t maxListed = 12;
    std::string out;
    for (std::size_t i = 0; i < levels.size() && i < maxListed; ++i) {
        if (i > 0)
            out += ", ";
        out += "'" + levels[i].text + "' (" + std::to_string(levels[i].count) + " rows, first on line "
            + std::to_string(levels[i].firstLine) + ")";
    }
    if (levels.size() > maxListed)
        out += ", and " + std::to_string(levels.size() - maxListed) + " more";
    return out;
}

} // namespace

std::expected<OutcomeCoding, InputError> codeOutcome(const std::vector<OutcomeLevel>& levels,
                                                     const std::optional<std::string>& eventValue,
                                                     const std::string& file, const std::string& column)
{
    InputError error;
    error.file = file;
    error.column = column;
    if (levels.empty()) {
        error.kind = ErrorKind::ImpossibleAnalysis;
        error.problem = "the outcome column holds no values at all (every row is missing).";
        error.remedy = "check that the outcome column chosen (--outcome) is the one with the observed outcome.";
        return std::unexpected(error);
    }
    if (levels.size() > 2) {
        error.problem = "the outcome must have two values (event and non-event) but this column has "
            + std::to_string(levels.size()) + ": " + listLevels(levels) + ".";
        error.remedy = "correct the stray values in the file, or mark unknown outcomes as NA so they are excluded and counted.";
        return std::unexpected(error);
    }
    if (levels.size() == 1) {
        error.kind = ErrorKind::ImpossibleAnalysis;
        error.value = levels[0].text;
        error.line = levels[0].firstLine;
        error.problem = "every outcome is '" + levels[0].text + "' (" + std::to_string(levels[0].count)
            + " rows): a validation needs both patients with and without the event.";
        error.remedy = "check the outcome column and the follow-up window; a cohort with one outcome class cannot be validated.";
        return std::unexpected(error);
    }
    if (eventValue) {
        const std::string wanted = lowerAscii(trimmed(*eventValue));
        for (std::size_t i = 0; i < 2; ++i)
            if (levels[i].folded == wanted)
                return OutcomeCoding{i, 1 - i};
        error.value = *eventValue;
        error.problem = "the --event value does not occur in the outcome column, whose values are " + listLevels(levels) + ".";
        error.remedy = "give one of those values as the event value (Event value in the window, --event on the command line).";
        return std::unexpected(error);
    }
    for (const auto& [nonEvent, event] : knownPairs) {
        if (levels[0].folded == nonEvent && levels[1].folded == event)
            return OutcomeCoding{1, 0};
        if (levels[0].folded == event && levels[1].folded == nonEvent)
            return OutcomeCoding{0, 1};
    }
    error.problem = "the outcome values " + listLevels(levels) + " are not a recognised pair (0/1, yes/no, y/n, true/false).";
    error.remedy = "say which value means the event (Event value in the window, --event VALUE on the command line).";
    return std::unexpected(error);
}

} // namespace plumbline
