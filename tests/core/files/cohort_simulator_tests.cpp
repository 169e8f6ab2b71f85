#include "files/cohort_simulator.hpp"
#include "support/intake_test_support.hpp"

#include <catch2/catch.hpp>

#include <algorithm>
#include <cmath>

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

TEST_CASE("The sample scenario has five hospitals, a coding shift and a deterioration to find", "[simulate]")
{
    // Coarse checks of the patterns sample-data/README.md states (measured there with pandas and
    // statsmodels by sample-data/measure_truths.py), on the sample cohort's own settings.
    const auto files = simulateCohort({24000, 20240101}, false);
    IntakeSettings settings = settingsFor({"supplier_score", "local_score"}, "readmitted_30d");
    settings.groupColumns = {"hospital", "discharge_date"};
    const auto result = intakeOf(settings, files.cohort);
    REQUIRE(result);
    const Cohort& cohort = result->cohort;
    const CategoricalColumn& hospital = cohort.groups[0];
    const CategoricalColumn& date = cohort.groups[1];
    std::vector<std::string> sites = hospital.levels; // in order of first appearance
    std::sort(sites.begin(), sites.end());
    CHECK(sites == std::vector<std::string>{"Ashford Regional", "Harbour General", "Linnet Hill Memorial",
                                                      "Millbrook Community", "Saltmarsh District"});
    // Sums of outcome, supplier risk and local risk over the rows of one hospital in [from, until).
    struct Sums {
        double n = 0, events = 0, supplier = 0, local = 0;
    };
    auto sums = [&](const std::string& site, const std::string& from, const std::string& until) {
        Sums s;
        for (std::size_t i = 0; i < cohort.rows(); ++i) {
            const std::string& day = date.levels[date.codes[i]];
            if (hospital.levels[hospital.codes[i]] != site || day < from || day >= until)
                continue;
            s.n += 1;
            s.events += cohort.outcome[i];
            s.supplier += cohort.models[0].values[i];
            s.local += cohort.models[1].values[i];
        }
        return s;
    };
    // Coding shift at Linnet Hill from July 2025: the supplier's mean risk rises by more than a
    // tenth against the first half of 2025 while the observed rate stays below the first year's.
    const Sums firstYear = sums("Linnet Hill Memorial", "2024-01-01", "2025-01-01");
    const Sums before = sums("Linnet Hill Memorial", "2025-01-01", "2025-07-01");
    const Sums after = sums("Linnet Hill Memorial", "2025-07-01", "2026-01-01");
    CHECK(after.supplier / after.n > 1.10 * before.supplier / before.n);
    CHECK(after.events / after.n < firstYear.events / firstYear.n);
    CHECK(std::abs(after.local / after.n - before.local / before.n) < 0.01); // the local model does not move
    // Deterioration at Saltmarsh from April to July 2025: observed well above what either score
    // expects in the window, below it before and after.
    const Sums earlier = sums("Saltmarsh District", "2024-01-01", "2025-04-01");
    const Sums window = sums("Saltmarsh District", "2025-04-01", "2025-08-01");
    const Sums later = sums("Saltmarsh District", "2025-08-01", "2026-01-01");
    CHECK(window.events / window.supplier > 1.3);
    CHECK(window.events / window.local > 1.3);
    CHECK(earlier.events / earlier.local < 1.0);
    CHECK(later.events / later.local < 1.0);
}
