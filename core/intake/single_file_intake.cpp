#include "intake/single_file_intake.hpp"

#include "intake/field_values.hpp"

namespace plumbline {

namespace {

struct ColumnIndices {
    std::size_t outcome = 0;
    std::vector<std::size_t> scores;
    std::vector<std::size_t> groups;
    std::optional<std::size_t> id;
};

std::expected<ColumnIndices, InputError> resolveColumns(const DelimitedTable& table, const IntakeSettings& settings)
{
    ColumnIndices indices;
    const auto outcome = table.column(settings.outcomeColumn, "outcome");
    if (!outcome)
        return std::unexpected(outcome.error());
    indices.outcome = *outcome;
    for (const auto& name : settings.scoreColumns) {
        const auto score = table.column(name, "score");
        if (!score)
            return std::unexpected(score.error());
        indices.scores.push_back(*score);
    }
    for (const auto& name : settings.groupColumns) {
        const auto group = table.column(name, "group");
        if (!group)
            return std::unexpected(group.error());
        indices.groups.push_back(*group);
    }
    if (settings.periodColumn)
        if (const auto period = table.column(*settings.periodColumn, "period"); !period)
            return std::unexpected(period.error());
    if (settings.idColumn) {
        const auto id = table.column(*settings.idColumn, "id");
        if (!id)
            return std::unexpected(id.error());
        indices.id = *id;
    }
    return indices;
}

} // namespace

std::expected<StagedFile, InputError> stageSingleFile(const DelimitedTable& table, const IntakeSettings& settings,
                                                      ExclusionCounter& exclusions, IntakeAudit& audit)
{
    const auto indices = resolveColumns(table, settings);
    if (!indices)
        return std::unexpected(indices.error());
    StagedFile staged;
    StagedRows& rows = staged.rows;
    rows.rawScores.resize(indices->scores.size());
    rows.scoreStatus.resize(indices->scores.size());
    rows.groupCodes.resize(indices->groups.size());
    std::vector<LevelDictionary> dictionaries(indices->groups.size());
    const std::size_t width = table.header().size();
    const std::string& file = table.fileName();

    const auto visited = table.forEachRecord([&](const CsvScanner& scanner) {
        ++audit.rowsRead;
        const auto& fields = scanner.fields();
        const std::size_t line = scanner.line();
        if (const auto shape = recordShapeProblem(scanner, width)) {
            exclusions.exclude(*shape, file, {}, line);
            return;
        }
        if (indices->id && isMissingToken(fields[*indices->id])) {
            exclusions.exclude(ExclusionReason::MissingId, file, *settings.idColumn, line);
            return;
        }
        rows.lines.push_back(static_cast<std::uint32_t>(line));
        rows.outcomeLines.push_back(static_cast<std::uint32_t>(line));
        rows.outcomeLevel.push_back(staged.outcomeLevels.add(fields[indices->outcome], line));
        for (std::size_t c = 0; c < indices->scores.size(); ++c) {
            double value = 0.0;
            rows.scoreStatus[c].push_back(readScoreField(fields[indices->scores[c]], settings.decimalComma, value));
            rows.rawScores[c].push_back(value);
        }
        for (std::size_t g = 0; g < indices->groups.size(); ++g)
            rows.groupCodes[g].push_back(dictionaries[g].code(fields[indices->groups[g]]));
        if (indices->id)
            rows.ids.emplace_back(trimmed(fields[*indices->id]));
    });
    if (!visited)
        return std::unexpected(visited.error());
    audit.blankLinesSkipped = *visited;
    for (auto& dictionary : dictionaries)
        rows.groupLevels.push_back(dictionary.takeLevels());
    return staged;
}

} // namespace plumbline
