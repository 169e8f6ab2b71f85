#include "intake/column_suggest.hpp"

#include <catch2/catch.hpp>

using plumbline::closestColumnNames;

TEST_CASE("Typos case and partial names find the intended column first", "[suggest]")
{
    const std::vector<std::string> header{"encounter_id", "supplier_score", "local_score", "readmitted_30d"};
    CHECK(closestColumnNames("suplier_score", header).front() == "supplier_score");
    CHECK(closestColumnNames("READMITTED_30D", header).front() == "readmitted_30d");
    CHECK(closestColumnNames("readmitted", header).front() == "readmitted_30d");
    CHECK(closestColumnNames("zzzzzz", header).empty());
}
