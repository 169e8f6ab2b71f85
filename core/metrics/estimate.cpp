#include "metrics/estimate.hpp"

namespace plumbline {

std::string ciMethodName(CiMethod method)
{
    switch (method) {
    case CiMethod::None: return "none";
    case CiMethod::DeLongLogit: return "delong_logit";
    case CiMethod::DeLongPlain: return "delong";
    case CiMethod::Wald: return "wald";
    case CiMethod::LogNormal: return "log_normal";
    case CiMethod::ExactPoisson: return "exact_poisson";
    case CiMethod::Wilson: return "wilson";
    case CiMethod::ClopperPearson: return "clopper_pearson";
    case CiMethod::BootstrapPercentile: return "bootstrap_percentile";
    case CiMethod::BootstrapBca: return "bootstrap_bca";
    }
    return "none";
}

} // namespace plumbline
