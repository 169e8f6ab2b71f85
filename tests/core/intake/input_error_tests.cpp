#include "intake/input_error.hpp"

#include <catch2/catch.hpp>

using namespace plumbline;

TEST_CASE("A database's message over several lines and without a full stop reads as one sentence", "[intake]")
{
    InputError error;
    error.file = "postgresql://analyst@warehouse/quality";
    error.problem = "the query failed: ERROR:  syntax error at or near \"SELEC\"\nLINE 1: SELEC 1\n        ^\n";
    error.remedy = "correct the query.";
    CHECK(error.message()
          == "postgresql://analyst@warehouse/quality: the query failed: ERROR: syntax error at or near \"SELEC\" LINE 1: SELEC 1 ^. "
             "What to do: correct the query.");
    error.problem = "near \"SELEC\": syntax error";
    CHECK(error.message().find("syntax error. What to do:") != std::string::npos);
    error.problem = "the file is empty.";
    CHECK(error.message().find("empty. What to do:") != std::string::npos);
}
