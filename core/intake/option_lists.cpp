#include "intake/option_lists.hpp"

#include "intake/field_values.hpp"

#include <cstdio>

namespace plumbline {

namespace {

std::vector<std::string> items(std::string_view text)
{
    std::vector<std::string> out;
    std::size_t start = 0;
    while (start <= text.size()) {
        const std::size_t end = std::min(text.find(',', start), text.size());
        std::string item(text.substr(start, end - start));
        const auto first = item.find_first_not_of(" \t"), last = item.find_last_not_of(" \t");
        item = first == std::string::npos ? std::string() : item.substr(first, last - first + 1);
        if (!item.empty() || end < text.size())
            out.push_back(item);
        start = end + 1;
    }
    return out;
}

} // namespace

std::expected<std::vector<double>, InputError> parseRiskList(std::string_view text, std::string_view name)
{
    std::vector<double> out;
    for (const std::string& item : items(text)) {
        const auto value = parseNumber(item, false);
        if (!value || !(*value > 0.0 && *value < 1.0)) {
            InputError error;
            error.value = item;
            error.problem = "each " + std::string(name) + " value must be a risk strictly between 0 and 1.";
            error.remedy = "give them as probabilities separated by commas, e.g. 0.1,0.2,0.3.";
            return std::unexpected(error);
        }
        out.push_back(*value);
    }
    return out;
}

std::expected<DecisionRange, InputError> parseDecisionRange(std::string_view text, std::string_view name)
{
    std::vector<double> range;
    bool numbers = true;
    for (const std::string& item : items(text)) {
        const auto value = parseNumber(item, false);
        numbers = numbers && value.has_value();
        if (value)
            range.push_back(*value);
    }
    if (!numbers || range.size() != 3 || !(range[0] > 0.0 && range[0] < range[1] && range[1] < 1.0 && range[2] > 0.0)) {
        InputError error;
        error.value = std::string(text);
        error.problem = std::string(name) + " takes three numbers: the first and last threshold (between 0 and 1) and the step.";
        error.remedy = "e.g. 0.05,0.50,0.01.";
        return std::unexpected(error);
    }
    return DecisionRange{range[0], range[1], range[2]};
}

std::expected<OddsRatioPair, InputError> parseOddsRatioPair(std::string_view text, std::string_view name)
{
    std::vector<double> odds;
    for (const std::string& item : items(text)) {
        const auto value = parseNumber(item, false);
        if (!value || !(*value > 0.0)) {
            odds.clear();
            break;
        }
        odds.push_back(*value);
    }
    if (odds.size() != 2) {
        InputError error;
        error.value = std::string(text);
        error.problem = std::string(name) + " takes two odds ratios above 0: the worse chart's (above 1) and the better chart's (below 1).";
        error.remedy = "e.g. 2,0.5.";
        return std::unexpected(error);
    }
    return OddsRatioPair{odds[0], odds[1]};
}

std::string riskListText(const std::vector<double>& values, std::string_view separator)
{
    std::string out;
    for (double v : values) {
        char buffer[32];
        std::snprintf(buffer, sizeof buffer, "%.15g", v);
        out += (out.empty() ? "" : std::string(separator)) + buffer;
    }
    return out;
}

} // namespace plumbline
