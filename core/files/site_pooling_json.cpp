#include "files/site_pooling_json.hpp"

#include "files/validation_json.hpp"

namespace plumbline {

namespace {

using Json = nlohmann::ordered_json;

Json pairOrNull(const std::optional<double>& low, const std::optional<double>& high)
{
    return low && high ? Json::array({numberOrNull(low), numberOrNull(high)}) : Json(nullptr);
}

Json measureJson(const PooledMeasure& m)
{
    Json sites = Json::array();
    for (const auto& s : m.sites)
        sites.push_back({{"site", s.site}, {"n", s.n}, {"events", s.events}, {"estimate", numberOrNull(s.estimate)},
                         {"se", numberOrNull(s.se)}, {"lower", numberOrNull(s.lower)}, {"upper", numberOrNull(s.upper)}});
    Json out = {{"measure", m.measure}, {"pooled_scale", m.scale}, {"sites", sites}, {"left_out", m.leftOut}, {"sites_left_out", m.sitesLeftOut}};
    const auto& p = m.pool;
    out["pooled"] = numberOrNull(m.pooled);
    out["pooled_on_scale"] = p ? Json{{"estimate", numberOrNull(p->pooled)}, {"se", numberOrNull(p->se)}} : Json(nullptr);
    out["tau2_reml"] = p ? numberOrNull(p->tau2Reml) : Json(nullptr);
    out["tau2_dl"] = p ? numberOrNull(p->tau2DerSimonianLaird) : Json(nullptr);
    out["reml_iterations"] = p ? Json(p->remlIterations) : Json(nullptr);
    out["i2"] = p ? numberOrNull(p->i2) : Json(nullptr);
    out["q"] = p ? numberOrNull(p->q) : Json(nullptr);
    out["q_df"] = p ? Json(p->df) : Json(nullptr);
    out["hksj_interval"] = pairOrNull(m.hksjLower, m.hksjUpper);
    out["hksj_interval_unmodified"] = pairOrNull(m.hksjUnmodifiedLower, m.hksjUnmodifiedUpper);
    out["prediction_interval"] = pairOrNull(m.predictionLower, m.predictionUpper);
    out["warnings"] = p ? Json(p->warnings) : Json::array({"fewer than 2 sites with an estimate: nothing is pooled."});
    return out;
}

Json acceptabilityJson(const NewSiteAcceptability& a)
{
    Json probabilities = Json::object();
    for (std::size_t i = 0; i < a.measures.size(); ++i)
        probabilities[a.measures[i]] = numberOrNull(a.probabilities[i]);
    return {{"measures", a.measures},
            {"probabilities", probabilities},
            {"joint", numberOrNull(a.joint)},
            {"draws", a.draws},
            {"seed", a.seed},
            {"degrees_of_freedom", a.measures.empty() ? Json(nullptr) : Json(a.degreesOfFreedom)},
            {"correlated", a.correlated},
            {"correlation", a.correlation},
            {"method", a.method.empty() ? Json(nullptr) : Json(a.method)},
            {"notes", a.notes}};
}

} // namespace

nlohmann::ordered_json sitePoolingJson(const ValidationResult& result)
{
    if (!result.sites)
        return nullptr;
    const SitePooling& s = *result.sites;
    Json models = Json::array();
    for (const auto& model : s.models) {
        Json measures = Json::array();
        for (const auto& m : model.measures)
            measures.push_back(measureJson(m));
        models.push_back({{"model", model.model}, {"measures", measures}, {"acceptability", acceptabilityJson(model.acceptability)}});
    }
    const AcceptableCriteria& c = s.criteria;
    return {{"column", s.column},
            {"sites", s.sites},
            {"rows_without_site", s.missingRows},
            {"confidence", result.settings.confidence},
            {"acceptable", {{"c_min", c.cMinimum}, {"oe", {c.oeLow, c.oeHigh}}, {"slope", {c.slopeLow, c.slopeHigh}}}},
            {"models", models},
            {"warnings", s.warnings}};
}

} // namespace plumbline
