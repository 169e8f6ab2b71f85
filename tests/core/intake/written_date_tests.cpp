#include "intake/written_date.hpp"

#include <catch2/catch.hpp>

using namespace plumbline;
using Shape = WrittenDate::Shape;

namespace {

bool reads(std::string_view text, Shape shape, int year, int first, int second)
{
    const WrittenDate date = readWrittenDate(text);
    return date.shape == shape && date.year == year && date.first == first && date.second == second;
}

} // namespace

TEST_CASE("ISO dates read as year month and day and a time may follow", "[intake][periods]")
{
    CHECK(reads("2025-03-31", Shape::Iso, 2025, 3, 31));
    CHECK(reads("  2024-02-29 ", Shape::Iso, 2024, 2, 29));
    CHECK(reads("2025-06-30T23:59", Shape::Iso, 2025, 6, 30));
    CHECK(reads("2025-06-30 23:59:00", Shape::Iso, 2025, 6, 30));
    CHECK(reads("2025-02-30", Shape::Iso, 2025, 2, 30)); // read as written; whether it exists is the analysis' call
    CHECK(readWrittenDate("2025-06-30x").shape == Shape::Unreadable);
    CHECK(readWrittenDate("2025-6-30").shape == Shape::Unreadable);
}

TEST_CASE("Day-month and month-day dates keep their two numbers in written order", "[intake][periods]")
{
    CHECK(reads("03/04/2025", Shape::Slashed, 2025, 3, 4));
    CHECK(reads("3.4.2025", Shape::Slashed, 2025, 3, 4));
    CHECK(reads("31-12-2025", Shape::Slashed, 2025, 31, 12));
    CHECK(reads("1/01/2025", Shape::Slashed, 2025, 1, 1));
    CHECK(readWrittenDate("03/04/25").shape == Shape::Unreadable);   // a two-digit year
    CHECK(readWrittenDate("2025/03/04").shape == Shape::Unreadable); // year first, but not ISO
    CHECK(readWrittenDate("003/04/2025").shape == Shape::Unreadable);
}

TEST_CASE("Text that is not a date is unreadable", "[intake][periods]")
{
    CHECK(readWrittenDate("").shape == Shape::Unreadable);
    CHECK(readWrittenDate("(missing)").shape == Shape::Unreadable);
    CHECK(readWrittenDate("March 2025").shape == Shape::Unreadable);
    CHECK(readWrittenDate("12/2025").shape == Shape::Unreadable);
}
