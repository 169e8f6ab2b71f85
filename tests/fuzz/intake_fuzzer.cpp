// libFuzzer harness of the intake: any bytes as a cohort file, read with the mapping the import
// dialog would guess and with a fixed one. Nothing may crash, hang or leak, and every audit that
// comes back must balance (rows read = rows used + rows excluded).
#include "intake/column_profile.hpp"
#include "intake/column_roles.hpp"
#include "intake/delimited_table.hpp"
#include "intake/intake.hpp"

#include <cstddef>
#include <cstdint>
#include <string>

namespace {

void requireBalanced(const std::expected<plumbline::IntakeResult, plumbline::InputError>& result)
{
    if (result && !result->audit.balances())
        __builtin_trap();
    if (!result)
        (void)result.error().message(); // messages are built from the same bytes: exercise them
}

} // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size)
{
    using namespace plumbline;
    const std::string bytes(reinterpret_cast<const char*>(data), size);
    IntakeSettings fixed;
    fixed.cohortFile = "fuzz.csv";
    fixed.outcomeColumn = "y";
    fixed.scoreColumns = {"p"};
    fixed.groupColumns = {"g"};
    fixed.periodColumn = "d";
    if (auto file = TextFile::fromBytes("fuzz.csv", bytes))
        requireBalanced(runIntake(fixed, std::move(*file), std::nullopt));
    // The import dialog's path: preview, profile, guesses, then the guessed mapping.
    auto file = TextFile::fromBytes("fuzz.csv", bytes);
    if (!file)
        return 0;
    auto table = DelimitedTable::open(*file, std::nullopt);
    if (!table)
        return 0;
    (void)previewTable(*table, 20);
    const auto profile = profileColumns(*table, 5000);
    if (!profile)
        return 0;
    const ColumnRoles roles = guessColumnRoles(*profile);
    if (!roles.outcome || roles.scores.empty())
        return 0;
    IntakeSettings guessed;
    guessed.cohortFile = "fuzz.csv";
    guessed.outcomeColumn = *roles.outcome;
    guessed.scoreColumns = roles.scores;
    guessed.groupColumns = roles.groups;
    guessed.idColumn = roles.id;
    guessed.scale = roles.scale;
    requireBalanced(runIntake(guessed, std::move(*file), std::nullopt));
    return 0;
}
