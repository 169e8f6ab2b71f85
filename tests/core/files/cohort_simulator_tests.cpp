#include "files/cohort_simulator.hpp"
#include "support/intake_test_support.hpp"

#include <catch2/catch.hpp>

using namespace plumbline;
using namespace plumbline::test;

TEST_CASE("Simulation is deterministic and has one line per row plus the header", "[simulate]")
{
    const auto a = simulateCohort({500, 11}, true);
    const auto b = simulateCohort({500, 11}, true);
    const auto c = simulateCohort({500, 12}, false);
    CHECK(a.cohort == b.cohort);
    CHECK(a.scores == b.scores);
    CHECK(a.outcomes == b.outcomes);
    CHECK(a.cohort != c.cohort);
    CHECK(std::count(a.cohort.begin(), a.cohort.end(), '\n') == 501);
    CHECK(c.scores.empty());
}

TEST_CASE("The simulated scenario carries its stated truths", "[simulate]")
{
    // Coarse checks of the demo's design (sample-data/README.md), not of any statistic:
    // the supplier over-predicts overall, the local score is close on average in year one.
    const auto files = simulateCohort({20000, 5}, false);
    IntakeSettings settings = settingsFor({"supplier_score", "local_score"}, "readmitted_30d");
    settings.groupColumns = {"discharge_date"};
    const auto result = intakeOf(settings, files.cohort);
    REQUIRE(result);
    const Cohort& cohort = result->cohort;
    double supplier = 0.0, local = 0.0;
    for (std::size_t i = 0; i < cohort.rows(); ++i) {
        supplier += cohort.models[0].values[i];
        local += cohort.models[1].values[i];
    }
    const double observed = double(cohort.events());
    CHECK(observed / double(cohort.rows()) > 0.10);
    CHECK(observed / double(cohort.rows()) < 0.20);
    CHECK(observed / supplier < 0.85);
    CHECK(observed / local > 0.85);
}

TEST_CASE("The split files join back to the cohort with every defect accounted for", "[simulate][join]")
{
    const auto files = simulateCohort({3000, 8}, true);
    IntakeSettings settings = settingsFor({"supplier_score", "local_score"}, "readmitted_30d");
    settings.cohortFile = "scores.csv";
    settings.outcomesFile = "outcomes.csv";
    settings.idColumn = "encounter_id";
    const auto result = runIntake(settings, *TextFile::fromBytes("scores.csv", files.scores),
                                  *TextFile::fromBytes("outcomes.csv", files.outcomes));
    REQUIRE(result);
    const IntakeAudit& audit = result->audit;
    CHECK(audit.balances());
    CHECK(audit.join->scoresWithoutOutcome > 0);
    CHECK(audit.join->outcomesWithoutScore > 0);
    CHECK(findTally(audit, ExclusionReason::DuplicateId, "encounter_id") != nullptr);
    CHECK(findTally(audit, ExclusionReason::WrongFieldCount) != nullptr);
    CHECK(audit.rowsUsed > 2900);
}
