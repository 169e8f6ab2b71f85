#include "support/check_datasets.hpp"
#include "analyses/model_validation.hpp"
#include "analyses/validation.hpp"
#include "files/validation_json.hpp"

#include <catch2/catch.hpp>

using namespace plumbline;
using namespace plumbline::test;
using Catch::Matchers::WithinAbs;

namespace {

Cohort cohortOf(const CheckData& data, ScoreScale scale = ScoreScale::Probability)
{
    Cohort cohort;
    cohort.outcome = data.y;
    cohort.models.push_back({"model", data.p});
    cohort.scale = scale;
    return cohort;
}

bool mentions(const std::vector<std::string>& warnings, const std::string& fragment)
{
    for (const auto& w : warnings)
        if (w.find(fragment) != std::string::npos)
            return true;
    return false;
}

} // namespace

TEST_CASE("The panel carries the estimators' check values for Toy-20", "[panel]")
{
    // Values: docs/methods.md §3, §5-§8, §12 and §13 (see the estimator tests for their sources).
    const ValidationResult result = runValidation(cohortOf(toy20A()), PanelSettings{});
    const ModelValidation& m = result.models.at(0);
    CHECK_THAT(*m.metric("c_statistic")->value, WithinAbs(0.703125, 1e-12));
    CHECK_THAT(*m.metric("calibration_intercept")->value, WithinAbs(0.2603346, 1e-7));
    CHECK_THAT(*m.metric("calibration_slope")->value, WithinAbs(0.5024740, 1e-7));
    CHECK_THAT(*m.metric("recalibration_intercept")->value, WithinAbs(-0.0550359, 1e-7));
    CHECK_THAT(*m.metric("oe_ratio")->value, WithinAbs(1.1267606, 1e-7));
    CHECK_THAT(*m.metric("ici")->value, WithinAbs(0.1072957, 1e-6));
    CHECK_THAT(*m.metric("brier")->value, WithinAbs(0.22629, 1e-9));
    CHECK_THAT(*m.metric("nagelkerke_r2")->value, WithinAbs(0.0156650, 1e-7));
    CHECK_THAT(*m.metric("discrimination_slope")->value, WithinAbs(0.1583333, 1e-7));
    CHECK(m.metric("calibration_slope")->ciMethod == CiMethod::Wald);
    // Wald interval of the slope: b ± 1.959964·SE (SE from statsmodels 0.13.5, see the fit tests).
    CHECK_THAT(*m.metric("calibration_slope")->lower, WithinAbs(0.5024740 - 1.959963984540054 * 0.38537464, 1e-6));
    CHECK(m.hosmerLemeshow->groups == 10);
    CHECK(m.thresholds.size() == 3);
    CHECK(m.metrics.size() == 15);
    for (const auto& entry : m.metrics)
        CHECK_FALSE(entry.reading.empty());
}

TEST_CASE("Every metric key of the interface is in the JSON and undefined values are null", "[panel][json]")
{
    CheckData data = toy20A();
    data.p[3] = 0.0; // an event predicted with certainty not to happen: log loss infinite
    const ValidationResult result = runValidation(cohortOf(data), PanelSettings{});
    const auto json = modelsJson(result);
    const auto& metrics = json.at(0).at("metrics");
    for (const char* key : {"c_statistic", "auprc", "brier", "scaled_brier", "log_loss", "nagelkerke_r2",
                            "discrimination_slope", "oe_ratio", "calibration_intercept", "calibration_slope",
                            "recalibration_intercept", "ici", "e50", "e90", "emax"})
        CHECK(metrics.contains(key));
    CHECK(metrics.at("log_loss").at("estimate").is_null());
    CHECK(mentions(result.warnings, "log loss and Nagelkerke R2 are infinite"));
    CHECK(mentions(result.warnings, "1 patients have a predicted risk within 1e-12 of 0 or 1 that their outcome contradicts"));
    CHECK(json.dump().find("NaN") == std::string::npos);
}

