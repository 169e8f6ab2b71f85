#include "analyses/site_pooling.hpp"

#include "metrics/discrimination.hpp"
#include "metrics/distributions.hpp"
#include "metrics/logistic_recalibration.hpp"

#include <algorithm>
#include <cmath>
#include <numeric>

namespace plumbline {

namespace {

constexpr const char* missingLevel = "(missing)";
constexpr std::size_t mostLeftOutNotes = 20;

double expit(double x)
{
    return 1.0 / (1.0 + std::exp(-x));
}

// A site's rows, as the outcome and each model's scores gathered together.
struct SiteRows {
    std::string name;
    std::vector<std::uint8_t> outcome;
    std::vector<std::vector<double>> scores; // per model
};

std::vector<SiteRows> gatherSites(const Cohort& cohort, const CategoricalColumn& cluster, std::size_t& missingRows)
{
    std::vector<std::uint32_t> codes(cluster.levels.size());
    std::iota(codes.begin(), codes.end(), 0u);
    // Sites in name order, as the subgroups list their levels.
    std::sort(codes.begin(), codes.end(), [&](auto a, auto b) { return cluster.levels[a] < cluster.levels[b]; });
    std::vector<std::size_t> slot(cluster.levels.size(), SIZE_MAX);
    std::vector<SiteRows> sites;
    for (const std::uint32_t code : codes) {
        if (cluster.levels[code] == missingLevel)
            continue;
        slot[code] = sites.size();
        sites.push_back({cluster.levels[code], {}, std::vector<std::vector<double>>(cohort.models.size())});
    }
    missingRows = 0;
    for (std::size_t i = 0; i < cohort.rows(); ++i) {
        const std::size_t s = slot[cluster.codes[i]];
        if (s == SIZE_MAX) {
            ++missingRows;
            continue;
        }
        sites[s].outcome.push_back(cohort.outcome[i]);
        for (std::size_t m = 0; m < cohort.models.size(); ++m)
            sites[s].scores[m].push_back(cohort.models[m].values[i]);
    }
    return sites;
}

// Sites below the small-cell rule left out of a measure: one note that counts them.
void addSmallSitesNote(std::vector<std::string>& list, std::size_t small, std::size_t minimumCell)
{
    if (small > 0)
        list.push_back(std::to_string(small) + (small == 1 ? " site" : " sites") + " with fewer than " + std::to_string(minimumCell)
                       + " patients (not named: small-cell rule).");
}

std::string countOf(std::size_t n, const char* one, const char* many)
{
    return std::to_string(n) + " " + (n == 1 ? one : many);
}

// Warnings on the site column as a whole: a site with no events or only events (most likely an
// extraction fault at that site, so it is named, unless below the small-cell rule, when it is
// counted), and a column whose levels are mostly below the small-cell rule (likely a patient or
// encounter identifier rather than a site: more than half the sites below `minimumCell`).
void siteColumnWarnings(const std::vector<SiteRows>& sites, const std::string& column, std::size_t minimumCell,
                        std::vector<std::string>& warnings)
{
    std::size_t smallOneClass = 0, small = 0;
    for (const SiteRows& site : sites) {
        const std::size_t n = site.outcome.size();
        const std::size_t events = std::accumulate(site.outcome.begin(), site.outcome.end(), std::size_t{0});
        if (n < minimumCell)
            ++small;
        if (events != 0 && events != n)
            continue;
        if (n < minimumCell) {
            ++smallOneClass;
            continue;
        }
        warnings.push_back(site.name + " (" + countOf(n, "patient", "patients") + ") "
                           + (events == 0 ? "has no events" : "has only events (every patient had the event)")
                           + ", so its C and O/E cannot be estimated and it is left out of the pooling: check the outcome "
                             "extraction for that site.");
    }
    if (smallOneClass > 0)
        warnings.push_back(countOf(smallOneClass, "site", "sites") + " with fewer than " + std::to_string(minimumCell)
                           + " patients " + (smallOneClass == 1 ? "has" : "have")
                           + " no events or only events and " + (smallOneClass == 1 ? "is" : "are")
                           + " left out of the pooling (not named: small-cell rule).");
    if (sites.size() >= 2 && 2 * small > sites.size())
        warnings.push_back("Most sites (" + std::to_string(small) + " of " + std::to_string(sites.size()) + ") have fewer than "
                           + std::to_string(minimumCell) + " patients: is '" + column
                           + "' a site column? An identifier of patients or encounters gives one tiny site per value.");
}

std::string measureWords(const std::string& measure)
{
    return measure == "c_statistic" ? "C" : measure == "oe_ratio" ? "O/E" : "the calibration slope";
}

// The τ² caution counts the sites actually pooled for each measure (a site left out of a measure
// does not count), one warning per number of sites.
void pooledCountWarnings(SitePooling& out, const std::string& column)
{
    std::vector<std::pair<std::size_t, std::string>> few;
    std::size_t measures = 0, fewMeasures = 0;
    for (const auto& model : out.models)
        for (const auto& measure : model.measures) {
            ++measures;
            const std::size_t k = measure.sites.size();
            if (k < 2 || k >= fewestSitesForTau2)
                continue;
            ++fewMeasures;
            const std::string what = measureWords(measure.measure) + (out.models.size() > 1 ? " of " + model.model : "");
            auto it = std::find_if(few.begin(), few.end(), [&](const auto& f) { return f.first == k; });
            if (it == few.end())
                few.emplace_back(k, what);
            else
                it->second += ", " + what;
        }
    if (few.size() == 1 && fewMeasures == measures) // the same number for every measure: said once, shortly
        few[0].second = "every measure";
    for (const auto& [k, what] : few)
        out.warnings.push_back("Only " + std::to_string(k) + " sites of column '" + column + "' pooled for " + what
                               + ": the between-site variance τ² is poorly estimated below 5 sites (common practice), so the "
                                 "pooled intervals and the prediction interval are uncertain.");
}

PooledMeasure pooledMeasure(std::string measure, std::string scale, std::vector<SiteEstimate> sites, std::vector<std::string> leftOut,
                            std::size_t sitesLeftOut, double confidence)
{
    PooledMeasure out;
    out.measure = std::move(measure);
    out.scale = std::move(scale);
    out.sites = std::move(sites);
    out.leftOut = std::move(leftOut);
    out.sitesLeftOut = sitesLeftOut;
    if (out.sites.size() < 2)
        return out;
    std::vector<double> y, v;
    for (const auto& s : out.sites) {
        y.push_back(s.pooledScale);
        v.push_back(s.se * s.se);
    }
    out.pool = poolRandomEffects(y, v, confidence);
    const auto back = [&](double x) { return out.scale == "logit" ? expit(x) : out.scale == "log" ? std::exp(x) : x; };
    out.pooled = back(out.pool->pooled);
    out.hksjLower = back(out.pool->hksjLower);
    out.hksjUpper = back(out.pool->hksjUpper);
    out.hksjUnmodifiedLower = back(out.pool->hksjUnmodifiedLower);
    out.hksjUnmodifiedUpper = back(out.pool->hksjUnmodifiedUpper);
    if (out.pool->predictionLower) {
        out.predictionLower = back(*out.pool->predictionLower);
        out.predictionUpper = back(*out.pool->predictionUpper);
    }
    return out;
}

} // namespace

SiteMeasures measureSite(std::span<const std::uint8_t> outcome, std::span<const double> scores, ScoreScale scale)
{
    SiteMeasures out;
    const std::size_t n = outcome.size();
    const std::size_t events = std::accumulate(outcome.begin(), outcome.end(), std::size_t{0});
    if (events < 2 || n - events < 2) {
        out.cProblem = "fewer than 2 events or non-events";
    } else {
        // DeLong SE of C, moved to the logit scale by the delta method: SE/(C(1 − C)) (§4, §20).
        const Estimate c = cStatistic(outcome, scores, CStatisticScale::Logit, 0.95);
        if (!c.value || !c.se || *c.value <= 0.0 || *c.value >= 1.0 || !(*c.se > 0.0))
            out.cProblem = "C is 0 or 1, so its logit is undefined";
        else {
            out.logitC = std::log(*c.value / (1.0 - *c.value));
            out.logitCSe = *c.se / (*c.value * (1.0 - *c.value));
        }
    }
    if (!scaleIsProbabilistic(scale)) {
        out.oeProblem = out.slopeProblem = "the scores are points, not risks";
        return out;
    }
    const double expected = std::accumulate(scores.begin(), scores.end(), 0.0);
    if (events == 0)
        out.oeProblem = "no events, so log O/E is undefined";
    else if (events == n)
        out.oeProblem = "every patient had the event, so log O/E has no variance";
    else if (!(expected > 0.0))
        out.oeProblem = "every risk is 0";
    else {
        // SE(ln O/E) = √(1/O − 1/N), as the panel's O/E interval (§8).
        out.logOe = std::log(double(events) / expected);
        out.logOeSe = std::sqrt(1.0 / double(events) - 1.0 / double(n));
    }
    if (events == 0 || events == n) {
        out.slopeProblem = "one outcome class only";
        return out;
    }
    const std::vector<double> lp = clampedLogits(scores);
    std::vector<std::uint8_t> included(n);
    for (std::size_t i = 0; i < n; ++i)
        included[i] = contradictsOutcome(scores[i], outcome[i] != 0) ? 0 : 1;
    if (const auto fit = fitCalibrationSlope(outcome, lp, included); fit && fit->slopeSe > 0.0 && std::isfinite(fit->slopeSe)) {
        out.slope = fit->slope;
        out.slopeSe = fit->slopeSe;
    } else {
        out.slopeProblem = "the slope cannot be fitted (separation, or one risk for every patient)";
    }
    return out;
}

SitePooling analyseSites(const Cohort& cohort, const CategoricalColumn& cluster, const PanelSettings& settings)
{
    SitePooling out;
    out.column = cluster.name;
    out.criteria = settings.acceptable;
    const std::vector<SiteRows> sites = gatherSites(cohort, cluster, out.missingRows);
    out.sites = sites.size();
    if (out.missingRows > 0)
        out.warnings.push_back(std::to_string(out.missingRows) + " rows have no value in the site column '" + cluster.name
                               + "' and are left out of the pooling across sites.");
    if (sites.size() < 2)
        out.warnings.push_back("Pooling across sites needs at least 2 sites in column '" + cluster.name + "'; it has "
                               + std::to_string(sites.size()) + ".");
    siteColumnWarnings(sites, cluster.name, settings.minimumCell, out.warnings);
    const double z = zForConfidence(settings.confidence);
    for (std::size_t m = 0; m < cohort.models.size(); ++m) {
        ModelSitePooling model;
        model.model = cohort.models[m].name;
        std::vector<SiteEstimate> c, oe, slope;
        std::vector<std::string> cOut, oeOut, slopeOut;
        std::size_t cLeft = 0, oeLeft = 0, slopeLeft = 0, cSmall = 0, oeSmall = 0, slopeSmall = 0;
        for (const SiteRows& site : sites) {
            const std::size_t n = site.outcome.size();
            const std::size_t events = std::accumulate(site.outcome.begin(), site.outcome.end(), std::size_t{0});
            const SiteMeasures measures = measureSite(site.outcome, site.scores[m], cohort.scale);
            // At most 20 notes a measure: a site column with a site per row must not fill the result.
            // A site below the small-cell rule is counted, never named with its outcomes.
            const auto note = [&](std::vector<std::string>& list, std::size_t& count, std::size_t& small, const std::string& why) {
                ++count;
                if (n < settings.minimumCell) {
                    ++small;
                    return;
                }
                if (list.size() < mostLeftOutNotes)
                    list.push_back(site.name + ": " + why + ".");
                else if (list.size() == mostLeftOutNotes)
                    list.push_back("and other sites.");
            };
            if (measures.logitC)
                c.push_back({site.name, n, events, expit(*measures.logitC), expit(*measures.logitC - z * *measures.logitCSe),
                             expit(*measures.logitC + z * *measures.logitCSe), *measures.logitC, *measures.logitCSe});
            else
                note(cOut, cLeft, cSmall, measures.cProblem);
            if (measures.logOe)
                oe.push_back({site.name, n, events, std::exp(*measures.logOe), std::exp(*measures.logOe - z * *measures.logOeSe),
                              std::exp(*measures.logOe + z * *measures.logOeSe), *measures.logOe, *measures.logOeSe});
            else if (scaleIsProbabilistic(cohort.scale))
                note(oeOut, oeLeft, oeSmall, measures.oeProblem);
            if (measures.slope)
                slope.push_back({site.name, n, events, *measures.slope, *measures.slope - z * *measures.slopeSe,
                                 *measures.slope + z * *measures.slopeSe, *measures.slope, *measures.slopeSe});
            else if (scaleIsProbabilistic(cohort.scale))
                note(slopeOut, slopeLeft, slopeSmall, measures.slopeProblem);
        }
        addSmallSitesNote(cOut, cSmall, settings.minimumCell);
        addSmallSitesNote(oeOut, oeSmall, settings.minimumCell);
        addSmallSitesNote(slopeOut, slopeSmall, settings.minimumCell);
        model.measures.push_back(pooledMeasure("c_statistic", "logit", std::move(c), std::move(cOut), cLeft, settings.confidence));
        if (scaleIsProbabilistic(cohort.scale)) {
            model.measures.push_back(pooledMeasure("oe_ratio", "log", std::move(oe), std::move(oeOut), oeLeft, settings.confidence));
            model.measures.push_back(pooledMeasure("calibration_slope", "identity", std::move(slope), std::move(slopeOut), slopeLeft, settings.confidence));
        }
        model.acceptability = newSiteAcceptability(model.measures, settings.acceptable, settings.simulationSeed);
        out.models.push_back(std::move(model));
    }
    pooledCountWarnings(out, cluster.name);
    return out;
}

} // namespace plumbline
