#include "files/cohort_simulator.hpp"
#include "intake/column_profile.hpp"
#include "intake/column_roles.hpp"

#include <algorithm>

#include <catch2/catch.hpp>

using namespace plumbline;

namespace {
TableProfile profileOf(std::string text)
{
    auto table = DelimitedTable::open(*TextFile::fromBytes("f.csv", std::move(text)), std::nullopt);
    return *profileColumns(*table);
}

bool hasNote(const ColumnProfile& column, const std::string& fragment)
{
    for (const auto& note : column.notes)
        if (note.find(fragment) != std::string::npos)
            return true;
    return false;
}
} // namespace

TEST_CASE("inspect sniffs each column's type counts and range", "[inspect]")
{
    const auto profile = profileOf("id,y,p,pts,day,site\na,yes,0.2,3,2024-01-05,N\nb,no,0.7,11,2024-03-01,S\nc,NA,0.4,7,2024-02-10,N\n");
    REQUIRE(profile.columns.size() == 6);
    CHECK(profile.rows == 3);
    CHECK(profile.columns[0].type == "text");
    CHECK(hasNote(profile.columns[0], "could be an id"));
    CHECK(profile.columns[1].type == "binary");
    CHECK(profile.columns[1].missing == 1);
    CHECK(profile.columns[2].type == "number");
    CHECK(profile.columns[2].minimum == "0.2");
    CHECK(profile.columns[2].maximum == "0.7");
    CHECK(hasNote(profile.columns[2], "risk score"));
    CHECK(profile.columns[3].type == "integer");
    CHECK(profile.columns[4].type == "date");
    CHECK(profile.columns[4].minimum == "2024-01-05");
    CHECK(profile.columns[5].distinct == 2);
}

TEST_CASE("inspect reports ragged rows and stray text in numeric columns", "[inspect]")
{
    const auto profile = profileOf("y,p\n1,0.2\n0,0.3\n1,oops\n0,0.5\n0\n");
    CHECK(profile.raggedRows == 1);
    CHECK(profile.firstRaggedLine == 6);
    CHECK(hasNote(profile.columns[1], "not numbers (first on line 4: 'oops')"));
}

TEST_CASE("Column roles are guessed from the sample cohort's names and content", "[inspect]")
{
    const auto files = simulateCohort({2000, 3}, false);
    auto table = DelimitedTable::open(*TextFile::fromBytes("s.csv", files.cohort), std::nullopt);
    const auto roles = guessColumnRoles(*profileColumns(*table, 1000));
    CHECK(roles.outcome == "readmitted_30d");
    CHECK(roles.scores == std::vector<std::string>{"supplier_score", "local_score"});
    CHECK(roles.id == "encounter_id");
    CHECK(roles.period == "discharge_date");
    CHECK(std::find(roles.groups.begin(), roles.groups.end(), "hospital") != roles.groups.end());
    CHECK(roles.scale == ScoreScale::Probability);
    const auto preview = previewTable(*table, 5);
    CHECK(preview.rows.size() == 5);
    CHECK(preview.lines.front() == 2);
}

TEST_CASE("A two-valued column that is not outcome-like is never guessed as the outcome", "[inspect]")
{
    const auto files = simulateCohort({2000, 3}, true);
    auto table = DelimitedTable::open(*TextFile::fromBytes("scores.csv", files.scores), std::nullopt);
    const auto roles = guessColumnRoles(*profileColumns(*table, 5000));
    CHECK_FALSE(roles.outcome.has_value()); // sex (F/M) is binary but no outcome
    CHECK(roles.scale == ScoreScale::Probability); // a stray 1.3 is not a percent scale
}

TEST_CASE("A three-valued outcome-named column is neither the outcome nor a pre-ticked subgroup", "[inspect]")
{
    auto table = DelimitedTable::open(*TextFile::fromBytes("three.csv", "readmitted,p,ward\nyes,0.2,A\nno,0.3,B\nmaybe,0.5,A\n"),
                                      std::nullopt);
    const auto roles = guessColumnRoles(*profileColumns(*table, 1000));
    CHECK_FALSE(roles.outcome.has_value());
    CHECK(roles.groups == std::vector<std::string>{"ward"});
}

TEST_CASE("A column named like a site is guessed as the site column, case-insensitive, alone or with _id/_name", "[intake][sites]")
{
    for (const char* name : {"hospital", "Site", "FACILITY", "centre", "center_id", "clinic_name", "Practice_ID", "hospital_id"})
        CHECK(looksLikeSiteColumn(name));
    for (const char* name : {"encounter_id", "hospital_score", "sites", "website", "site_", "_id", "centre_code", "readmitted_30d"})
        CHECK_FALSE(looksLikeSiteColumn(name));
    CHECK(guessSiteColumn({"encounter_id", "score", "Hospital_Name", "site"}) == std::optional<std::string>("Hospital_Name"));
    CHECK_FALSE(guessSiteColumn({"encounter_id", "score", "outcome"}));
    // In a table, "hospital_id" is the site guess and is not taken for the patient id.
    const ColumnRoles roles = guessColumnRoles(profileOf("encounter_id,hospital_id,risk,died\nE1,H1,0.2,0\nE2,H2,0.7,1\nE3,H1,0.4,0\nE4,H2,0.1,1\n"));
    CHECK(roles.site == std::optional<std::string>("hospital_id"));
    CHECK(roles.id == std::optional<std::string>("encounter_id"));
}
