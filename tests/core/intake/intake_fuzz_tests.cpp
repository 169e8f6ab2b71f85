#include "support/intake_test_support.hpp"
#include "resampling/random_stream.hpp"

#include <catch2/catch.hpp>

using namespace plumbline;
using namespace plumbline::test;

// Whatever bytes arrive, the intake answers with a clean error (a message naming the file) or a
// cohort whose audit balances: rows read = rows used + rows excluded. Fixed seeds, thousands of
// cases, so a failure is reproducible.
namespace {

const std::string validFile =
    "id,y,p,q,site\n"
    "a,1,0.8,0.7,North\n"
    "b,0,0.1,0.2,\"South, East\"\n"
    "c,0,0.3,NA,North\n"
    "\"d\"\"x\",1,0.6,0.5,West\n"
    "e,0,0.2,0.1,South\n"
    "f,yes,0.4,0.4,\n";

void checkClean(const IntakeSettings& settings, std::string bytes)
{
    const auto result = intakeOf(settings, std::move(bytes));
    if (!result) {
        const std::string message = result.error().message();
        REQUIRE_FALSE(message.empty());
        REQUIRE(message.rfind("cohort.csv", 0) == 0);
        return;
    }
    REQUIRE(result->audit.balances());
    REQUIRE(result->cohort.rows() == result->audit.rowsUsed);
    for (const auto& model : result->cohort.models)
        REQUIRE(model.values.size() == result->cohort.rows());
}

std::string mutate(std::string text, RandomStream& random)
{
    static const std::string alphabet = ",;\t|\"\r\n .0123456789NAyesno-e\xC3\xA9\xFF";
    const std::uint64_t edits = 1 + random.below(6);
    for (std::uint64_t e = 0; e < edits && !text.empty(); ++e) {
        const std::size_t at = random.below(text.size());
        switch (random.below(4)) {
        case 0: text[at] = alphabet[random.below(alphabet.size())]; break;
        case 1: text.insert(at, 1, alphabet[random.below(alphabet.size())]); break;
        case 2: text.erase(at, 1 + random.below(3)); break;
        default: text.insert(at, text.substr(random.below(text.size()), random.below(12))); break;
        }
    }
    return text;
}

} // namespace

TEST_CASE("Random bytes never crash the intake", "[intake][fuzz]")
{
    RandomStream random(7001);
    const IntakeSettings settings = settingsFor({"p"});
    for (int i = 0; i < 3000; ++i) {
        std::string bytes(random.below(200), '\0');
        for (char& c : bytes)
            c = static_cast<char>(random.below(256));
        if (random.below(2))
            bytes = "y,p\n" + bytes;
        checkClean(settings, bytes);
    }
}

TEST_CASE("Mutated valid files give a clean error or a balanced audit", "[intake][fuzz]")
{
    RandomStream random(7002);
    IntakeSettings settings = settingsFor({"p", "q"});
    settings.groupColumns = {"site"};
    settings.idColumn = "id";
    for (int i = 0; i < 5000; ++i)
        checkClean(settings, mutate(validFile, random));
}

TEST_CASE("Mutated two-file joins give a clean error or balance on both sides", "[intake][fuzz]")
{
    RandomStream random(7003);
    IntakeSettings settings = settingsFor({"p"});
    settings.outcomesFile = "outcomes.csv";
    settings.idColumn = "id";
    const std::string scores = "id,p\na,0.8\nb,0.1\nc,0.3\nd,0.6\ne,0.2\n";
    const std::string outcomes = "id,y\nc,0\na,1\nb,0\ne,1\nd,0\n";
    for (int i = 0; i < 2000; ++i) {
        const auto scoresFile = TextFile::fromBytes("cohort.csv", mutate(scores, random));
        const auto outcomesFile = TextFile::fromBytes("outcomes.csv", mutate(outcomes, random));
        if (!scoresFile || !outcomesFile)
            continue;
        const auto result = runIntake(settings, *scoresFile, *outcomesFile);
        if (!result) {
            REQUIRE_FALSE(result.error().message().empty());
            continue;
        }
        REQUIRE(result->audit.balances());
    }
}
