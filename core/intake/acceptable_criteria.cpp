#include "intake/acceptable_criteria.hpp"

#include "intake/field_values.hpp"

#include <cmath>
#include <cstdio>
#include <optional>
#include <vector>

namespace plumbline {

namespace {

constexpr const char* example = "e.g. c=0.70,oe=0.8:1.2,slope=0.8:1.2 (any of the three; a measure left out keeps its default).";

std::string trimmedItem(std::string_view text)
{
    const auto first = text.find_first_not_of(" \t"), last = text.find_last_not_of(" \t");
    return first == std::string_view::npos ? std::string() : std::string(text.substr(first, last - first + 1));
}

std::string numberText(double value)
{
    char buffer[32];
    std::snprintf(buffer, sizeof buffer, "%.15g", value);
    return buffer;
}

// "low:high" as two numbers.
std::optional<std::pair<double, double>> rangeOf(const std::string& text)
{
    const auto colon = text.find(':');
    if (colon == std::string::npos)
        return std::nullopt;
    const auto low = parseNumber(trimmedItem(std::string_view(text).substr(0, colon)), false);
    const auto high = parseNumber(trimmedItem(std::string_view(text).substr(colon + 1)), false);
    if (!low || !high)
        return std::nullopt;
    return std::pair{*low, *high};
}

InputError refusal(std::string value, std::string_view name, const std::string& problem)
{
    InputError error;
    error.value = std::move(value);
    error.problem = std::string(name) + " " + problem;
    error.remedy = example;
    return error;
}

} // namespace

std::string acceptableCriteriaProblem(const AcceptableCriteria& c)
{
    if (!(std::isfinite(c.cMinimum) && c.cMinimum > 0.0 && c.cMinimum < 1.0))
        return "takes c as a C statistic strictly between 0 and 1.";
    if (!(std::isfinite(c.oeLow) && std::isfinite(c.oeHigh) && c.oeLow > 0.0 && c.oeLow < c.oeHigh && c.oeHigh <= 100.0))
        return "takes oe as low:high with 0 < low < high ≤ 100.";
    if (!(std::isfinite(c.slopeLow) && std::isfinite(c.slopeHigh) && c.slopeLow < c.slopeHigh && c.slopeLow >= -100.0
          && c.slopeHigh <= 100.0))
        return "takes slope as low:high with −100 ≤ low < high ≤ 100.";
    return {};
}

std::expected<AcceptableCriteria, InputError> parseAcceptableCriteria(std::string_view text, std::string_view name)
{
    AcceptableCriteria out;
    std::vector<std::string> seen;
    std::size_t start = 0;
    if (trimmedItem(text).empty())
        return std::unexpected(refusal("", name, "names no criterion."));
    while (start <= text.size()) {
        const std::size_t end = std::min(text.find(',', start), text.size());
        const std::string item = trimmedItem(text.substr(start, end - start));
        start = end + 1;
        if (item.empty())
            return std::unexpected(refusal(std::string(text), name, "has an empty item between commas."));
        const auto equals = item.find('=');
        const std::string key = trimmedItem(std::string_view(item).substr(0, std::min(equals, item.size())));
        const std::string value = equals == std::string::npos ? std::string() : trimmedItem(std::string_view(item).substr(equals + 1));
        if (key != "c" && key != "oe" && key != "slope")
            return std::unexpected(refusal(item, name, "knows the measures c, oe and slope only, each as measure=value."));
        for (const auto& k : seen)
            if (k == key)
                return std::unexpected(refusal(item, name, "names " + key + " twice."));
        seen.push_back(key);
        if (key == "c") {
            const auto c = parseNumber(value, false);
            if (!c)
                return std::unexpected(refusal(item, name, "takes c as one number, the lowest acceptable C statistic."));
            out.cMinimum = *c;
        } else {
            const auto range = rangeOf(value);
            if (!range)
                return std::unexpected(refusal(item, name, "takes " + key + " as low:high, two numbers with a colon between."));
            (key == "oe" ? out.oeLow : out.slopeLow) = range->first;
            (key == "oe" ? out.oeHigh : out.slopeHigh) = range->second;
        }
        if (const std::string problem = acceptableCriteriaProblem(out); !problem.empty())
            return std::unexpected(refusal(item, name, problem));
    }
    return out;
}

std::string acceptableCriteriaText(const AcceptableCriteria& c)
{
    return "c=" + numberText(c.cMinimum) + ",oe=" + numberText(c.oeLow) + ":" + numberText(c.oeHigh) + ",slope="
        + numberText(c.slopeLow) + ":" + numberText(c.slopeHigh);
}

} // namespace plumbline
