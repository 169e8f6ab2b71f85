#pragma once

#include <optional>
#include <string>

namespace plumbline {

// How an interval was produced; written into the result so a reader knows what they look at.
enum class CiMethod {
    None, DeLongLogit, DeLongPlain, Wald, LogNormal, ExactPoisson, Wilson, ClopperPearson, BootstrapPercentile, BootstrapBca
};

std::string ciMethodName(CiMethod method);

// One number of the metric panel. An empty value means "undefined on these data"; the reason
// is then in the result's warnings. Never NaN.
struct Estimate {
    std::optional<double> value;
    std::optional<double> se;
    std::optional<double> lower;
    std::optional<double> upper;
    CiMethod ciMethod = CiMethod::None;
    // The SE on the log scale, for an estimate whose interval is built there (O/E); `se` is
    // always on the estimate's own scale.
    std::optional<double> seLog = std::nullopt;

    static Estimate undefined() { return {}; }
    static Estimate point(double v) { return {v, std::nullopt, std::nullopt, std::nullopt, CiMethod::None}; }
};

} // namespace plumbline
