#include "metrics/metric_reading.hpp"

#include <catch2/catch.hpp>

using namespace plumbline;

namespace {

Estimate withInterval(double value, double lower, double upper)
{
    return Estimate{value, std::nullopt, lower, upper, CiMethod::Wald};
}

} // namespace

TEST_CASE("The C reading is judged on its interval and names both bands when the interval spans two", "[reading]")
{
    // Bands 0.6 / 0.7 / 0.8 / 0.9 (Hosmer & Lemeshow, Applied Logistic Regression, from memory).
    CHECK(metricReading("c_statistic", withInterval(0.78, 0.74, 0.81)) == "acceptable to excellent discrimination");
    CHECK(metricReading("c_statistic", withInterval(0.72, 0.71, 0.73)) == "acceptable discrimination");
    CHECK(metricReading("c_statistic", withInterval(0.56, 0.48, 0.64)).starts_with("not clearly better than chance"));
}

TEST_CASE("The calibration slope reading says how far from 1", "[reading]")
{
    // 0.8 and 1.25 as the edges of "slightly" (common practice).
    CHECK(metricReading("calibration_slope", withInterval(0.69, 0.65, 0.72)).starts_with("predictions clearly too extreme"));
    CHECK(metricReading("calibration_slope", withInterval(0.95, 0.90, 0.99)).starts_with("predictions slightly too extreme"));
    CHECK(metricReading("calibration_slope", withInterval(1.4, 1.3, 1.5)).starts_with("predictions clearly too moderate"));
    CHECK(metricReading("calibration_slope", withInterval(1.0, 0.9, 1.1)) == "spread of risks consistent with the outcomes");
}

TEST_CASE("Scaled Brier and Nagelkerke R2 readings that disagree say why", "[reading]")
{
    const Estimate brierIncludesZero = withInterval(0.007, -0.010, 0.019);
    const Estimate r2AboveZero = withInterval(0.08, 0.06, 0.10);
    CHECK(overallAccuracyAgreementNote(brierIncludesZero, r2AboveZero).find("weigh errors differently") != std::string::npos);
    CHECK(overallAccuracyAgreementNote(r2AboveZero, r2AboveZero).empty());
}
