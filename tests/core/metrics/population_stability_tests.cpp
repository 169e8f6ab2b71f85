#include "metrics/population_stability.hpp"

#include <catch2/catch.hpp>

using namespace plumbline;
using Catch::Matchers::WithinAbs;

namespace {

const std::vector<double> reference{0.02, 0.05, 0.07, 0.08, 0.10, 0.11, 0.12, 0.12, 0.13, 0.15, 0.16, 0.18, 0.19,
                                    0.21, 0.22, 0.24, 0.25, 0.27, 0.30, 0.33, 0.35, 0.38, 0.41, 0.45, 0.50};

} // namespace

TEST_CASE("The population stability index matches numpy's computation", "[monitoring]")
{
    // Expected values from tests/reference/psi_reference.py: numpy 1.24 (Debian 12,
    // /usr/bin/python3) numpy.quantile (linear), numpy.searchsorted(side='left'), shares floored at 1e-4.
    const auto edges = decileEdges(reference);
    const double expectedEdges[9] = {0.074, 0.108, 0.122, 0.156, 0.19, 0.228, 0.266, 0.334, 0.398};
    REQUIRE(edges.size() == 9);
    for (std::size_t k = 0; k < 9; ++k)
        CHECK_THAT(edges[k], WithinAbs(expectedEdges[k], 1e-12));
    const std::vector<double> shifted{0.04, 0.09, 0.12, 0.14, 0.17, 0.20, 0.23, 0.26, 0.29, 0.31,
                                      0.34, 0.37, 0.40, 0.44, 0.48, 0.52, 0.55, 0.60, 0.66, 0.72};
    CHECK_THAT(populationStabilityIndex(edges, reference, shifted), WithinAbs(0.575833319876, 1e-10));
    // Nine empty bins: the floor of 0.0001 keeps the index finite (and large).
    CHECK_THAT(populationStabilityIndex(edges, reference, {0.55, 0.60, 0.70, 0.80}), WithinAbs(7.936735147498, 1e-9));
    CHECK_THAT(populationStabilityIndex(edges, reference, reference), WithinAbs(0.0, 1e-15));
}

TEST_CASE("The population stability bands are 0.1 and 0.25 (common practice)", "[monitoring]")
{
    CHECK(std::string(psiBand(0.099)) == "little");
    CHECK(std::string(psiBand(0.1)) == "moderate");
    CHECK(std::string(psiBand(0.249)) == "moderate");
    CHECK(std::string(psiBand(0.25)) == "large");
}
