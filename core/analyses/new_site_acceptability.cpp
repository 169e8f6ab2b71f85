// The probability of acceptable performance in a new site, by simulation from the predictive
// distribution (docs/methods.md §26). Declared in analyses/site_pooling.hpp.
#include "analyses/site_pooling.hpp"

#include "resampling/random_stream.hpp"

#include <Eigen/Dense>

#include <algorithm>
#include <cmath>

namespace plumbline {

namespace {

// Whether a draw on the pooled scale meets the measure's criterion.
struct Criterion {
    double low = -INFINITY, high = INFINITY;
};

Criterion criterionFor(const std::string& measure, const AcceptableCriteria& c)
{
    if (measure == "c_statistic")
        return {std::log(c.cMinimum / (1.0 - c.cMinimum)), INFINITY};
    if (measure == "oe_ratio")
        return {std::log(c.oeLow), std::log(c.oeHigh)};
    return {c.slopeLow, c.slopeHigh};
}

// Pearson correlation of two measures' estimates over the sites both have; 0 when undefined.
double siteCorrelation(const PooledMeasure& a, const PooledMeasure& b, const std::vector<std::string>& shared)
{
    std::vector<double> x, y;
    for (const auto& site : shared) {
        for (const auto& s : a.sites)
            if (s.site == site)
                x.push_back(s.pooledScale);
        for (const auto& s : b.sites)
            if (s.site == site)
                y.push_back(s.pooledScale);
    }
    const double n = double(x.size());
    double mx = 0.0, my = 0.0;
    for (std::size_t i = 0; i < x.size(); ++i) {
        mx += x[i] / n;
        my += y[i] / n;
    }
    double sxy = 0.0, sxx = 0.0, syy = 0.0;
    for (std::size_t i = 0; i < x.size(); ++i) {
        sxy += (x[i] - mx) * (y[i] - my);
        sxx += (x[i] - mx) * (x[i] - mx);
        syy += (y[i] - my) * (y[i] - my);
    }
    return sxx > 0.0 && syy > 0.0 ? sxy / std::sqrt(sxx * syy) : 0.0;
}

} // namespace

NewSiteAcceptability newSiteAcceptability(const std::vector<PooledMeasure>& measures, const AcceptableCriteria& criteria,
                                          std::uint64_t seed, std::size_t draws)
{
    NewSiteAcceptability out;
    out.seed = seed;
    std::vector<const PooledMeasure*> used;
    for (const auto& m : measures) {
        if (m.pool && m.pool->predictionLower)
            used.push_back(&m);
        else
            out.notes.push_back(m.measure + " is not simulated: it needs a prediction interval, so at least 3 sites with an estimate.");
    }
    if (used.empty())
        return out;
    const std::size_t d = used.size();
    std::size_t fewestSites = SIZE_MAX;
    for (const auto* m : used) {
        out.measures.push_back(m->measure);
        fewestSites = std::min(fewestSites, m->sites.size());
    }
    out.degreesOfFreedom = int(fewestSites) - 2;
    // Beyond this the t is the normal to four decimals of a probability, and a χ² of so many
    // squares per draw would cost minutes with a site per row.
    constexpr int mostDegreesOfFreedom = 1000;
    const bool normalLimit = out.degreesOfFreedom > mostDegreesOfFreedom;
    if (normalLimit)
        out.notes.push_back("With more than 1000 degrees of freedom the t distribution is taken as the normal.");
    // The sites every simulated measure has: the between-site correlation is estimated on them.
    std::vector<std::string> shared;
    for (const auto& s : used[0]->sites) {
        bool everywhere = true;
        for (const auto* m : used)
            everywhere = everywhere && std::any_of(m->sites.begin(), m->sites.end(), [&](const SiteEstimate& e) { return e.site == s.site; });
        if (everywhere)
            shared.push_back(s.site);
    }
    Eigen::MatrixXd correlation = Eigen::MatrixXd::Identity(Eigen::Index(d), Eigen::Index(d));
    if (d > 1 && shared.size() >= fewestSitesForTau2) {
        for (std::size_t i = 0; i < d; ++i)
            for (std::size_t j = i + 1; j < d; ++j)
                correlation(Eigen::Index(i), Eigen::Index(j)) = correlation(Eigen::Index(j), Eigen::Index(i)) =
                    siteCorrelation(*used[i], *used[j], shared);
        out.correlated = true;
    } else if (d > 1) {
        out.notes.push_back("The measures are simulated as independent: their between-site correlation is not estimated from fewer than 5 sites ("
                            + std::to_string(shared.size()) + " sites have every measure).");
    }
    Eigen::LLT<Eigen::MatrixXd> cholesky(correlation);
    if (cholesky.info() != Eigen::Success || !cholesky.matrixL().toDenseMatrix().allFinite()) {
        correlation.setIdentity();
        cholesky.compute(correlation);
        out.correlated = false;
        out.notes.push_back("The site estimates' correlation matrix is singular (a correlation of ±1), so the measures are simulated as independent.");
    }
    const Eigen::MatrixXd lower = cholesky.matrixL();
    out.correlation.assign(d, std::vector<double>(d));
    for (std::size_t i = 0; i < d; ++i)
        for (std::size_t j = 0; j < d; ++j)
            out.correlation[i][j] = correlation(Eigen::Index(i), Eigen::Index(j));
    // Each measure's predictive location and scale: μ̂ and √(τ² + SE²) (Riley et al. 2011).
    std::vector<double> mean(d), scale(d);
    std::vector<Criterion> accept(d);
    for (std::size_t i = 0; i < d; ++i) {
        mean[i] = used[i]->pool->pooled;
        scale[i] = std::sqrt(used[i]->pool->tau2Reml + used[i]->pool->se * used[i]->pool->se);
        accept[i] = criterionFor(used[i]->measure, criteria);
    }
    RandomStream random(seed, 0x5173);
    std::vector<std::size_t> met(d, 0);
    std::size_t allMet = 0;
    std::vector<double> normal(d);
    for (std::size_t draw = 0; draw < draws; ++draw) {
        // A multivariate t: correlated normals divided by √(χ²_df/df), one χ² per draw.
        double chi2 = 0.0;
        for (int k = 0; k < (normalLimit ? 0 : out.degreesOfFreedom); ++k) {
            const double u = random.normal();
            chi2 += u * u;
        }
        const double stretch = normalLimit ? 1.0 : std::sqrt(double(out.degreesOfFreedom) / chi2);
        for (auto& x : normal)
            x = random.normal();
        bool all = true;
        for (std::size_t i = 0; i < d; ++i) {
            double z = 0.0;
            for (std::size_t j = 0; j <= i; ++j)
                z += lower(Eigen::Index(i), Eigen::Index(j)) * normal[j];
            const double value = mean[i] + scale[i] * z * stretch;
            const bool ok = value >= accept[i].low && value <= accept[i].high;
            met[i] += ok ? 1 : 0;
            all = all && ok;
        }
        allMet += all ? 1 : 0;
    }
    out.draws = draws;
    for (std::size_t i = 0; i < d; ++i)
        out.probabilities.push_back(double(met[i]) / double(draws));
    out.joint = double(allMet) / double(draws);
    out.method = "joint simulation from the predictive distribution: " + std::to_string(draws)
        + " draws of a new site's true values (logit C, log O/E, calibration slope) from a multivariate t with " + std::to_string(out.degreesOfFreedom)
        + (out.degreesOfFreedom == 1 ? " degree" : " degrees") + " of freedom (fewest sites − 2), centred on the pooled values, each with scale √(τ² + SE²), "
        + (out.correlated ? "correlated as the site estimates are" : "independent")
        + "; the share of draws meeting each criterion, and all of them";
    return out;
}

} // namespace plumbline
