#pragma once

#include "resampling/bootstrap_interval.hpp"
#include "metrics/estimate.hpp"

#include <optional>
#include <string>

namespace plumbline {

// Numbers and method names as people read them, one way everywhere: the window, the command
// line and the reports. JSON keeps the machine names (ciMethodName).

// `value` with `digits` decimals; a value that rounds to zero prints without a sign
// ("0.000", never "-0.000").
std::string fixedText(double value, int digits);
std::string fixedText(const std::optional<double>& value, int digits, const std::string& missing = "–");

// "0.719 (0.710 to 0.728)", or the value alone when there is no interval; `missing` when the
// estimate is undefined.
std::string estimateText(const Estimate& estimate, int digits, const std::string& missing = "–");

// "p < 0.001", "p = 0.372", "p > 0.999".
std::string pValueText(double p);

// The interval's method in words: "DeLong (logit scale)", "exact Poisson", "bootstrap BCa".
std::string ciMethodLabel(CiMethod method);
// "bootstrap BCa" or "bootstrap percentile".
std::string bootstrapCiLabel(BootstrapCi method);

} // namespace plumbline
