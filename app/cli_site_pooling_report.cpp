#include "cli_site_pooling_report.hpp"

#include "metrics/metric_reading.hpp"
#include "reporting/cautions.hpp"
#include "reporting/site_pooling_text.hpp"
#include "reporting/value_text.hpp"

namespace plumbline::cli {

namespace {

std::string range(const std::optional<double>& low, const std::optional<double>& high, int digits)
{
    return low && high ? fixedText(*low, digits) + " to " + fixedText(*high, digits) : std::string("-");
}

} // namespace

void printSitePooling(std::ostream& out, const ValidationResult& result)
{
    if (!result.sites)
        return;
    const SitePooling& s = *result.sites;
    const int percent = int(result.settings.confidence * 100.0 + 0.5);
    out << "\nAcross sites (" << s.column << ", " << siteCountText(s.sites) << "; random effects, REML; " << percent
        << " % HKSJ interval and prediction interval for a new site):\n";
    for (const auto& model : s.models) {
        out << "  " << model.model << '\n';
        for (const auto& m : model.measures) {
            out << "    " << metricLabel(m.measure) << ": ";
            if (!m.pool) {
                out << "not pooled: " << siteCountText(m.sites.size()) << " with an estimate, 2 needed; " << m.sitesLeftOut << " left out ("
                    << (m.leftOut.empty() ? std::string("-") : m.leftOut.front()) << ")\n";
                continue;
            }
            out << fixedText(m.pooled, 3) << " (" << range(m.hksjLower, m.hksjUpper, 3) << "), new site "
                << range(m.predictionLower, m.predictionUpper, 3) << "; tau2 " << fixedText(m.pool->tau2Reml, 4) << " (DL "
                << fixedText(m.pool->tau2DerSimonianLaird, 4) << "), I2 " << fixedText(m.pool->i2 * 100.0, 0) << " %, "
                << siteCountText(m.sites.size()) << (m.sitesLeftOut == 0 ? "" : ", " + std::to_string(m.sitesLeftOut) + " left out");
            if (const auto why = noPredictionIntervalReason(m))
                out << "; " << *why;
            out << '\n';
        }
        const NewSiteAcceptability& a = model.acceptability;
        if (a.joint) {
            out << "    acceptable in a new site (" << acceptableCriteriaText(s.criteria) << "):";
            for (std::size_t i = 0; i < a.measures.size(); ++i)
                out << ' ' << metricLabel(a.measures[i]) << ' ' << fixedText(a.probabilities[i], 2) << ';';
            out << " all " << fixedText(*a.joint, 2) << " (" << a.draws << " draws, seed " << a.seed << ", "
                << (a.correlated ? "correlated" : "independent") << ")\n";
        }
    }
    for (const auto caution : siteCautionsFor(s))
        out << "  note: " << caution << '\n';
}

} // namespace plumbline::cli
