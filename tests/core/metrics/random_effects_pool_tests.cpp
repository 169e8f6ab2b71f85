// Random-effects pooling against statsmodels 0.13.5 and a scipy 1.10 REML fit: the values are in
// tests/data/random_effects/reference.json, written by tests/reference/random_effects_reference.py
// (ctest re-computes them with --check). Formulas: docs/methods.md §25.
#include "metrics/random_effects_pool.hpp"

#include "test_paths.hpp"

#include <catch2/catch.hpp>
#include <nlohmann/json.hpp>

#include <algorithm>
#include <fstream>

using namespace plumbline;
using Catch::Matchers::WithinAbs;
using Catch::Matchers::WithinRel;

namespace {

nlohmann::json reference()
{
    std::ifstream file(std::string(test::randomEffectsDataDir) + "/reference.json");
    REQUIRE(file);
    return nlohmann::json::parse(file);
}

std::vector<double> numbers(const nlohmann::json& array)
{
    return array.get<std::vector<double>>();
}

} // namespace

TEST_CASE("DerSimonian-Laird tau2 Q I2 and the HKSJ interval match statsmodels combine_effects", "[pooling]")
{
    const nlohmann::json values = reference();
    for (const auto& [name, set] : values.items()) {
        INFO(name);
        const auto y = numbers(set["y"]), v = numbers(set["v"]);
        const auto& dl = set["statsmodels_dl"];
        // statsmodels 0.13.5 combine_effects(method_re="chi2"): tau2 and i2 untruncated, so compared
        // with their truncation at 0 (docs/methods.md §25).
        const double tau2 = derSimonianLairdTau2(y, v);
        CHECK_THAT(tau2, WithinAbs(std::max(0.0, dl["tau2_untruncated"].get<double>()), 1e-12));
        const RandomEffectsPool pool = poolRandomEffects(y, v);
        CHECK_THAT(pool.q, WithinRel(dl["q"].get<double>(), 1e-10));
        CHECK_THAT(pool.i2, WithinAbs(std::max(0.0, dl["i2"].get<double>()), 1e-10));
        CHECK_THAT(pool.tau2DerSimonianLaird, WithinAbs(tau2, 1e-15));
        // With the DL tau2: mean_effect_re, sd_eff_w_re and conf_int(use_t=True)'s ci_eff_re_wls
        // (HKSJ) of statsmodels 0.13.5 (the fixed-effect ones when tau2 truncates to 0).
        const PooledMean mean = pooledMean(y, v, tau2, 0.95);
        CHECK_THAT(mean.mean, WithinRel(dl["mean"].get<double>(), 1e-10));
        CHECK_THAT(mean.se, WithinRel(dl["se"].get<double>(), 1e-10));
        CHECK_THAT(mean.hksjLower, WithinAbs(dl["hksj_lower"].get<double>(), 1e-9));
        CHECK_THAT(mean.hksjUpper, WithinAbs(dl["hksj_upper"].get<double>(), 1e-9));
    }
}

TEST_CASE("REML tau2 the pooled mean HKSJ and the prediction interval match a scipy REML fit", "[pooling]")
{
    const nlohmann::json values = reference();
    for (const auto& [name, set] : values.items()) {
        INFO(name);
        const auto y = numbers(set["y"]), v = numbers(set["v"]);
        const auto& reml = set["scipy_reml"];
        // scipy 1.10 minimize_scalar on the restricted log-likelihood (bounded Brent, xatol 1e-14).
        const RemlFit fit = remlTau2(y, v);
        CHECK(fit.converged);
        CHECK_THAT(fit.tau2, WithinAbs(reml["tau2"].get<double>(), 1e-8));
        const RandomEffectsPool pool = poolRandomEffects(y, v, 0.95);
        CHECK_THAT(pool.pooled, WithinAbs(reml["mean"].get<double>(), 1e-7));
        CHECK_THAT(pool.se, WithinAbs(reml["se"].get<double>(), 1e-7));
        // The reference computes plain HKSJ: the unmodified interval is compared.
        CHECK_THAT(pool.hksjUnmodifiedLower, WithinAbs(reml["hksj_lower"].get<double>(), 1e-6));
        CHECK_THAT(pool.hksjUnmodifiedUpper, WithinAbs(reml["hksj_upper"].get<double>(), 1e-6));
        // Riley, Higgins & Deeks 2011 (BMJ 342:d549) with scipy 1.10 stats.t.ppf(0.975, k − 2).
        REQUIRE(pool.predictionLower);
        CHECK_THAT(*pool.predictionLower, WithinAbs(reml["prediction_lower"].get<double>(), 1e-6));
        CHECK_THAT(*pool.predictionUpper, WithinAbs(reml["prediction_upper"].get<double>(), 1e-6));
    }
}

