#include "analyses/capacity_spec.hpp"

#include <charconv>
#include <cmath>
#include <cstdio>
#include <optional>

namespace plumbline {

namespace {

std::string_view trimmed(std::string_view text)
{
    while (!text.empty() && (text.front() == ' ' || text.front() == '\t'))
        text.remove_prefix(1);
    while (!text.empty() && (text.back() == ' ' || text.back() == '\t'))
        text.remove_suffix(1);
    return text;
}

// A plain decimal number using the whole text (no sign other than '-', no spaces, no suffix).
std::optional<double> wholeNumber(std::string_view text)
{
    if (text.empty() || text.front() == '+')
        return std::nullopt;
    double value = 0.0;
    const auto [end, error] = std::from_chars(text.data(), text.data() + text.size(), value, std::chars_format::fixed);
    if (error != std::errc{} || end != text.data() + text.size() || !std::isfinite(value))
        return std::nullopt;
    return value;
}

InputError refusal(std::string_view text, std::string_view name, std::string problem, std::string remedy)
{
    InputError error;
    error.value = std::string(text);
    error.problem = std::string(name) + " " + std::move(problem);
    error.remedy = std::move(remedy);
    return error;
}

std::string numberText(double value)
{
    char buffer[32];
    std::snprintf(buffer, sizeof buffer, "%.10g", value);
    return buffer;
}

} // namespace

double CapacitySpec::unitDays() const
{
    switch (unit) {
    case Unit::Day: return 1.0;
    case Unit::Week: return 7.0;
    case Unit::Month: return 365.25 / 12.0;
    }
    return 7.0;
}

std::expected<CapacitySpec, InputError> parseCapacity(std::string_view raw, std::string_view name)
{
    const std::string_view text = trimmed(raw);
    const std::string examples = "give a share of the patients such as 10% or a number per day, week or month such as 40/week.";
    if (text.empty())
        return std::unexpected(refusal(raw, name, "is empty.", examples));
    CapacitySpec spec;
    std::string_view number;
    if (text.back() == '%') {
        spec.kind = CapacitySpec::Kind::Share;
        // Spaces before the sign are accepted, as they are before and after '/' ("10 %", "40 / week").
        number = trimmed(text.substr(0, text.size() - 1));
    } else if (const auto slash = text.find('/'); slash != std::string_view::npos) {
        spec.kind = CapacitySpec::Kind::Rate;
        number = trimmed(text.substr(0, slash));
        const std::string_view unit = trimmed(text.substr(slash + 1));
        if (unit == "day")
            spec.unit = CapacitySpec::Unit::Day;
        else if (unit == "week")
            spec.unit = CapacitySpec::Unit::Week;
        else if (unit == "month")
            spec.unit = CapacitySpec::Unit::Month;
        else
            return std::unexpected(refusal(raw, name, "counts patients per day, week or month; '" + std::string(unit) + "' is none of them.",
                                           "write e.g. 40/week, 8/day or 160/month."));
        if (number.empty())
            return std::unexpected(refusal(raw, name, "has no number before '/'.", "write how many patients, e.g. 40/week."));
    } else {
        return std::unexpected(refusal(raw, name, "must end in % (a share of the patients) or name a unit of time after '/'.", examples));
    }
    const auto value = wholeNumber(number);
    if (!value)
        return std::unexpected(refusal(raw, name, "needs a plain number before '" + std::string(spec.kind == CapacitySpec::Kind::Share ? "%" : "/") + "'; '" + std::string(number) + "' is not one (digits with at most one decimal point, no exponent).", examples));
    spec.amount = *value;
    if (spec.kind == CapacitySpec::Kind::Share && !(spec.amount > 0.0 && spec.amount <= 100.0))
        return std::unexpected(refusal(raw, name, "is a share of the patients and must lie above 0% and at most 100%.", "give e.g. 10%."));
    if (spec.kind == CapacitySpec::Kind::Rate && !(spec.amount > 0.0 && spec.amount <= maxCapacityRate))
        return std::unexpected(refusal(raw, name, "must be a number of patients above 0 and at most 1000000000.", "give e.g. 40/week."));
    return spec;
}

std::string capacityText(const CapacitySpec& spec)
{
    if (spec.kind == CapacitySpec::Kind::Share)
        return numberText(spec.amount) + "%";
    const char* unit = spec.unit == CapacitySpec::Unit::Day ? "day" : spec.unit == CapacitySpec::Unit::Week ? "week" : "month";
    return numberText(spec.amount) + "/" + unit;
}

} // namespace plumbline
