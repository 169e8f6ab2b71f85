#include "reporting/value_text.hpp"

#include <cmath>
#include <cstdio>

namespace plumbline {

std::string fixedText(double value, int digits)
{
    if (!std::isfinite(value))
        return "–";
    char buffer[64];
    std::snprintf(buffer, sizeof buffer, "%.*f", digits, value);
    std::string text = buffer;
    // A negative number that rounds to zero keeps its sign in printf: drop it.
    if (text.front() == '-' && text.find_first_not_of("-0.") == std::string::npos)
        text.erase(0, 1);
    return text;
}

std::string fixedText(const std::optional<double>& value, int digits, const std::string& missing)
{
    return value ? fixedText(*value, digits) : missing;
}

std::string estimateText(const Estimate& e, int digits, const std::string& missing)
{
    if (!e.value)
        return missing;
    std::string text = fixedText(*e.value, digits);
    if (e.lower && e.upper)
        text += " (" + fixedText(*e.lower, digits) + " to " + fixedText(*e.upper, digits) + ")";
    return text;
}

std::string pValueText(double p)
{
    if (!std::isfinite(p))
        return "p not computed";
    if (p < 0.001)
        return "p < 0.001";
    if (p > 0.999)
        return "p > 0.999";
    return "p = " + fixedText(p, 3);
}

std::string ciMethodLabel(CiMethod method)
{
    switch (method) {
    case CiMethod::None: return "no interval";
    case CiMethod::DeLongLogit: return "DeLong (logit scale)";
    case CiMethod::DeLongPlain: return "DeLong";
    case CiMethod::Wald: return "Wald";
    case CiMethod::LogNormal: return "log-normal";
    case CiMethod::ExactPoisson: return "exact Poisson";
    case CiMethod::Wilson: return "Wilson";
    case CiMethod::ClopperPearson: return "Clopper–Pearson";
    case CiMethod::BootstrapPercentile: return "bootstrap percentile";
    case CiMethod::BootstrapBca: return "bootstrap BCa";
    }
    return "no interval";
}

std::string bootstrapCiLabel(BootstrapCi method)
{
    return method == BootstrapCi::Bca ? "bootstrap BCa" : "bootstrap percentile";
}

} // namespace plumbline
