#include "analyses/capacity_spec.hpp"

#include <catch2/catch.hpp>

#include <string>

using namespace plumbline;

namespace {
std::string refusal(const std::string& text)
{
    const auto spec = parseCapacity(text, "--capacity");
    return spec ? std::string() : spec.error().message();
}
} // namespace

TEST_CASE("A capacity is read as a share or as a number per day week or month", "[capacity]")
{
    auto share = parseCapacity("10%", "--capacity");
    REQUIRE(share);
    CHECK(share->kind == CapacitySpec::Kind::Share);
    CHECK(share->amount == 10.0);
    auto week = parseCapacity(" 40/week ", "--capacity");
    REQUIRE(week);
    CHECK(week->kind == CapacitySpec::Kind::Rate);
    CHECK(week->amount == 40.0);
    CHECK(week->unitDays() == 7.0);
    CHECK(parseCapacity("8/day", "--capacity")->unitDays() == 1.0);
    // A month is an average month: twelve make 365.25 days (docs/methods.md, Operating by capacity).
    CHECK(parseCapacity("160/month", "--capacity")->unitDays() * 12.0 == 365.25);
    CHECK(parseCapacity("2.5%", "--capacity")->amount == 2.5);
    CHECK(parseCapacity("100%", "--capacity")->amount == 100.0);
    // The analysis file stores the text, which reads back to the same capacity.
    for (const char* text : {"10%", "2.5%", "40/week", "8/day", "160/month", "0.5/day"})
        CHECK(capacityText(*parseCapacity(text, "x")) == text);
    // Spaces are accepted alike before '%' and around '/'.
    for (const char* text : {"10 %", " 10  % ", "10\t%"}) {
        const auto spaced = parseCapacity(text, "--capacity");
        REQUIRE(spaced);
        CHECK(*spaced == *share);
    }
    CHECK(*parseCapacity("40 / week", "--capacity") == *week);
}

TEST_CASE("Bad capacity texts are refused with what was wrong and what to do", "[capacity]")
{
    CHECK(refusal("40/fortnight").find("'fortnight' is none of them") != std::string::npos);
    CHECK(refusal("0%").find("must lie above 0% and at most 100%") != std::string::npos);
    CHECK(refusal("101%").find("must lie above 0% and at most 100%") != std::string::npos);
    CHECK(refusal("-5/week").find("must be a number of patients above 0") != std::string::npos);
    CHECK(refusal("0/week").find("must be a number of patients above 0") != std::string::npos);
    CHECK(refusal("/week").find("has no number before '/'") != std::string::npos);
    CHECK(refusal("ten%").find("'ten' is not one") != std::string::npos);
    CHECK(refusal("40").find("must end in %") != std::string::npos);
    CHECK(refusal("").find("is empty") != std::string::npos);
    CHECK(refusal("1e400/week").find("not one") != std::string::npos);
    CHECK(refusal("nan%").find("not one") != std::string::npos);
    // The bound and the number's form are said alike: the bound in plain digits, which the reader
    // takes, and an exponent named as what is not a plain number.
    CHECK(refusal("0/week").find("at most 1000000000") != std::string::npos);
    CHECK(refusal("0/week").find("1e9") == std::string::npos);
    CHECK(refusal("1e9/day").find("no exponent") != std::string::npos);
    CHECK(refusal("1000000001/day").find("at most 1000000000") != std::string::npos);
    CHECK(parseCapacity("1000000000/day", "--capacity"));
    for (const char* text : {"1e9/day", "40/fortnight", "0%", "-5/week", "101%", "/week"})
        CHECK(refusal(text).find("What to do") != std::string::npos);
}
