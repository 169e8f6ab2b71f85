#include "intake/outcome_coding.hpp"

#include <catch2/catch.hpp>

using namespace plumbline;

namespace {
std::vector<OutcomeLevel> levels(std::initializer_list<const char*> texts)
{
    std::vector<OutcomeLevel> out;
    std::size_t line = 2;
    for (const char* text : texts) {
        std::string folded(text);
        for (char& c : folded)
            c = static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
        out.push_back({text, folded, 10, line++});
    }
    return out;
}
} // namespace

TEST_CASE("Recognised outcome pairs are coded without --event in either order and any case", "[outcome]")
{
    CHECK(codeOutcome(levels({"0", "1"}), std::nullopt, "f", "y")->eventLevel == 1);
    CHECK(codeOutcome(levels({"Yes", "No"}), std::nullopt, "f", "y")->eventLevel == 0);
    CHECK(codeOutcome(levels({"n", "Y"}), std::nullopt, "f", "y")->eventLevel == 1);
    CHECK(codeOutcome(levels({"TRUE", "false"}), std::nullopt, "f", "y")->eventLevel == 0);
}

TEST_CASE("Another two-valued outcome needs --event which is matched case-insensitively", "[outcome]")
{
    const auto unknown = codeOutcome(levels({"readmitted", "home"}), std::nullopt, "f", "y");
    REQUIRE_FALSE(unknown);
    CHECK(unknown.error().remedy.find("--event") != std::string::npos);
    CHECK(codeOutcome(levels({"readmitted", "home"}), std::string("Readmitted"), "f", "y")->eventLevel == 0);
    const auto absent = codeOutcome(levels({"readmitted", "home"}), std::string("died"), "f", "y");
    REQUIRE_FALSE(absent);
    CHECK(absent.error().message().find("'readmitted'") != std::string::npos);
}

TEST_CASE("More than two outcome values are refused with the values listed", "[outcome]")
{
    const auto result = codeOutcome(levels({"yes", "no", "maybe"}), std::nullopt, "cohort.csv", "readmit");
    REQUIRE_FALSE(result);
    const std::string message = result.error().message();
    CHECK(result.error().kind == ErrorKind::UnusableInput);
    CHECK(message.find("cohort.csv") != std::string::npos);
    CHECK(message.find("'readmit'") != std::string::npos);
    CHECK(message.find("'maybe' (10 rows, first on line 4)") != std::string::npos);
}

TEST_CASE("One outcome class only makes the analysis impossible", "[outcome]")
{
    const auto result = codeOutcome(levels({"no"}), std::nullopt, "f", "y");
    REQUIRE_FALSE(result);
    CHECK(result.error().kind == ErrorKind::ImpossibleAnalysis);
}
