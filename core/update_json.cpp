#include "update_json.hpp"

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
    if (u.fit.tests)
        out["closed_test"] = {{"joint_p_value", u.fit.tests->joint->pValue},
                              {"slope_given_intercept_p_value", u.fit.tests->slopeGivenIntercept->pValue}};
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
