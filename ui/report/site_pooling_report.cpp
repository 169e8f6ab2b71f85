#include "report/site_pooling_report.hpp"

#include "metrics/metric_reading.hpp"
#include "reporting/cautions.hpp"
#include "reporting/site_pooling_text.hpp"
#include "reporting/value_text.hpp"

namespace plumbline {

namespace {

ReportCell number(std::optional<double> value, int digits)
{
    return value ? ReportCell{fixedText(*value, digits), *value} : ReportCell{"-"};
}

// I² as a percentage, as the text output and the window show it.
ReportCell percent(std::optional<double> share)
{
    return share ? ReportCell{fixedText(*share * 100.0, 0) + " %", *share * 100.0} : ReportCell{"-"};
}

ReportCell range(std::optional<double> low, std::optional<double> high, int digits)
{
    if (!low || !high)
        return ReportCell{"-"};
    return {fixedText(*low, digits) + " to " + fixedText(*high, digits), std::nullopt, false, std::pair{*low, *high}};
}

} // namespace

void addSitePooling(ReportSection& section, const ValidationResult& shown)
{
    if (!shown.sites)
        return;
    const SitePooling& s = *shown.sites;
    for (std::size_t m = 0; m < s.models.size(); ++m)
        for (ReportChart kind : {ReportChart::SiteC, ReportChart::SiteOe, ReportChart::SiteSlope})
            section.charts.push_back({kind, int(m)});
    ReportTable sites{"site_estimates", "Performance per site (" + s.column + ")", {"Model", "Measure", "Site", "Estimate", "Interval"}, {}, {}, {}};
    ReportTable pooled{"site_pooling", "Pooled across sites and expected in a new site",
                       {"Model", "Measure", "Sites", "Pooled", "HKSJ interval", "Prediction interval", "tau2 (REML)", "tau2 (DL)", "I2 (%)",
                        "P(acceptable)"},
                       {}, {}, {}};
    std::string notes, siteNotes;
    for (const auto& model : s.models) {
        for (const auto& m : model.measures) {
            const std::string label = metricLabel(m.measure);
            for (const auto& site : m.sites)
                sites.rows.push_back({ReportCell{model.model}, ReportCell{label}, ReportCell{site.site}, number(site.estimate, 3),
                                      range(site.lower, site.upper, 3)});
            std::optional<double> probability;
            for (std::size_t i = 0; i < model.acceptability.measures.size(); ++i)
                if (model.acceptability.measures[i] == m.measure)
                    probability = model.acceptability.probabilities[i];
            pooled.rows.push_back({ReportCell{model.model}, ReportCell{label}, ReportCell{std::to_string(m.sites.size() + m.sitesLeftOut)},
                                   number(m.pooled, 3), range(m.hksjLower, m.hksjUpper, 3), range(m.predictionLower, m.predictionUpper, 3),
                                   number(m.pool ? std::optional(m.pool->tau2Reml) : std::nullopt, 4),
                                   number(m.pool ? std::optional(m.pool->tau2DerSimonianLaird) : std::nullopt, 4),
                                   percent(m.pool ? std::optional(m.pool->i2) : std::nullopt), number(probability, 2)});
            if (const auto why = noPredictionIntervalReason(m))
                notes += " " + model.model + ", " + label + ": " + *why + ".";
            for (const auto& note : m.leftOut)
                siteNotes += " " + model.model + ", " + label + ": " + note;
        }
        if (model.acceptability.joint)
            pooled.rows.push_back({ReportCell{model.model}, ReportCell{"all criteria at once"}, ReportCell{""}, ReportCell{"-"},
                                   ReportCell{"-"}, ReportCell{"-"}, ReportCell{"-"}, ReportCell{"-"}, ReportCell{"-"},
                                   number(model.acceptability.joint, 2)});
    }
    sites.note = "Each site's interval is built on the pooled scale (logit C, log O/E) and back-transformed. Sites below the "
                 "small-cell rule keep no estimate of their own here." + siteNotes;
    const auto& criteria = s.criteria;
    std::string method;
    for (const auto& model : s.models)
        if (!model.acceptability.method.empty()) {
            method = model.acceptability.method + " (" + std::to_string(model.acceptability.draws) + " draws, seed "
                + std::to_string(model.acceptability.seed) + ").";
            break;
        }
    pooled.note = "Random-effects pooling: tau2 by REML (DerSimonian-Laird beside it), the pooled value with the Hartung-Knapp-Sidik-"
                  "Jonkman interval, and the prediction interval for a new site (Riley, Higgins & Deeks 2011). Acceptable: "
        + acceptableCriteriaText(criteria) + ". " + method;
    for (const auto& w : s.warnings)
        pooled.note += " " + w;
    pooled.note += notes;
    section.tables.push_back(sites);
    section.tables.push_back(pooled);
    for (const auto caution : siteCautionsFor(s))
        section.closing.emplace_back(caution);
}

} // namespace plumbline
