#include "intake/input_error.hpp"
#include "intake/printable_text.hpp"

#include <catch2/catch.hpp>

using namespace plumbline;

TEST_CASE("Bidirectional controls are shown not obeyed", "[text]")
{
    // U+202E RIGHT-TO-LEFT OVERRIDE makes "gnp.exe" display as "exe.png" (Unicode UAX #9).
    CHECK(withVisibleBidiControls("report\xE2\x80\xAEgnp.exe") == "report<U+202E>gnp.exe");
    CHECK(withVisibleBidiControls("a\xE2\x81\xA6" "b\xE2\x81\xA9") == "a<U+2066>b<U+2069>");
    CHECK(withVisibleBidiControls("Z\xC3\xBCrich \xE2\x82\xAC") == "Z\xC3\xBCrich \xE2\x82\xAC"); // ordinary text untouched
}

TEST_CASE("Excerpts in messages are short printable and never cut inside a character", "[text]")
{
    // Latin-1 'é' (0xE9) is not UTF-8: shown as \xE9, never sent raw to a terminal.
    CHECK(printableExcerpt("Z\xE9rich", 60) == "Z\\xE9rich");
    CHECK(printableExcerpt("tab\there", 60) == "tab\\x09here");
    // Five characters of which four take two bytes: cut after three characters, not bytes.
    CHECK(printableExcerpt("\xC3\xA9\xC3\xA9\xC3\xA9\xC3\xA9x", 3) == "\xC3\xA9\xC3\xA9\xC3\xA9...");
    InputError error;
    error.file = "c.csv";
    error.value = std::string(500, 'a');
    CHECK(error.message().size() < 200);
}
