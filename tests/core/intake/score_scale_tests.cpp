#include "intake/score_scale.hpp"

#include <catch2/catch.hpp>

#include <cmath>
#include <vector>

using namespace plumbline;
using Catch::Matchers::WithinAbs;

TEST_CASE("Each scale converts its range and refuses values outside it", "[scale]")
{
    CHECK(convertScore(0.3, ScoreScale::Probability) == 0.3);
    CHECK_FALSE(convertScore(1.2, ScoreScale::Probability));
    CHECK_FALSE(convertScore(-0.01, ScoreScale::Probability));
    CHECK(convertScore(25.0, ScoreScale::Percent) == 0.25);
    CHECK_FALSE(convertScore(100.5, ScoreScale::Percent));
    // expit(0) = 0.5 and expit(ln 3) = 0.75 by the definition of the logistic function.
    CHECK_THAT(*convertScore(0.0, ScoreScale::Logit), WithinAbs(0.5, 1e-15));
    CHECK_THAT(*convertScore(std::log(3.0), ScoreScale::Logit), WithinAbs(0.75, 1e-15));
    CHECK(convertScore(17.0, ScoreScale::Points) == 17.0);
}

TEST_CASE("The suggested scale fits the values", "[scale]")
{
    CHECK(suggestScale(std::vector<double>{12.5, 30.25, 87.0, 4.75}).scale == ScoreScale::Percent);
    CHECK(suggestScale(std::vector<double>{-2.3, 0.4, -1.1, 1.7}).scale == ScoreScale::Logit);
    CHECK(suggestScale(std::vector<double>{0, 3, 7, 12, 19}).scale == ScoreScale::Points);
    CHECK(suggestScale(std::vector<double>{120.5, 4000.25}).scale == ScoreScale::Points);
}

TEST_CASE("Scale names round-trip", "[scale]")
{
    for (ScoreScale s : {ScoreScale::Probability, ScoreScale::Percent, ScoreScale::Logit, ScoreScale::Points})
        CHECK(scaleFromName(scaleName(s)) == s);
    CHECK_FALSE(scaleFromName("odds"));
}