TEST_CASE("A risk of 0 contradicted by an event leaves the calibration fits as if that patient were absent", "[panel][calibration]")
{
    // Toy-20 (check_datasets.hpp) with patient 4, an event, given a risk of 0, 1e-15, or 0 reached
    // through a logit of -800: the calibration intercept, slope and the likelihood-ratio tests
    // equal those of the 19 other patients, whatever the rounding (they no longer depend on the clip).
    CheckData reference = toy20A();
    REQUIRE(reference.y[3] == 1);
    CheckData without = reference;
    without.y.erase(without.y.begin() + 3);
    without.p.erase(without.p.begin() + 3);
    const ValidationResult expected = runValidation(cohortOf(without), PanelSettings{});
    for (const double risk : {0.0, 1e-15, 1.0 / (1.0 + std::exp(800.0))}) {
        CheckData data = reference;
        data.p[3] = risk;
        const ValidationResult result = runValidation(cohortOf(data), PanelSettings{});
        const ModelValidation& m = result.models.at(0);
        const ModelValidation& e = expected.models.at(0);
        for (const char* key : {"calibration_intercept", "calibration_slope", "recalibration_intercept"}) {
            INFO(key << " at risk " << risk);
            REQUIRE(m.metric(key)->value);
            CHECK_THAT(*m.metric(key)->value, WithinAbs(*e.metric(key)->value, 1e-10));
            CHECK_THAT(*m.metric(key)->upper, WithinAbs(*e.metric(key)->upper, 1e-10));
        }
        REQUIRE(m.likelihoodRatio);
        CHECK_THAT(m.likelihoodRatio->slopeGivenIntercept->pValue, WithinAbs(e.likelihoodRatio->slopeGivenIntercept->pValue, 1e-10));
        CHECK_THAT(m.likelihoodRatio->joint->pValue, WithinAbs(e.likelihoodRatio->joint->pValue, 1e-10));
        CHECK(mentions(result.warnings, "left out of calibration-in-the-large"));
    }
    // A risk of 1e-18 agreeing with its outcome (a non-event) is kept and not called contradicted.
    CheckData agreeing = reference;
    const auto nonEvent = std::find(agreeing.y.begin(), agreeing.y.end(), std::uint8_t{0}) - agreeing.y.begin();
    agreeing.p[std::size_t(nonEvent)] = 1e-18;
    const ValidationResult kept = runValidation(cohortOf(agreeing), PanelSettings{});
    CHECK_FALSE(mentions(kept.warnings, "contradicts"));
    CHECK(mentions(kept.warnings, "that their outcome agrees with"));
}

TEST_CASE("A points score gets discrimination only with a warning", "[panel]")
{
    const ValidationResult result = runValidation(cohortOf(hm109(), ScoreScale::Points), PanelSettings{});
    const ModelValidation& m = result.models.at(0);
    CHECK_THAT(*m.metric("c_statistic")->value, WithinAbs(1321.0 / 1479.0, 1e-12));
    CHECK_FALSE(m.metric("calibration_slope")->value);
    CHECK_FALSE(m.metric("brier")->value);
    CHECK_FALSE(m.metric("discrimination_slope")->value);
    CHECK(m.thresholds.empty());
    CHECK(m.riskGroups.empty());
    CHECK(mentions(result.warnings, "points scale"));
}

TEST_CASE("Equal scores and separation leave the undefined values empty with reasons", "[panel]")
{
    CheckData equal = toy20A();
    std::fill(equal.p.begin(), equal.p.end(), 0.3);
    const ValidationResult flatResult = runValidation(cohortOf(equal), PanelSettings{});
    const ModelValidation& flat = flatResult.models.at(0);
    CHECK(*flat.metric("c_statistic")->value == 0.5);
    CHECK_FALSE(flat.metric("calibration_slope")->value);
    CHECK(flat.metric("calibration_intercept")->value);
    CHECK_FALSE(flat.metric("ici")->value);
    CHECK(mentions(flat.warnings, "calibration slope cannot be estimated"));
    CHECK(mentions(flat.warnings, "at least 10 distinct risks"));
    CHECK(mentions(flat.warnings, "risk groups could be formed"));

    CheckData separated = toy20A();
    for (std::size_t i = 0; i < separated.p.size(); ++i)
        separated.p[i] = separated.y[i] ? 0.6 + 0.01 * double(i) : 0.1 + 0.01 * double(i);
    const ValidationResult result = runValidation(cohortOf(separated), PanelSettings{});
    const ModelValidation& sep = result.models.at(0);
    CHECK(*sep.metric("c_statistic")->value == 1.0);
    CHECK_FALSE(sep.metric("c_statistic")->lower);
    CHECK_FALSE(sep.metric("calibration_slope")->value);
    CHECK(mentions(result.warnings, "above 0.85"));
    CHECK(mentions(result.warnings, "smaller outcome class")); // 8 events
}

