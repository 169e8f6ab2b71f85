#include "intake/field_values.hpp"

#include <catch2/catch.hpp>

#include <cmath>

using namespace plumbline;

TEST_CASE("The missing-value tokens are empty NA N/A NULL '.' NaN in any case", "[values]")
{
    for (const char* token : {"", "  ", "NA", "na", "N/A", "n/a", "NULL", "null", ".", "NaN", "nan", " NA "})
        CHECK(isMissingToken(token));
    for (const char* value : {"0", "N", "none", "0.5", "NAN1", "-"})
        CHECK_FALSE(isMissingToken(value));
}

TEST_CASE("Numbers parse with optional sign exponent and surrounding spaces", "[values]")
{
    CHECK(parseNumber("0.25", false) == 0.25);
    CHECK(parseNumber(" -1.5e-3 ", false) == -0.0015);
    CHECK(parseNumber("+2", false) == 2.0);
    CHECK(parseNumber("1e-400", false) == 0.0);
    CHECK(std::isinf(*parseNumber("1e400", false)));
    CHECK(std::isinf(*parseNumber("inf", false)));
    CHECK_FALSE(parseNumber("0.2x", false).has_value());
    CHECK_FALSE(parseNumber("#VALUE!", false).has_value());
    CHECK_FALSE(parseNumber("0x10", false).has_value());
    CHECK_FALSE(parseNumber("++1", false).has_value());
    CHECK_FALSE(parseNumber("1 2", false).has_value());
}

TEST_CASE("With a decimal comma 0 25 reads as 0.25 and a point is refused", "[values]")
{
    CHECK(parseNumber("0,25", true) == 0.25);
    CHECK(parseNumber("12", true) == 12.0);
    CHECK_FALSE(parseNumber("0.25", true).has_value());
    CHECK_FALSE(parseNumber("0,25", false).has_value());
}
