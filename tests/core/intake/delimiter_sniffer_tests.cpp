#include "intake/delimiter_sniffer.hpp"

#include <catch2/catch.hpp>

using plumbline::sniffDelimiter;

TEST_CASE("The delimiter is sniffed among comma semicolon tab and pipe", "[sniff]")
{
    CHECK(sniffDelimiter("a,b,c\n1,2,3\n") == ',');
    CHECK(sniffDelimiter("a;b;c\n0,1;0,2;1\n") == ';');
    CHECK(sniffDelimiter("a\tb\n1\t2\n") == '\t');
    CHECK(sniffDelimiter("a|b\n1|2\n") == '|');
}

TEST_CASE("Delimiters inside quoted fields do not fool the sniffer", "[sniff]")
{
    CHECK(sniffDelimiter("name;score\n\"Smith, J\";0.2\n\"Doe, A\";0.3\n") == ';');
}

TEST_CASE("Decimal commas in a semicolon file do not make it comma-delimited", "[sniff]")
{
    // Comma splits the rows into differing counts; semicolon splits every row like the header.
    CHECK(sniffDelimiter("outcome;score\n1;0,25\n0;0,5\n1;1\n") == ';');
}

TEST_CASE("A single-column text has no delimiter to sniff", "[sniff]")
{
    CHECK_FALSE(sniffDelimiter("just one column\nvalue\n").has_value());
}
