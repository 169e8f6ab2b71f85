#pragma once

#include "intake/acceptable_criteria.hpp"
#include "intake/cohort.hpp"
#include "analyses/panel_settings.hpp"
#include "metrics/random_effects_pool.hpp"

#include <cstddef>
#include <cstdint>
#include <optional>
#include <string>
#include <vector>

namespace plumbline {

// One site's estimate of one measure: `estimate`, `lower`, `upper` on the measure's own scale
// (C, O/E, slope), `pooledScale` and `se` on the scale it is pooled on (logit C, log O/E, slope).
struct SiteEstimate {
    std::string site;
    std::size_t n = 0;
    std::size_t events = 0;
    double estimate = 0.0, lower = 0.0, upper = 0.0;
    double pooledScale = 0.0, se = 0.0;
};

// One measure pooled across sites, with each site's estimate kept for a forest plot. The
// pooled values are back-transformed to the measure's scale (expit for C, exp for O/E).
struct PooledMeasure {
    std::string measure;   // "c_statistic", "oe_ratio" or "calibration_slope"
    std::string scale;     // what is pooled: "logit", "log" or "identity"
    std::vector<SiteEstimate> sites;
    std::vector<std::string> leftOut; // a note per site left out, saying why (the first 20, then "and other sites.")
    std::size_t sitesLeftOut = 0;
    std::optional<RandomEffectsPool> pool; // on the pooled scale; none with fewer than 2 sites
    std::optional<double> pooled, hksjLower, hksjUpper, predictionLower, predictionUpper;
    std::optional<double> hksjUnmodifiedLower, hksjUnmodifiedUpper; // without the max(1, q) scaling (§25)
};

// The probability that a new site's true performance meets the criteria, each measure's own and
// all at once, by simulation from the predictive distribution (docs/methods.md §26).
struct NewSiteAcceptability {
    std::vector<std::string> measures;        // those simulated (with a prediction interval)
    std::vector<double> probabilities;        // each measure's own, in that order
    std::optional<double> joint;              // all of them at once; none with no measure
    std::size_t draws = 0;
    std::uint64_t seed = 0;
    int degreesOfFreedom = 0;                 // of the multivariate t
    bool correlated = false;                  // between-site correlation used (else assumed 0)
    std::vector<std::vector<double>> correlation; // as used, measures × measures
    std::string method;
    std::vector<std::string> notes;
};

struct ModelSitePooling {
    std::string model;
    std::vector<PooledMeasure> measures;
    NewSiteAcceptability acceptability;
};

// Performance per site and pooled across sites by random-effects meta-analysis (Debray et al.
// 2017, BMJ 356:i6460 on meta-analysis of prediction model performance; Riley, Higgins & Deeks
// 2011, BMJ 342:d549 on the prediction interval).
struct SitePooling {
    std::string column;
    std::size_t sites = 0;               // levels other than "(missing)"
    std::size_t missingRows = 0;          // rows without a site, left out of the pooling
    AcceptableCriteria criteria;
    std::vector<ModelSitePooling> models;
    std::vector<std::string> warnings;
};

// Draws for the probability of acceptable performance (a Monte Carlo SE of at most 0.0016).
inline constexpr std::size_t acceptabilityDraws = 100000;

// The measures of one site for one model's risks (probabilities) or scores (points: C only).
// A measure that cannot be estimated on the site's rows is left out with its reason.
struct SiteMeasures {
    std::optional<double> logitC, logitCSe, logOe, logOeSe, slope, slopeSe;
    std::string cProblem, oeProblem, slopeProblem;
};
SiteMeasures measureSite(std::span<const std::uint8_t> outcome, std::span<const double> scores, ScoreScale scale);

// Every model pooled over the levels of `cluster` (whose "(missing)" level is left out).
SitePooling analyseSites(const Cohort& cohort, const CategoricalColumn& cluster, const PanelSettings& settings);

// The probability of acceptability for pooled measures (those with a prediction interval), with
// the between-site correlation of their site estimates when at least 5 sites share them.
NewSiteAcceptability newSiteAcceptability(const std::vector<PooledMeasure>& measures, const AcceptableCriteria& criteria,
                                          std::uint64_t seed, std::size_t draws = acceptabilityDraws);

} // namespace plumbline
