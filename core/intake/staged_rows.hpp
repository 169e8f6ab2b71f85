#pragma once

#include "intake/csv_scanner.hpp"
#include "intake/intake_audit.hpp"
#include "intake/intake_settings.hpp"
#include "intake/outcome_coding.hpp"

#include <cstddef>
#include <cstdint>
#include <expected>
#include <optional>
#include <string>
#include <string_view>
#include <unordered_map>
#include <vector>

namespace plumbline {

// How a score field read, before the scale is applied.
// Underflow: a number nearer to 0 than the smallest normal double (|x| < 2.2e-308, written
// 1e-400 or -1e-310): read as 0, whatever its sign, and counted.
enum class ScoreFieldStatus : std::uint8_t { Number, Missing, NotANumber, Underflow };

// Rows that passed the structural and join checks, with their raw values, waiting for the
// outcome coding and the scale (both need the whole column first).
struct StagedRows {
    static constexpr std::uint8_t missingOutcome = 0xFF;

    std::vector<std::uint32_t> lines;          // line in the cohort file
    std::vector<std::uint32_t> outcomeLines;   // line of the outcome (differs with two files)
    std::vector<std::uint8_t> outcomeLevel;    // index into levels, or missingOutcome
    std::vector<std::vector<double>> rawScores;              // [column][row]
    std::vector<std::vector<ScoreFieldStatus>> scoreStatus;  // [column][row]
    std::vector<std::vector<std::uint32_t>> groupCodes;      // [group][row]
    std::vector<std::vector<std::string>> groupLevels;       // [group][code]
    std::vector<std::string> ids;

    std::size_t size() const { return lines.size(); }
};

// Collects the distinct outcome values; more than a few means the column is not binary and
// the intake stops, so the list is capped.
class OutcomeLevelCollector {
public:
    static constexpr std::size_t cap = 64;
    // Returns the level index, or StagedRows::missingOutcome for a missing token.
    std::uint8_t add(std::string_view field, std::size_t line);
    // Adds the levels of a later part of the file, whose lines count from `lineShift` + 1; returns
    // each of its level indices' index here.
    std::vector<std::uint8_t> absorb(const OutcomeLevelCollector& later, std::size_t lineShift);
    const std::vector<OutcomeLevel>& levels() const { return m_levels; }

private:
    std::vector<OutcomeLevel> m_levels;
};

// Dictionary-codes one categorical column.
class LevelDictionary {
public:
    std::uint32_t code(std::string_view field);
    std::vector<std::string> takeLevels() { return std::move(m_levels); }

private:
    std::unordered_map<std::string, std::uint32_t> m_codes;
    std::vector<std::string> m_levels;
};

// The reason a record cannot be read as a row at all (wrong field count, text after a closing
// quote), or nullopt when its shape is sound.
std::optional<ExclusionReason> recordShapeProblem(const CsvScanner& scanner, std::size_t width);

// Where the mapped columns are in a source's header.
struct ColumnIndices {
    std::size_t outcome = 0;
    std::vector<std::size_t> scores;
    std::vector<std::size_t> groups;
    std::optional<std::size_t> id;
};

// Looks up every column the settings map, with `find(name, role)` returning the index or an
// InputError; the period column is looked up too (under its own role) when it is not a group.
template <typename Find>
std::expected<ColumnIndices, InputError> resolveColumnIndices(const IntakeSettings& settings, Find&& find)
{
    ColumnIndices indices;
    const auto outcome = find(settings.outcomeColumn, "outcome");
    if (!outcome)
        return std::unexpected(outcome.error());
    indices.outcome = *outcome;
    for (const auto& name : settings.scoreColumns) {
        const auto score = find(name, "score");
        if (!score)
            return std::unexpected(score.error());
        indices.scores.push_back(*score);
    }
    for (const auto& name : settings.groupColumns) {
        const auto group = find(name, name == settings.periodColumn ? "period" : name == settings.clusterColumn ? "cluster" : "group");
        if (!group)
            return std::unexpected(group.error());
        indices.groups.push_back(*group);
    }
    if (settings.periodColumn)
        if (const auto period = find(*settings.periodColumn, "period"); !period)
            return std::unexpected(period.error());
    if (settings.clusterColumn)
        if (const auto cluster = find(*settings.clusterColumn, "cluster"); !cluster)
            return std::unexpected(cluster.error());
    if (settings.idColumn) {
        const auto id = find(*settings.idColumn, "id");
        if (!id)
            return std::unexpected(id.error());
        indices.id = *id;
    }
    return indices;
}

// Reads one score field: a number, a missing token, or text that is not a number.
ScoreFieldStatus readScoreField(std::string_view field, bool decimalComma, double& value);

} // namespace plumbline
