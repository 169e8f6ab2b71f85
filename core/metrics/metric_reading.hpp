#pragma once

#include "metrics/estimate.hpp"

#include <string>
#include <string_view>

namespace plumbline {

// One line of plain words on what an estimate means for the model ("predictions too extreme"),
// judged on the interval where there is one, so that chance is not read as a finding.
// Empty when the metric is undefined. Shared by the CLI, the window and the reports.
std::string metricReading(std::string_view key, const Estimate& estimate);

// The metric's name for people ("Calibration slope").
std::string metricLabel(std::string_view key);

// Said after both readings when the scaled Brier score and Nagelkerke R2 disagree on whether the
// model beats the observed rate (one interval above 0, the other not): why they can. Empty when
// they agree.
std::string overallAccuracyAgreementNote(const Estimate& scaledBrier, const Estimate& nagelkerkeR2);
// The label of a difference between two models ("c_statistic_difference" → "C statistic");
// the key itself when unknown.
std::string differenceLabel(std::string_view key);

} // namespace plumbline
