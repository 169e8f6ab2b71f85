#include "files/validation_json.hpp"
#include "files/capacity_json.hpp"

#include "files/site_pooling_json.hpp"
#include "files/monitoring_json.hpp"
#include "resampling/interval_choice.hpp"

#include <algorithm>
#include <cmath>

namespace plumbline {

namespace {

using Json = nlohmann::ordered_json;

Json estimateJson(const Estimate& e)
{
    return {{"estimate", numberOrNull(e.value)},
            {"se", numberOrNull(e.se)},
            {"ci_lower", numberOrNull(e.lower)},
            {"ci_upper", numberOrNull(e.upper)},
            {"ci_method", e.value ? Json(ciMethodName(e.ciMethod)) : Json(nullptr)}};
}

// `se` is always on the reported (ratio) scale; the O/E interval is built on the log scale, so
// its SE there is given too, as `se_log`, wherever an O/E ratio appears.
Json metricEstimateJson(const std::string& key, const Estimate& e)
{
    Json out = estimateJson(e);
    if (key == "oe_ratio")
        out["se_log"] = numberOrNull(e.seLog);
    return out;
}

Json pairJson(const std::pair<double, double>& p)
{
    return Json::array({p.first, p.second});
}

Json metricJson(const MetricEntry& entry)
{
    Json out = metricEstimateJson(entry.key, entry.estimate);
    out["interval_note"] = entry.intervalNote.empty() ? Json(nullptr) : Json(entry.intervalNote);
    // `analytic` and `bootstrap` are null when no bootstrap ran (the estimate's own interval is
    // then the analytic one); `analytic` is also null for a metric without an analytic interval.
    out["analytic"] = nullptr;
    out["bootstrap"] = nullptr;
    if (entry.analytic) {
        const Estimate& a = *entry.analytic;
        out["analytic"] = a.lower ? Json{{"se", numberOrNull(a.se)}, {"ci_lower", *a.lower}, {"ci_upper", *a.upper},
                                         {"ci_method", ciMethodName(a.ciMethod)}}
                                  : Json(nullptr);
        if (a.lower && entry.key == "oe_ratio")
            out["analytic"]["se_log"] = numberOrNull(a.seLog);
    }
    if (entry.bootstrap) {
        const MetricBootstrap& b = *entry.bootstrap;
        out["bootstrap"] = {{"replicates_used", b.replicatesUsed},
                            {"se", b.se},
                            {"percentile", pairJson(b.percentile)},
                            {"bca", b.bca ? pairJson(*b.bca) : Json(nullptr)},
                            {"z0", numberOrNull(b.z0)},
                            {"acceleration", b.acceleration},
                            {"acceleration_from", std::string(b.accelerationMethod)}};
    }
    return out;
}

Json testsJson(const ModelValidation& m)
{
    Json tests = Json::object();
    if (m.hosmerLemeshow) {
        const auto& hl = *m.hosmerLemeshow;
        tests["hosmer_lemeshow"] = {{"statistic", hl.statistic}, {"df", hl.df}, {"groups", hl.groups}, {"p_value", hl.pValue},
                                    {"df_rule", "g (external validation: nothing estimated on these data)"}};
    } else {
        tests["hosmer_lemeshow"] = nullptr;
    }
    tests["spiegelhalter"] = m.spiegelhalter ? Json{{"z", m.spiegelhalter->z}, {"p_value", m.spiegelhalter->pValue}} : Json(nullptr);
    // Every test key is always there: null when the test cannot be made on these data.
    auto lr = [](const std::optional<LikelihoodRatioTest>& t) {
        return t ? Json{{"statistic", t->statistic}, {"df", t->df}, {"p_value", t->pValue}} : Json(nullptr);
    };
    const auto& tests3 = m.likelihoodRatio;
    tests["likelihood_ratio_joint"] = lr(tests3 ? tests3->joint : std::nullopt);
    tests["likelihood_ratio_calibration_in_the_large"] = lr(tests3 ? std::optional(tests3->interceptOnly) : std::nullopt);
    tests["likelihood_ratio_slope_given_intercept"] = lr(tests3 ? tests3->slopeGivenIntercept : std::nullopt);
    return tests;
}

Json riskGroupsJson(const ModelValidation& m)
{
    Json out = Json::array();
    for (const auto& g : m.riskGroups)
        out.push_back({{"group", g.group}, {"n", g.n}, {"events", g.events}, {"expected", g.expected},
                       {"mean_predicted", g.meanPredicted}, {"observed_rate", g.observedRate}, {"ci_lower", g.ciLower},
                       {"ci_upper", g.ciUpper}, {"risk_min", g.riskMin}, {"risk_max", g.riskMax}});
    return out;
}

void proportion(Json& row, const std::string& key, const ProportionWithCi& value)
{
    row[key] = numberOrNull(value.value);
    row[key + "_ci_lower"] = value.ci ? Json(value.ci->lower) : Json(nullptr);
    row[key + "_ci_upper"] = value.ci ? Json(value.ci->upper) : Json(nullptr);
}

Json thresholdsJson(const ModelValidation& m)
{
    Json out = Json::array();
    for (const auto& t : m.thresholds) {
        Json row{{"threshold", t.threshold}, {"positive_if", "risk >= threshold"},
                 {"tp", t.tp}, {"fp", t.fp}, {"tn", t.tn}, {"fn", t.fn}};
        proportion(row, "sensitivity", t.sensitivity);
        proportion(row, "specificity", t.specificity);
        proportion(row, "ppv", t.ppv);
        proportion(row, "npv", t.npv);
        proportion(row, "flag_rate", t.flagRate);
        row["number_needed_to_evaluate"] = numberOrNull(t.numberNeededToEvaluate);
        row["net_benefit"] = t.netBenefit;
        row["net_benefit_treat_all"] = t.netBenefitTreatAll;
        out.push_back(row);
    }
    return out;
}

Json modelJson(const ModelValidation& m)
{
    Json model;
    model["name"] = m.name;
    Json metrics = Json::object();
    Json readings = Json::object();
    for (const auto& entry : m.metrics) {
        metrics[entry.key] = metricJson(entry);
        readings[entry.key] = entry.reading.empty() ? Json(nullptr) : Json(entry.reading);
    }
    model["metrics"] = metrics;
    model["readings"] = readings;
    model["tests"] = testsJson(m);
    model["risk_groups"] = riskGroupsJson(m);
    Json roc = Json::array();
    for (const auto& point : m.roc)
        roc.push_back({{"threshold", point.threshold}, {"sensitivity", point.sensitivity}, {"specificity", point.specificity}});
    model["roc"] = roc;
    Json curve = Json::array();
    const CurveBand& band = m.calibrationBand;
    for (const auto& point : m.calibrationCurve) {
        const auto at = std::find(band.x.begin(), band.x.end(), point.predicted);
        const bool banded = at != band.x.end();
        const auto j = static_cast<std::size_t>(at - band.x.begin());
        curve.push_back({{"predicted", point.predicted}, {"observed", point.observed},
                         {"ci_lower", banded ? Json(band.lower[j]) : Json(nullptr)},
                         {"ci_upper", banded ? Json(band.upper[j]) : Json(nullptr)}});
    }
    model["calibration_curve"] = curve;
    Json rocBand = Json::array();
    for (std::size_t j = 0; j < m.rocBand.x.size(); ++j)
        rocBand.push_back({{"false_positive_rate", m.rocBand.x[j]}, {"sensitivity_lower", m.rocBand.lower[j]},
                           {"sensitivity_upper", m.rocBand.upper[j]}});
    model["roc_band"] = rocBand;
    model["calibration_curve_method"] = m.calibrationCurveMethod.empty() ? Json(nullptr) : Json(m.calibrationCurveMethod);
    model["thresholds"] = thresholdsJson(m);
    Json netBenefit = Json::array();
    for (const auto& p : m.decisionCurve)
        netBenefit.push_back({{"threshold", p.threshold}, {"model", p.netBenefit}, {"treat_all", p.treatAll}, {"treat_none", 0.0},
                              {"standardized", p.standardized}, {"net_reduction_per_100", p.netReductionPer100},
                              {"ci_lower", numberOrNull(p.lower)}, {"ci_upper", numberOrNull(p.upper)}});
    model["net_benefit"] = netBenefit;
    return model;
}

Json differenceJson(const DifferenceEstimate& d)
{
    Json out = estimateJson(d.estimate);
    out["p_value"] = numberOrNull(d.pValue);
    out["ci_truncated"] = d.truncated;
    out["interval_note"] = d.intervalNote.empty() ? Json(nullptr) : Json(d.intervalNote);
    out["analytic"] = nullptr;
    out["bootstrap"] = nullptr;
    if (d.analytic)
        out["analytic"] = {{"se", numberOrNull(d.analytic->se)}, {"ci_lower", numberOrNull(d.analytic->lower)},
                           {"ci_upper", numberOrNull(d.analytic->upper)}, {"ci_method", ciMethodName(d.analytic->ciMethod)}};
    if (d.bootstrap)
        out["bootstrap"] = {{"replicates_used", d.bootstrap->replicatesUsed}, {"se", d.bootstrap->se},
                            {"percentile", pairJson(d.bootstrap->percentile)}, {"paired", true}};
    return out;
}

Json reclassificationJson(const ReclassificationTable& table)
{
    return {{"cut_points", table.cutPoints},
            {"category_rule", "category = number of cut-points <= risk"},
            {"rows", "category under model_a"},
            {"columns", "category under model_b"},
            {"events", table.events},
            {"non_events", table.nonEvents}};
}

} // namespace

Json comparisonsJson(const ValidationResult& result)
{
    Json out = Json::array();
    for (const auto& c : result.comparisons) {
        // Every difference key is always there, null where it cannot be computed (a points
        // score has only ΔC; no slope under separation; no categorical NRI without cut-points).
        Json metrics = Json::object();
        for (const char* key : {"c_statistic_difference", "brier_difference", "calibration_slope_difference", "ici_difference",
                                "nri_events", "nri_non_events", "nri", "nri_continuous_events", "nri_continuous_non_events",
                                "nri_continuous", "idi"}) {
            const DifferenceEstimate* d = c.difference(key);
            metrics[key] = differenceJson(d ? *d : DifferenceEstimate{key, Estimate::undefined(), std::nullopt, std::nullopt, std::nullopt, {}, false});
        }
        Json netBenefit = Json::array();
        for (std::size_t t = 0; t < c.netBenefitDifferences.size(); ++t) {
            Json row = differenceJson(c.netBenefitDifferences[t]);
            row["threshold"] = c.netBenefitThresholds[t];
            netBenefit.push_back(row);
        }
        metrics["net_benefit_difference"] = netBenefit;
        Json cautions = Json::array();
        for (const auto& caution : comparisonCautions())
            cautions.push_back(caution);
        out.push_back({{"model_a", c.modelA}, {"model_b", c.modelB}, {"difference", "model_b - model_a"},
                       {"metrics", metrics}, {"reclassification", reclassificationJson(c.reclassification)},
                       {"cautions", cautions}});
    }
    return out;
}

void addUsefulnessFairnessDriftJson(Json& json, const ValidationResult& result)
{
    if (result.subgroups) {
        Json subgroups = Json::array();
        for (const auto& r : result.subgroups->results) {
            Json metrics = Json::object();
            for (const auto& entry : r.panel.metrics)
                metrics[entry.key] = metricEstimateJson(entry.key, entry.estimate);
            subgroups.push_back({{"column", r.column}, {"level", r.level}, {"model", r.model}, {"n", r.n}, {"events", r.events},
                                 {"too_small", r.tooSmall}, {"metrics", metrics}});
        }
        json["subgroups"] = subgroups;
        Json heterogeneity = Json::array();
        for (const auto& h : result.subgroups->heterogeneity)
            heterogeneity.push_back({{"column", h.column}, {"model", h.model}, {"metric", h.metric}, {"test", "Cochran Q (inverse-variance)"},
                                     {"q", h.q}, {"df", h.df}, {"levels", h.levels}, {"p_value", h.df > 0 ? Json(h.pValue) : Json(nullptr)}});
        json["heterogeneity"] = heterogeneity;
        Json funnel = Json::array();
        for (const auto& f : result.subgroups->funnel)
            funnel.push_back({{"column", f.column}, {"level", f.level}, {"model", f.model}, {"observed", f.observed}, {"expected", f.expected},
                              {"oe_ratio", f.oe}, {"limits_95", {f.lower95, f.upper95}}, {"limits_99_8", {f.lower998, f.upper998}}});
        json["funnel"] = funnel;
    } else {
        json["subgroups"] = Json::array();
        json["heterogeneity"] = Json::array();
        json["funnel"] = Json::array();
    }
    if (result.periods) {
        Json periods = Json::array();
        for (const auto& p : result.periods->results)
            periods.push_back({{"period", p.period}, {"model", p.model}, {"n", p.n}, {"events", p.events},
                               {"metrics", {{"c_statistic", estimateJson(p.c)}, {"oe_ratio", metricEstimateJson("oe_ratio", p.oe)},
                                            {"calibration_intercept", estimateJson(p.calibrationIntercept)}}},
                               {"outside_first_year", p.outsideFirstYear}});
        json["periods"] = periods;
        json["period_reference"] = {{"first_year", result.periods->firstYearPeriods}, {"undated_rows", result.periods->undated},
                                    {"unit", result.periods->unit == PeriodUnit::Month ? "month" : "quarter"},
                                    {"note", result.periods->note}};
    } else {
        json["periods"] = Json::array();
        json["period_reference"] = nullptr;
    }
    json["monitoring"] = result.monitoring ? monitoringJson(*result.monitoring) : Json(nullptr);
    Json precision = Json::array();
    for (const auto& p : result.precision)
        precision.push_back({{"model", p.model}, {"metric", p.metric}, {"interval_width", p.width}, {"common_target", p.target},
                             {"meets_target", p.width <= p.target}});
    json["precision"] = precision;
    json["capacity"] = capacityJson(result.capacity);
    json["site_pooling"] = sitePoolingJson(result);
}

Json numberOrNull(const std::optional<double>& value)
{
    return value && std::isfinite(*value) ? Json(*value) : Json(nullptr);
}

Json modelsJson(const ValidationResult& result)
{
    Json out = Json::array();
    for (const auto& model : result.models)
        out.push_back(modelJson(model));
    return out;
}

Json panelSettingsJson(const PanelSettings& settings)
{
    return {{"confidence", settings.confidence},
            {"risk_groups", settings.riskGroups},
            {"thresholds", settings.thresholds},
            {"decision_threshold", settings.decisionThreshold},
            {"c_statistic_interval", settings.cStatisticScale == CStatisticScale::Logit ? "logit" : "plain"},
            {"binomial_interval", settings.binomialInterval == CiMethod::ClopperPearson ? "clopper-pearson" : "wilson"}};
}

} // namespace plumbline

namespace plumbline {

nlohmann::ordered_json bootstrapJson(const ValidationResult& result)
{
    // The same keys with and without a bootstrap, null where they do not apply.
    if (!result.bootstrap)
        return {{"replicates", 0},
                {"seed", nullptr},
                {"ci_method", nullptr},
                {"confidence", result.settings.confidence},
                {"stratified", nullptr},
                {"redrawn", 0},
                {"resampling", nullptr},
                {"random_stream", nullptr},
                {"interval_rule", nullptr},
                {"note", "analytic intervals only"}};
    const BootstrapSummary& b = *result.bootstrap;
    return {{"replicates", b.replicates},
            {"seed", b.seed},
            {"ci_method", b.ciMethod},
            {"confidence", result.settings.confidence},
            {"stratified", b.stratified},
            {"redrawn", b.redrawn},
            {"resampling", b.stratified ? "events and non-events resampled separately" : "patients resampled with replacement"},
            {"random_stream", "xoshiro256** seeded by SplitMix64 from (seed, replicate)"},
            {"interval_rule", intervalRuleText()},
            {"note", nullptr}};
}

} // namespace plumbline
