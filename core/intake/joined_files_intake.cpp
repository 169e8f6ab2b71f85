#include "intake/joined_files_intake.hpp"

#include "intake/field_values.hpp"

#include <unordered_map>

namespace plumbline {

namespace {

struct OutcomeRow {
    std::string value;
    std::uint32_t line = 0;
    std::uint32_t copies = 0;   // rows in the outcomes file with this id
    bool taken = false;         // matched by a unique score row
    bool scoreDuplicated = false;
};

using OutcomeIndex = std::unordered_map<std::string, OutcomeRow>;

std::expected<OutcomeIndex, InputError> readOutcomes(const DelimitedTable& table, const std::string& idColumn,
                                                     const std::string& outcomeColumn, ExclusionCounter& outcomeExclusions,
                                                     JoinSummary& join)
{
    const auto id = table.column(idColumn, "id");
    if (!id)
        return std::unexpected(id.error());
    const auto outcome = table.column(outcomeColumn, "outcome");
    if (!outcome)
        return std::unexpected(outcome.error());
    OutcomeIndex index;
    const std::size_t width = table.header().size();
    const std::string& file = table.fileName();
    const auto visited = table.forEachRecord([&](const CsvScanner& scanner) {
        ++join.outcomeRows;
        const auto& fields = scanner.fields();
        const auto line = static_cast<std::uint32_t>(scanner.line());
        if (const auto shape = recordShapeProblem(scanner, width)) {
            outcomeExclusions.exclude(*shape, file, {}, line);
            return;
        }
        if (isMissingToken(fields[*id])) {
            outcomeExclusions.exclude(ExclusionReason::MissingId, file, idColumn, line);
            return;
        }
        auto [it, inserted] = index.try_emplace(std::string(trimmed(fields[*id])));
        OutcomeRow& row = it->second;
        if (inserted) {
            row.value.assign(fields[*outcome]);
            row.line = line;
        }
        ++row.copies;
        if (row.copies > 1)
            outcomeExclusions.exclude(ExclusionReason::DuplicateId, file, idColumn, line);
    });
    if (!visited)
        return std::unexpected(visited.error());
    // The first copy of a duplicated id was counted as fine while reading; count it now.
    for (const auto& [key, row] : index)
        if (row.copies > 1)
            outcomeExclusions.exclude(ExclusionReason::DuplicateId, file, idColumn, row.line);
    return index;
}

} // namespace

std::expected<StagedFile, InputError> stageJoinedFiles(const DelimitedTable& scores, const DelimitedTable& outcomes,
                                                       const IntakeSettings& settings, ExclusionCounter& exclusions,
                                                       IntakeAudit& audit)
{
    JoinSummary join;
    ExclusionCounter outcomeExclusions;
    const std::string outcomesIdColumn = settings.outcomesIdColumn.value_or(*settings.idColumn);
    auto index = readOutcomes(outcomes, outcomesIdColumn, settings.outcomeColumn, outcomeExclusions, join);
    if (!index)
        return std::unexpected(index.error());

    // The score file: the outcome column is not looked for here.
    const auto idIndex = scores.column(*settings.idColumn, "id");
    if (!idIndex)
        return std::unexpected(idIndex.error());
    std::vector<std::size_t> scoreIndices;
    for (const auto& name : settings.scoreColumns) {
        const auto column = scores.column(name, "score");
        if (!column)
            return std::unexpected(column.error());
        scoreIndices.push_back(*column);
    }
    if (settings.periodColumn)
        if (const auto period = scores.column(*settings.periodColumn, "period"); !period)
            return std::unexpected(period.error());
    if (settings.clusterColumn)
        if (const auto cluster = scores.column(*settings.clusterColumn, "cluster"); !cluster)
            return std::unexpected(cluster.error());
    std::vector<std::size_t> groupIndices;
    for (const auto& name : settings.groupColumns) {
        const auto column = scores.column(name, "group");
        if (!column)
            return std::unexpected(column.error());
        groupIndices.push_back(*column);
    }

    // First pass: count score-side copies of each id so duplicates can be excluded whole.
    std::unordered_map<std::string, std::uint32_t> scoreCopies;
    const std::size_t width = scores.header().size();
    const auto counted = scores.forEachRecord([&](const CsvScanner& scanner) {
        const auto& fields = scanner.fields();
        if (!recordShapeProblem(scanner, width) && !isMissingToken(fields[*idIndex]))
            ++scoreCopies[std::string(trimmed(fields[*idIndex]))];
    });
    if (!counted)
        return std::unexpected(counted.error());

    StagedFile staged;
    StagedRows& rows = staged.rows;
    rows.rawScores.resize(scoreIndices.size());
    rows.scoreStatus.resize(scoreIndices.size());
    rows.groupCodes.resize(groupIndices.size());
    std::vector<LevelDictionary> dictionaries(groupIndices.size());
    const std::string& file = scores.fileName();
    const std::string& idName = *settings.idColumn;
    const auto visited = scores.forEachRecord([&](const CsvScanner& scanner) {
        ++audit.rowsRead;
        const auto& fields = scanner.fields();
        const auto line = static_cast<std::uint32_t>(scanner.line());
        if (const auto shape = recordShapeProblem(scanner, width)) {
            exclusions.exclude(*shape, file, {}, line);
            return;
        }
        if (isMissingToken(fields[*idIndex])) {
            exclusions.exclude(ExclusionReason::MissingId, file, idName, line);
            return;
        }
        std::string id(trimmed(fields[*idIndex]));
        const auto found = index->find(id);
        if (scoreCopies[id] > 1) {
            exclusions.exclude(ExclusionReason::DuplicateId, file, idName, line);
            if (found != index->end())
                found->second.scoreDuplicated = true;
            return;
        }
        if (found == index->end()) {
            ++join.scoresWithoutOutcome;
            exclusions.exclude(ExclusionReason::NoMatchingOutcome, file, idName, line);
            return;
        }
        OutcomeRow& outcome = found->second;
        if (outcome.copies > 1) {
            exclusions.exclude(ExclusionReason::OutcomeIdDuplicated, file, idName, line);
            return;
        }
        outcome.taken = true;
        ++join.matched;
        rows.lines.push_back(line);
        rows.outcomeLines.push_back(outcome.line);
        rows.outcomeLevel.push_back(staged.outcomeLevels.add(outcome.value, outcome.line));
        for (std::size_t c = 0; c < scoreIndices.size(); ++c) {
            double value = 0.0;
            rows.scoreStatus[c].push_back(readScoreField(fields[scoreIndices[c]], settings.decimalComma, value));
            rows.rawScores[c].push_back(value);
        }
        for (std::size_t g = 0; g < groupIndices.size(); ++g)
            rows.groupCodes[g].push_back(dictionaries[g].code(fields[groupIndices[g]]));
        rows.ids.push_back(std::move(id));
    });
    if (!visited)
        return std::unexpected(visited.error());
    audit.blankLinesSkipped = *visited;
    for (auto& dictionary : dictionaries)
        rows.groupLevels.push_back(dictionary.takeLevels());

    for (const auto& [key, row] : *index) {
        if (row.copies != 1 || row.taken)
            continue;
        if (row.scoreDuplicated)
            outcomeExclusions.exclude(ExclusionReason::IdDuplicatedInScores, outcomes.fileName(), outcomesIdColumn, row.line);
        else
            ++join.outcomesWithoutScore;
    }
    join.scoreRows = audit.rowsRead;
    join.outcomeFileExclusions = outcomeExclusions.tallies();
    audit.join = join;
    return staged;
}

} // namespace plumbline
