// The funnel plot's control limits at small expected counts, where the interpolation matters
// most, against scipy. Values from scipy 1.10.1 (Debian 12, /usr/bin/python3):
//   from scipy.stats import poisson
//   def limit(E, p, upper):
//       q = 1 - p if upper else p
//       r = poisson.ppf(q, E); Fr = poisson.cdf(r, E); Fb = poisson.cdf(r - 1, E) if r > 0 else 0.0
//       return max(0.0, r - (Fr - q) / (Fr - Fb)) / E
// The interpolation (r - a)/E with a = (F(r) - q)/(F(r) - F(r - 1)) is that of Spiegelhalter
// (2005), Stat Med 24:1185, appendix (rule from memory; docs/methods.md, subgroups section).
// Larger expected counts and Cochran's Q are checked live on the sample cohort by
// tests/reference/subgroups_vs_scipy.py.
#include "analyses/subgroup_analysis.hpp"

#include <catch2/catch.hpp>

using namespace plumbline;
using Catch::Matchers::WithinAbs;

TEST_CASE("Funnel limits at small expected counts equal the interpolated Poisson quantiles of scipy", "[subgroups][known-answer]")
{
    struct Row {
        double expected, lower95, upper95, lower998, upper998;
    };
    const Row rows[] = {
        {1.0, 0.0, 2.9019486964854146, 0.0, 4.867625595670333},
        {3.0, 0.0, 2.1312800549526294, 0.0, 3.0421683148828134},
        {10.0, 0.3775187947688401, 1.615995067334478, 0.12205293158961342, 2.066200083599499},
        {30.0, 0.6411043088664189, 1.357214897083928, 0.46924158570662333, 1.5937368237615464},
    };
    for (const Row& r : rows) {
        INFO("E = " << r.expected);
        CHECK_THAT(funnelLimit(r.expected, 0.025, false), WithinAbs(r.lower95, 1e-9));
        CHECK_THAT(funnelLimit(r.expected, 0.025, true), WithinAbs(r.upper95, 1e-9));
        CHECK_THAT(funnelLimit(r.expected, 0.001, false), WithinAbs(r.lower998, 1e-9));
        CHECK_THAT(funnelLimit(r.expected, 0.001, true), WithinAbs(r.upper998, 1e-9));
    }
}
