#include "files/update_json.hpp"

namespace plumbline {

nlohmann::ordered_json updateJson(const ModelUpdate& u)
{
    using Json = nlohmann::ordered_json;
    Json out;
    out["model"] = u.model;
    out["method"] = std::string(updateMethodName(u.method));
    out["choice"] = std::string(updateChoiceName(u.fit.choice));
    out["intercept"] = u.fit.intercept;
    out["slope"] = u.fit.slope;
    out["formula"] = u.fit.formula();
    // The closed test's p-values; null when the method is not the closed test or a test could
    // not be made (no slope can be fitted on these data).
    auto pValue = [](const std::optional<LikelihoodRatioTest>& t) { return t ? Json(t->pValue) : Json(nullptr); };
    out["closed_test"] = u.fit.tests ? Json{{"joint_p_value", pValue(u.fit.tests->joint)},
                                            {"slope_given_intercept_p_value", pValue(u.fit.tests->slopeGivenIntercept)}}
                                     : Json(nullptr);
    Json rows = Json::array();
    for (const auto& row : u.optimism)
        rows.push_back({{"metric", row.key}, {"apparent", row.apparent}, {"optimism", row.optimism}, {"corrected", row.corrected}});
    out["performance"] = rows;
    out["optimism_replicates"] = u.replicates;
    out["optimism_replicates_used"] = u.replicatesUsed;
    out["cautions"] = u.cautions;
    return out;
}

} // namespace plumbline
