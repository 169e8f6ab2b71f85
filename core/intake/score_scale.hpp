#pragma once

#include <optional>
#include <span>
#include <string>
#include <string_view>

namespace plumbline {

// How the supplier expresses a model's output.
enum class ScoreScale {
    Probability, // risk in [0, 1]
    Percent,     // risk in [0, 100]
    Logit,       // log-odds, any finite value
    Points,      // ordinal or points score: discrimination only, no calibration
};

std::string_view scaleName(ScoreScale scale);
std::optional<ScoreScale> scaleFromName(std::string_view name);

// True when the scale yields probabilities that calibration can be judged on.
bool scaleIsProbabilistic(ScoreScale scale);

// Converts a finite raw value to the cohort's stored value (a probability, or the points as given);
// nullopt when the value lies outside the scale's range.
std::optional<double> convertScore(double raw, ScoreScale scale);

// Inspects raw values that failed the probability scale and names the scale that fits them best,
// with a one-line reason ("values run from 0 to 87 ...").
struct ScaleSuggestion {
    ScoreScale scale;
    std::string reason;
};
ScaleSuggestion suggestScale(std::span<const double> finiteValues);

} // namespace plumbline
