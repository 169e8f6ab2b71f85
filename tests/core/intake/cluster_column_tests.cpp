// The site column (--cluster): read like a group column from every source, kept apart from the
// subgroups, and missing columns refused like a missing group column.
#include "intake/typed_table_intake.hpp"

#include "support/intake_test_support.hpp"
#include "support/memory_table.hpp"

#include <catch2/catch.hpp>

using namespace plumbline;
using namespace plumbline::test;

TEST_CASE("The cluster column is dictionary-coded with a missing site as its own level", "[intake][cluster]")
{
    auto settings = settingsFor({"p"});
    settings.clusterColumn = "site";
    const auto result = intakeOf(settings, "y,p,site\n1,0.5,A\n0,NA,Z\n0,0.2,B\n1,0.4,\n0,0.1,A\n");
    REQUIRE(result);
    REQUIRE(result->cohort.cluster);
    const CategoricalColumn& site = *result->cohort.cluster;
    CHECK(site.name == "site");
    CHECK(site.levels == std::vector<std::string>{"A", "B", "(missing)"});
    CHECK(site.codes == std::vector<std::uint32_t>{0, 1, 2, 0});
    CHECK(result->cohort.groups.empty()); // a site column is not also a subgroup unless asked
    CHECK(result->audit.balances());
}

TEST_CASE("A cluster column that is also a group or the period column fills both", "[intake][cluster]")
{
    auto settings = settingsFor({"p"});
    settings.clusterColumn = "site";
    settings.groupColumns = {"site"};
    const auto asGroup = intakeOf(settings, "y,p,site\n1,0.5,A\n0,0.2,B\n");
    REQUIRE(asGroup);
    REQUIRE(asGroup->cohort.cluster);
    REQUIRE(asGroup->cohort.groups.size() == 1);
    CHECK(asGroup->cohort.groups[0].codes == asGroup->cohort.cluster->codes);

    settings.groupColumns.clear();
    settings.periodColumn = "site";
    const auto asPeriod = intakeOf(settings, "y,p,site\n1,0.5,2025-01-02\n0,0.2,2025-01-03\n");
    REQUIRE(asPeriod);
    REQUIRE(asPeriod->cohort.cluster);
    REQUIRE(asPeriod->cohort.period);
    CHECK(asPeriod->cohort.cluster->levels == asPeriod->cohort.period->levels);
    CHECK(asPeriod->cohort.groups.empty());
}

TEST_CASE("A missing cluster column is refused naming the role and the closest column", "[intake][cluster][errors]")
{
    auto settings = settingsFor({"p"});
    settings.clusterColumn = "hospitl";
    const auto result = intakeOf(settings, "y,p,hospital\n1,0.5,A\n0,0.2,B\n");
    REQUIRE_FALSE(result);
    CHECK(result.error().problem == "there is no cluster column of that name.");
    CHECK(result.error().remedy.find("'hospital'") != std::string::npos);
}

TEST_CASE("Joined files read the cluster from the scores file and refuse a missing one", "[intake][cluster][join]")
{
    auto settings = settingsFor({"p"});
    settings.cohortFile = "scores.csv";
    settings.outcomesFile = "outcomes.csv";
    settings.idColumn = "id";
    settings.clusterColumn = "site";
    const auto result = runIntake(settings, *TextFile::fromBytes("scores.csv", "id,p,site\na,0.8,X\nb,0.1,Y\nc,0.3,X\n"),
                                  *TextFile::fromBytes("outcomes.csv", "id,y\nc,0\na,1\nb,0\n"));
    REQUIRE(result);
    REQUIRE(result->cohort.cluster);
    CHECK(result->cohort.cluster->levels == std::vector<std::string>{"X", "Y"});
    CHECK(result->cohort.cluster->codes == std::vector<std::uint32_t>{0, 1, 0});
    settings.clusterColumn = "ward";
    const auto missing = runIntake(settings, *TextFile::fromBytes("scores.csv", "id,p,site\na,0.8,X\n"),
                                   *TextFile::fromBytes("outcomes.csv", "id,y\na,1\n"));
    REQUIRE_FALSE(missing);
    CHECK(missing.error().problem == "there is no cluster column of that name.");
}

TEST_CASE("A typed source gives the cluster as the text a delimited export would hold", "[intake][cluster][typed]")
{
    MemoryTable table("cohort.dta", {{"y", {}}, {"p", {}}, {"site", {}}});
    table.addRow({MemoryTable::number(1), MemoryTable::number(0.5), MemoryTable::number(12)}, 1);
    table.addRow({MemoryTable::number(0), MemoryTable::number(0.2), MemoryTable::missing()}, 2);
    table.addRow({MemoryTable::number(0), MemoryTable::number(0.3), MemoryTable::text("North")}, 3);
    auto settings = settingsFor({"p"});
    settings.cohortFile = "cohort.dta";
    settings.clusterColumn = "site";
    const auto result = runIntake(settings, table);
    REQUIRE(result);
    REQUIRE(result->cohort.cluster);
    CHECK(result->cohort.cluster->levels == std::vector<std::string>{"12", "(missing)", "North"});
    CHECK(result->cohort.cluster->codes == std::vector<std::uint32_t>{0, 1, 2});
    settings.clusterColumn = "ward";
    const auto missing = runIntake(settings, table);
    REQUIRE_FALSE(missing);
    CHECK(missing.error().problem == "there is no cluster column of that name.");
}
