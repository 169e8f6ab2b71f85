#pragma once

#include "intake/intake.hpp"

#include <string>
#include <vector>

namespace plumbline::test {

// Settings for an in-memory cohort with the usual column names of the tests.
inline IntakeSettings settingsFor(std::vector<std::string> scores, std::string outcome = "y")
{
    IntakeSettings settings;
    settings.cohortFile = "cohort.csv";
    settings.outcomeColumn = std::move(outcome);
    settings.scoreColumns = std::move(scores);
    return settings;
}

inline std::expected<IntakeResult, InputError> intakeOf(const IntakeSettings& settings, std::string text)
{
    auto file = TextFile::fromBytes(settings.cohortFile, std::move(text));
    if (!file)
        return std::unexpected(file.error());
    return runIntake(settings, std::move(*file), std::nullopt);
}

inline const ExclusionTally* findTally(const IntakeAudit& audit, ExclusionReason reason, const std::string& column = {})
{
    for (const auto& tally : audit.exclusions)
        if (tally.reason == reason && tally.column == column)
            return &tally;
    return nullptr;
}

} // namespace plumbline::test
