#include "files/capacity_json.hpp"

#include <cmath>

namespace plumbline {

namespace {

using Json = nlohmann::ordered_json;

Json numberOrNull(const std::optional<double>& value)
{
    return value && std::isfinite(*value) ? Json(*value) : Json(nullptr);
}

void proportion(Json& row, const std::string& key, const ProportionWithCi& value)
{
    row[key] = numberOrNull(value.value);
    row[key + "_ci_lower"] = value.ci ? Json(value.ci->lower) : Json(nullptr);
    row[key + "_ci_upper"] = value.ci ? Json(value.ci->upper) : Json(nullptr);
}

Json resultJson(const CapacityResult& r, bool period)
{
    Json row;
    row["model"] = r.model;
    if (period)
        row["period"] = r.period;
    row["patients"] = r.patients;
    row["events"] = r.events;
    row["capacity"] = r.capacity;
    row["requested"] = r.at.requested;
    row["threshold"] = numberOrNull(r.at.threshold);
    row["flagged"] = r.at.flagged;
    row["tied_at_threshold"] = r.at.tiedAtThreshold;
    row["flagged_above_ties"] = r.at.flaggedAboveTies;
    row["exact"] = r.at.exact();
    row["next_risk_down"] = numberOrNull(r.at.nextRiskDown);
    row["tied_at_next_risk_down"] = r.at.tiedAtNextRiskDown;
    row["flagged_at_next_risk_down"] = r.at.flaggedAtNextRiskDown;
    row["tp"] = r.tp;
    row["fp"] = r.fp;
    row["tn"] = r.tn;
    row["fn"] = r.fn;
    proportion(row, "sensitivity", r.sensitivity);
    proportion(row, "specificity", r.specificity);
    proportion(row, "ppv", r.ppv);
    row["net_benefit"] = numberOrNull(r.netBenefit);
    row["events_per_100_flagged"] = numberOrNull(r.eventsPer100Flagged);
    if (period) {
        row["flagged_by_overall_threshold"] = r.flaggedByOverallThreshold ? Json(*r.flaggedByOverallThreshold) : Json(nullptr);
        row["overall_threshold_overflows"] = r.overallThresholdOverflows;
    }
    return row;
}

} // namespace

nlohmann::ordered_json capacityJson(const std::optional<CapacityAnalysis>& capacity)
{
    if (!capacity)
        return nullptr;
    const CapacityAnalysis& c = *capacity;
    const bool share = c.spec.kind == CapacitySpec::Kind::Share;
    Json out;
    out["asked"] = c.text;
    out["kind"] = share ? "share" : "rate";
    out["amount"] = c.spec.amount;
    out["unit"] = share ? Json(nullptr) : Json(c.spec.unit == CapacitySpec::Unit::Day ? "day" : c.spec.unit == CapacitySpec::Unit::Week ? "week" : "month");
    out["unit_days"] = share ? Json(nullptr) : Json(c.spec.unitDays());
    out["first_date"] = c.firstDate ? Json(*c.firstDate) : Json(nullptr);
    out["last_date"] = c.lastDate ? Json(*c.lastDate) : Json(nullptr);
    out["span_days"] = numberOrNull(c.spanDays);
    out["undated_rows"] = c.undated;
    out["period_unit"] = c.periodUnit == PeriodUnit::Month ? "month" : "quarter";
    out["flagged_if"] = "risk >= threshold";
    out["definition"] = c.definition;
    Json models = Json::array();
    for (const auto& r : c.overall)
        models.push_back(resultJson(r, false));
    out["models"] = models;
    Json periods = Json::array();
    for (const auto& r : c.periods)
        periods.push_back(resultJson(r, true));
    out["periods"] = periods;
    return out;
}

} // namespace plumbline