TEST_CASE("Results do not depend on the number of threads", "[panel]")
{
    Cohort cohort = cohortOf(gen1000());
    cohort.models.push_back({"second", toy20A().p});
    cohort.models.back().values.resize(1000, 0.2);
    cohort.models.push_back({"third", gen1000().p});
    const auto one = modelsJson(runValidation(cohort, PanelSettings{}, 1)).dump();
    const auto two = modelsJson(runValidation(cohort, PanelSettings{}, 2)).dump();
    const auto four = modelsJson(runValidation(cohort, PanelSettings{}, 4)).dump();
    CHECK(one == two);
    CHECK(one == four);
}

TEST_CASE("Readings follow the interval not just the estimate", "[panel]")
{
    const ValidationResult result = runValidation(cohortOf(gen1000()), PanelSettings{});
    const ModelValidation& gen = result.models.at(0);
    // Gen-1000's slope is 0.80 with an interval below 1 (statsmodels 0.13.5; docs/methods.md §7): too extreme.
    REQUIRE(gen.metrics[CalibrationSlope].key == "calibration_slope");
    CHECK(gen.metrics[CalibrationSlope].reading.find("too extreme") != std::string::npos);
    REQUIRE(gen.metrics[OeRatio].key == "oe_ratio"); // interval 0.85-1.03 includes 1
    CHECK(gen.metrics[OeRatio].reading.find("consistent") != std::string::npos);
}

TEST_CASE("Operating points on the slider grid equal the threshold metrics at the same thresholds", "[panel]")
{
    const ValidationResult result = runValidation(cohortOf(gen1000()), PanelSettings{});
    const ModelValidation& m = result.models.at(0);
    REQUIRE(m.operatingPoints.size() == 201);
    // Gen-1000 at t = 0.1, 0.2, 0.3 (computed with numpy; docs/methods.md §14): TP 282/247/214, FP 550/369/259.
    const std::size_t tp[3] = {282, 247, 214}, fp[3] = {550, 369, 259};
    for (int k = 0; k < 3; ++k) {
        const OperatingPoint& point = m.operatingPoints[static_cast<std::size_t>(20 * (k + 1))];
        CHECK_THAT(point.threshold, WithinAbs(0.1 * (k + 1), 1e-12));
        CHECK(point.tp == tp[k]);
        CHECK(point.fp == fp[k]);
        CHECK(point.tp + point.fn == 299);
    }
    std::size_t total = 0;
    for (std::size_t b = 0; b < 50; ++b)
        total += m.riskDistribution.events[b] + m.riskDistribution.nonEvents[b];
    CHECK(total == 1000);
}

TEST_CASE("An operating point summary matches the Toy-20 threshold table", "[panel]")
{
    // Computed with numpy (docs/methods.md §14), t = 0.3: TP 6, FP 5, FN 2, TN 7; NB 0.192857, treat all 0.142857.
    const OperatingPointSummary s = summarise(OperatingPoint{0.3, 6, 5, 7, 2});
    CHECK_THAT(*s.sensitivity, WithinAbs(0.75, 1e-12));
    CHECK_THAT(*s.specificity, WithinAbs(7.0 / 12.0, 1e-12));
    CHECK_THAT(*s.ppv, WithinAbs(6.0 / 11.0, 1e-12));
    CHECK_THAT(*s.npv, WithinAbs(7.0 / 9.0, 1e-12));
    CHECK_THAT(s.flagRate, WithinAbs(0.55, 1e-12));
    CHECK_THAT(s.netBenefit, WithinAbs(0.192857, 5e-7));
    CHECK_THAT(s.netBenefitTreatAll, WithinAbs(0.142857, 5e-7));
    CHECK_FALSE(summarise(OperatingPoint{0.99, 0, 0, 12, 8}).ppv);
}
