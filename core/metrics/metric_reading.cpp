#include "metrics/metric_reading.hpp"

#include <array>
#include <cmath>
#include <cstdio>
#include <utility>

namespace plumbline {

namespace {

enum class Side { Below, Inside, Above, Unknown };

// Where the interval lies relative to the value of no miscalibration (or of chance).
Side sideOf(const Estimate& e, double reference)
{
    if (!e.lower || !e.upper)
        return Side::Unknown;
    if (*e.upper < reference)
        return Side::Below;
    if (*e.lower > reference)
        return Side::Above;
    return Side::Inside;
}

std::string percentPoints(double value)
{
    char buffer[48];
    std::snprintf(buffer, sizeof buffer, "%.1f percentage points", 100.0 * value);
    return buffer;
}

// Verbal labels of discrimination (Hosmer & Lemeshow, Applied Logistic Regression, from memory,
// for 0.7 and above; "poor" and "modest" below 0.7 are this project's words).
std::string discriminationBand(double c)
{
    if (c < 0.6)
        return "poor";
    if (c < 0.7)
        return "modest";
    if (c < 0.8)
        return "acceptable";
    if (c < 0.9)
        return "excellent";
    return "outstanding";
}

// Judged on the interval, like the other readings: when its ends fall in different bands, the
// reading names both ("acceptable to excellent").
std::string readC(const Estimate& e)
{
    const double c = *e.value;
    if (sideOf(e, 0.5) == Side::Inside)
        return "not clearly better than chance (the interval includes 0.5)";
    if (c < 0.5)
        return "ranks patients in the wrong order more often than not";
    std::string band = discriminationBand(c);
    if (e.lower && e.upper && discriminationBand(*e.lower) != discriminationBand(*e.upper))
        band = discriminationBand(std::max(0.5, *e.lower)) + " to " + discriminationBand(*e.upper);
    std::string out = band + " discrimination";
    if (c >= 0.9)
        out += "; check for information from after the time of prediction";
    return out;
}

std::string readIntercept(const Estimate& e)
{
    switch (sideOf(e, 0.0)) {
    case Side::Below: return "over-predicts on average (fewer events than the risks imply)";
    case Side::Above: return "under-predicts on average (more events than the risks imply)";
    case Side::Inside: return "average risk consistent with the observed rate";
    case Side::Unknown: return *e.value < 0 ? "risks on average above the observed rate" : "risks on average below the observed rate";
    }
    return {};
}

// How far from 1: below 0.8 or above 1.25 "clearly", otherwise "slightly" (common practice).
std::string readSlope(const Estimate& e)
{
    const double slope = *e.value;
    const std::string how = slope < 0.8 || slope > 1.25 ? "clearly" : "slightly";
    switch (sideOf(e, 1.0)) {
    case Side::Below: return "predictions " + how + " too extreme (high risks too high, low risks too low)";
    case Side::Above: return "predictions " + how + " too moderate (risks not spread out enough)";
    case Side::Inside: return "spread of risks consistent with the outcomes";
    case Side::Unknown: return *e.value < 1 ? "predictions look too extreme" : "predictions look too moderate";
    }
    return {};
}

std::string readOe(const Estimate& e)
{
    switch (sideOf(e, 1.0)) {
    case Side::Below: return "fewer events observed than expected: the model over-predicts";
    case Side::Above: return "more events observed than expected: the model under-predicts";
    case Side::Inside: return "observed events consistent with expected";
    case Side::Unknown: return "observed / expected events";
    }
    return {};
}

} // namespace

std::string differenceLabel(std::string_view key)
{
    static const std::array<std::pair<std::string_view, std::string_view>, 11> labels{{
        {"c_statistic_difference", "C statistic"},
        {"brier_difference", "Brier score"},
        {"calibration_slope_difference", "Calibration slope"},
        {"ici_difference", "ICI"},
        {"nri_events", "NRI, events part"},
        {"nri_non_events", "NRI, non-events part"},
        {"nri", "NRI at the cut-points"},
        {"nri_continuous_events", "Category-free NRI, events"},
        {"nri_continuous_non_events", "Category-free NRI, non-events"},
        {"nri_continuous", "Category-free NRI"},
        {"idi", "IDI"},
    }};
    for (const auto& [k, label] : labels)
        if (k == key)
            return std::string(label);
    return std::string(key);
}

std::string metricLabel(std::string_view key)
{
    static const std::array<std::pair<std::string_view, std::string_view>, 15> labels{{
        {"c_statistic", "C statistic"},
        {"auprc", "Average precision (AUPRC)"},
        {"discrimination_slope", "Discrimination slope"},
        {"calibration_intercept", "Calibration-in-the-large"},
        {"calibration_slope", "Calibration slope"},
        {"recalibration_intercept", "Recalibration intercept"},
        {"oe_ratio", "Observed / expected"},
        {"ici", "ICI"},
        {"e50", "E50"},
        {"e90", "E90"},
        {"emax", "Emax"},
        {"brier", "Brier score"},
        {"scaled_brier", "Scaled Brier score"},
        {"log_loss", "Log loss"},
        {"nagelkerke_r2", "Nagelkerke R2"},
    }};
    for (const auto& [k, label] : labels)
        if (k == key)
            return std::string(label);
    return std::string(key);
}

std::string overallAccuracyAgreementNote(const Estimate& scaledBrier, const Estimate& nagelkerkeR2)
{
    if (!scaledBrier.value || !nagelkerkeR2.value)
        return {};
    const Side brier = sideOf(scaledBrier, 0.0), r2 = sideOf(nagelkerkeR2, 0.0);
    if (brier == r2 || brier == Side::Unknown || r2 == Side::Unknown)
        return {};
    return "; the scaled Brier score and Nagelkerke R2 read differently here because they weigh errors differently (squared "
           "errors against the log-likelihood, which punishes confident wrong risks far more)";
}

std::string metricReading(std::string_view key, const Estimate& e)
{
    if (!e.value)
        return {};
    const double v = *e.value;
    if (key == "c_statistic")
        return readC(e);
    if (key == "calibration_intercept")
        return readIntercept(e);
    if (key == "calibration_slope")
        return readSlope(e);
    if (key == "oe_ratio")
        return readOe(e);
    if (key == "recalibration_intercept")
        return "intercept of the recalibration fit, read with the slope (not the calibration-in-the-large)";
    if (key == "auprc")
        return "precision averaged over recall; compare with the event rate (its value for a useless score)";
    if (key == "discrimination_slope")
        return "mean risk of patients with the event minus mean risk of those without";
    if (key == "ici")
        return "smoothed observed and predicted risk differ by " + percentPoints(v) + " on average";
    if (key == "e50")
        return "half of patients have a calibration error below " + percentPoints(v);
    if (key == "e90")
        return "90 % of patients have a calibration error below " + percentPoints(v);
    if (key == "emax")
        return "largest calibration error on the smoothed curve";
    if (key == "brier")
        return "mean squared error of the risks (lower is better; read the scaled version)";
    if (key == "scaled_brier" || key == "nagelkerke_r2") {
        const std::string what = key == "scaled_brier" ? "better than giving everyone the observed rate"
                                                       : "explains variation beyond the observed rate";
        switch (sideOf(e, 0.0)) {
        case Side::Above: return "clearly " + what;
        case Side::Below: return "worse than giving everyone the observed rate";
        case Side::Inside: return "not clearly " + what + " (the interval includes 0)";
        case Side::Unknown: return v <= 0 ? "no better than giving everyone the observed rate" : what;
        }
    }
    if (key == "log_loss")
        return "mean negative log-likelihood of the risks (lower is better)";
    return {};
}

} // namespace plumbline
