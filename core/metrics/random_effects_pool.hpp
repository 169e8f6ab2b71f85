#pragma once

#include <cstddef>
#include <optional>
#include <span>
#include <string>
#include <vector>

namespace plumbline {

// Inverse-variance random-effects pooling of k estimates yᵢ with within-study variances vᵢ
// (one estimate per site): the between-site variance τ² by REML (Viechtbauer 2005, Stat Med
// 24:3283) and by DerSimonian–Laird (1986, Control Clin Trials 7:177) beside it; the pooled
// mean with the REML τ²; the Hartung–Knapp–Sidik–Jonkman interval (IntHout et al. 2014, BMC Med
// Res Methodol 14:25); I² (Higgins & Thompson 2002, Stat Med 21:1539); and the prediction
// interval for a new site (Riley, Higgins & Deeks 2011, BMJ 342:d549).
struct RandomEffectsPool {
    std::size_t sites = 0;
    double pooled = 0.0;              // μ̂ = Σwᵢyᵢ/Σwᵢ, wᵢ = 1/(vᵢ + τ²_REML)
    double se = 0.0;                  // √(1/Σwᵢ), the usual random-effects SE of μ̂
    double tau2Reml = 0.0;
    double tau2DerSimonianLaird = 0.0;
    int remlIterations = 0;
    bool remlConverged = false;
    double q = 0.0;                   // Cochran's Q about the fixed-effect mean
    int df = 0;                       // k − 1
    double i2 = 0.0;                  // max(0, (Q − df)/Q), a proportion
    double hksjSe = 0.0;              // √(Σwᵢ(yᵢ − μ̂)²/((k − 1)Σwᵢ))
    // The reported interval: μ̂ ± t_{k−1}·max(hksjSe, se), i.e. HKSJ with its scale factor
    // q = Σwᵢ(yᵢ − μ̂)²/(k − 1) raised to at least 1, so it is never narrower than the plain
    // random-effects interval (the modification in Röver, Knapp & Friede 2015, BMC Med Res
    // Methodol 15:99 — from memory). The unmodified one is kept beside it.
    double hksjLower = 0.0, hksjUpper = 0.0;
    double hksjUnmodifiedLower = 0.0, hksjUnmodifiedUpper = 0.0;  // μ̂ ± t_{k−1}·hksjSe
    std::optional<double> predictionLower, predictionUpper; // μ̂ ± t_{k−2}·√(τ² + SE²); none when k < 3
    double confidence = 0.95;
    std::vector<std::string> warnings;
};

// Fewest sites for a prediction interval (t with k − 2 df) and below which τ² is said to be
// poorly estimated (common practice).
inline constexpr std::size_t fewestSitesForPrediction = 3;
inline constexpr std::size_t fewestSitesForTau2 = 5;

// τ² by DerSimonian and Laird's method of moments: max(0, (Q − (k − 1))/(Σw − Σw²/Σw)), w = 1/v.
double derSimonianLairdTau2(std::span<const double> y, std::span<const double> v);

// τ² maximising the restricted likelihood, by the Fisher-scoring iteration
// τ² ← Σwᵢ²((yᵢ − μ̂)² − vᵢ)/Σwᵢ² + 1/Σwᵢ truncated at 0 (Viechtbauer 2005, eq. 12), started at
// the DerSimonian–Laird value.
struct RemlFit {
    double tau2 = 0.0;
    int iterations = 0;
    bool converged = false;
};
RemlFit remlTau2(std::span<const double> y, std::span<const double> v);

// The pooled mean, its usual SE and the HKSJ interval for a given τ² (so each piece can be
// checked on its own against a reference library that estimates τ² another way).
struct PooledMean {
    double mean = 0.0, se = 0.0, hksjSe = 0.0, hksjLower = 0.0, hksjUpper = 0.0;
};
PooledMean pooledMean(std::span<const double> y, std::span<const double> v, double tau2, double confidence);

// Everything above for one set of site estimates (k ≥ 2, every vᵢ > 0 and finite).
RandomEffectsPool poolRandomEffects(std::span<const double> y, std::span<const double> v, double confidence = 0.95);

} // namespace plumbline