TEST_CASE("Fewer than five sites warn that tau2 is poorly estimated and two sites give no prediction interval", "[pooling]")
{
    const std::vector<double> y{0.1, 0.5, 0.3}, v{0.01, 0.02, 0.015};
    const RandomEffectsPool three = poolRandomEffects(y, v);
    CHECK(three.predictionLower);
    REQUIRE(three.warnings.size() == 1);
    CHECK(three.warnings[0].find("poorly estimated below 5 sites") != std::string::npos);
    const RandomEffectsPool two = poolRandomEffects(std::span(y).first(2), std::span(v).first(2));
    CHECK_FALSE(two.predictionLower);
    CHECK(two.warnings[0].find("no prediction interval with 2 sites: it needs at least 3") != std::string::npos);
    const std::vector<double> y5{0.1, 0.5, 0.3, 0.2, 0.4}, v5{0.01, 0.02, 0.015, 0.01, 0.01};
    CHECK(poolRandomEffects(y5, v5).warnings.empty());
}

TEST_CASE("Equal within-site variances give the closed-form REML tau2", "[pooling]")
{
    // With every vᵢ = v the REML estimate is max(0, s² − v), s² the sample variance of the yᵢ
    // (Viechtbauer 2005, Stat Med 24:3283, the balanced case; re-derived: hand computation).
    const std::vector<double> y{0.2, 0.9, 0.4, 0.7, 0.1, 0.6}, v(6, 0.01);
    double mean = 0.0, s2 = 0.0;
    for (double x : y)
        mean += x / 6.0;
    for (double x : y)
        s2 += (x - mean) * (x - mean) / 5.0;
    CHECK_THAT(remlTau2(y, v).tau2, WithinAbs(s2 - 0.01, 1e-10));
}

TEST_CASE("When q < 1 the reported HKSJ interval is widened to the plain random-effects interval, the unmodified one kept", "[pooling]")
{
    // Four estimates far closer than their SEs (0.2): equal vᵢ, so τ²_REML = max(0, s² − v) = 0,
    // μ̂ = 0.1, SE = √(1/Σw) = √(0.04/4) = 0.1 (hand computation), and q = Σw(y − μ̂)²/3 < 1.
    const std::vector<double> y{0.1, 0.11, 0.09, 0.1}, v(4, 0.04);
    const RandomEffectsPool pool = poolRandomEffects(y, v, 0.95);
    REQUIRE(pool.tau2Reml == 0.0);
    REQUIRE(pool.hksjSe < pool.se);
    // scipy 1.10 stats.t.ppf(0.975, 3) = 3.182446305284263; max(1, q) modification, Röver, Knapp &
    // Friede 2015 (BMC Med Res Methodol 15:99 — from memory).
    CHECK_THAT(pool.hksjLower, WithinAbs(0.1 - 3.182446305284263 * 0.1, 1e-12));
    CHECK_THAT(pool.hksjUpper, WithinAbs(0.1 + 3.182446305284263 * 0.1, 1e-12));
    CHECK_THAT(pool.hksjUnmodifiedLower, WithinAbs(0.1 - 3.182446305284263 * pool.hksjSe, 1e-12));
    CHECK(pool.hksjUnmodifiedUpper - pool.hksjUnmodifiedLower < pool.hksjUpper - pool.hksjLower);
    // Spread beyond the SEs (q > 1): the two are the same.
    const RandomEffectsPool wide = poolRandomEffects(std::vector<double>{-0.5, 0.2, 0.9, 0.1}, v, 0.95);
    CHECK(wide.hksjSe > wide.se);
    CHECK(wide.hksjLower == wide.hksjUnmodifiedLower);
    CHECK(wide.hksjUpper == wide.hksjUnmodifiedUpper);
}
