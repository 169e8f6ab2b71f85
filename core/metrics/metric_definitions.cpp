#include "metrics/metric_definitions.hpp"

#include <array>
#include <utility>

namespace plumbline {

MetricDefinition metricDefinition(std::string_view key)
{
    static const std::array<std::pair<std::string_view, MetricDefinition>, 15> definitions{{
        {"c_statistic", {"Probability that a random patient with the event has a higher predicted risk than one without (ties count half); the area under the ROC curve. 0.5 is chance, 1 perfect ranking.",
                         "Hanley & McNeil 1982, Radiology 143:29; interval: DeLong, DeLong & Clarke-Pearson 1988, Biometrics 44:837 (fast algorithm: Sun & Xu 2014)"}},
        {"auprc", {"Average precision: precision (PPV) averaged over recall as the threshold falls. Its value for a useless score is the event rate.",
                   "Definition as scikit-learn's average precision (step-wise, no interpolation)"}},
        {"discrimination_slope", {"Mean predicted risk of patients with the event minus that of patients without.",
                                  "Yates 1982, Organ Behav Hum Perform 30:132"}},
        {"calibration_intercept", {"Calibration-in-the-large: the intercept of a logistic model with logit(p) as offset. 0 is ideal; below 0 the model over-predicts on average, above 0 it under-predicts.",
                                   "Van Calster et al. 2016, J Clin Epidemiol 74:167"}},
        {"calibration_slope", {"Slope of a logistic regression of the outcome on logit(p). 1 is ideal; below 1 the predictions are too extreme, above 1 too moderate.",
                               "Cox 1958, Biometrika 45:562; Van Calster et al. 2016"}},
        {"recalibration_intercept", {"Intercept fitted together with the calibration slope; read with the slope, it is not the calibration-in-the-large.",
                                     "Cox 1958; Steyerberg, Clinical Prediction Models, 2nd ed. 2019"}},
        {"oe_ratio", {"Observed events divided by the sum of predicted risks. 1 is ideal; below 1 the model over-predicts.",
                      "Interval: log-normal (Debray et al. 2017, BMJ 356:i6460), exact Poisson with few events"}},
        {"ici", {"Integrated calibration index: mean absolute difference between the smoothed (loess) observed risk and the predicted risk, over patients.",
                 "Austin & Steyerberg 2019, Stat Med 38:4051"}},
        {"e50", {"Median absolute difference between smoothed observed and predicted risk.", "Austin & Steyerberg 2019"}},
        {"e90", {"90th percentile of the absolute difference between smoothed observed and predicted risk.", "Austin & Steyerberg 2019"}},
        {"emax", {"Largest absolute difference between smoothed observed and predicted risk.", "Austin & Steyerberg 2019 (after Harrell)"}},
        {"brier", {"Mean squared difference between predicted risk and outcome (0 or 1). Lower is better; depends on the event rate.",
                   "Brier 1950, Mon Weather Rev 78:1"}},
        {"scaled_brier", {"1 − Brier / Brier of predicting the observed event rate for everyone. 0 means no better than that; may be negative.",
                          "Steyerberg et al. 2010, Epidemiology 21:128"}},
        {"log_loss", {"Mean negative log-likelihood of the outcomes under the predicted risks. Infinite when a risk of 0 or 1 is contradicted.",
                      "Common practice"}},
        {"nagelkerke_r2", {"Cox–Snell R² of the fixed risks divided by its maximum: the share of explained variation on a 0-1 scale.",
                           "Nagelkerke 1991, Biometrika 78:691"}},
    }};
    for (const auto& [k, definition] : definitions)
        if (k == key)
            return definition;
    return {"", ""};
}

} // namespace plumbline
