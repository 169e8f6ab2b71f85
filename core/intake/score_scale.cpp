#include "intake/score_scale.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <unordered_set>

namespace plumbline {

std::string_view scaleName(ScoreScale scale)
{
    switch (scale) {
    case ScoreScale::Probability: return "probability";
    case ScoreScale::Percent: return "percent";
    case ScoreScale::Logit: return "logit";
    case ScoreScale::Points: return "points";
    }
    return "probability";
}

std::optional<ScoreScale> scaleFromName(std::string_view name)
{
    for (ScoreScale s : {ScoreScale::Probability, ScoreScale::Percent, ScoreScale::Logit, ScoreScale::Points})
        if (scaleName(s) == name)
            return s;
    return std::nullopt;
}

bool scaleIsProbabilistic(ScoreScale scale)
{
    return scale != ScoreScale::Points;
}

std::optional<double> convertScore(double raw, ScoreScale scale)
{
    switch (scale) {
    case ScoreScale::Probability:
        if (raw < 0.0 || raw > 1.0)
            return std::nullopt;
        return raw;
    case ScoreScale::Percent:
        if (raw < 0.0 || raw > 100.0)
            return std::nullopt;
        return raw / 100.0;
    case ScoreScale::Logit:
        return 1.0 / (1.0 + std::exp(-raw));
    case ScoreScale::Points:
        return raw;
    }
    return std::nullopt;
}

namespace {
std::string formatShort(double value)
{
    char buffer[32];
    std::snprintf(buffer, sizeof buffer, "%.6g", value);
    return buffer;
}
} // namespace

ScaleSuggestion suggestScale(std::span<const double> finiteValues)
{
    if (finiteValues.empty())
        return {ScoreScale::Probability, "no numeric values were found."};
    const auto [minIt, maxIt] = std::minmax_element(finiteValues.begin(), finiteValues.end());
    const double lo = *minIt;
    const double hi = *maxIt;
    const bool allIntegers = std::all_of(finiteValues.begin(), finiteValues.end(),
                                         [](double v) { return v == std::floor(v); });
    std::unordered_set<double> distinct;
    for (double v : finiteValues) {
        distinct.insert(v);
        if (distinct.size() > 200)
            break;
    }
    const std::string range = "values run from " + formatShort(lo) + " to " + formatShort(hi);
    // Small whole numbers are a points score (e.g. 0-19); whole numbers up to 100 read as percent.
    if (allIntegers && distinct.size() <= 30 && hi <= 40.0)
        return {ScoreScale::Points,
                range + " in " + std::to_string(distinct.size()) + " whole-number steps, like a points score"};
    if (lo >= 0.0 && hi <= 100.0)
        return {ScoreScale::Percent, range + ", like a risk in percent (or, if whole numbers only, a points score)"};
    if (lo < 0.0 && hi - lo <= 40.0)
        return {ScoreScale::Logit, range + " with negative values, like log-odds"};
    return {ScoreScale::Points, range + ", which no risk scale explains; treat it as a points score"};
}

} // namespace plumbline
