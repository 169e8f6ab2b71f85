#include "intake/typed_table_intake.hpp"

#include "intake/column_suggest.hpp"
#include "intake/field_values.hpp"
#include "intake/outcome_coding.hpp"

#include <algorithm>
#include <charconv>
#include <chrono>
#include <cmath>
#include <cstdio>
#include <limits>

namespace plumbline {

namespace {

std::vector<std::string> columnNames(const TypedTable& table)
{
    std::vector<std::string> names;
    for (const auto& column : table.columns())
        names.push_back(column.name);
    return names;
}

std::string isoDate(std::int64_t daysSince1970)
{
    const std::chrono::year_month_day date{std::chrono::sys_days{std::chrono::days{daysSince1970}}};
    char buffer[32];
    std::snprintf(buffer, sizeof buffer, "%04d-%02u-%02u", static_cast<int>(date.year()), static_cast<unsigned>(date.month()),
                  static_cast<unsigned>(date.day()));
    return buffer;
}

std::string shortestNumber(double value)
{
    char buffer[64];
    const auto result = std::to_chars(buffer, buffer + sizeof buffer, value);
    return std::string(buffer, result.ptr);
}

std::expected<ColumnIndices, InputError> resolveColumns(const TypedTable& table, const IntakeSettings& settings)
{
    return resolveColumnIndices(settings, [&](const std::string& name, const std::string& role) { return typedColumnIndex(table, name, role); });
}

// A score cell as a delimited field's reading would give it (readScoreField's rules).
ScoreFieldStatus readScoreCell(const TypedCell& cell, bool decimalComma, double& value)
{
    switch (cell.kind) {
    case CellKind::Number:
        value = cell.number;
        if (value != 0.0 && std::abs(value) < std::numeric_limits<double>::min()) {
            value = 0.0;
            return ScoreFieldStatus::Underflow;
        }
        return ScoreFieldStatus::Number;
    case CellKind::Text:
        return readScoreField(cell.text, decimalComma, value);
    case CellKind::Date:
        value = std::numeric_limits<double>::quiet_NaN();
        return ScoreFieldStatus::NotANumber;
    case CellKind::Missing:
        break;
    }
    value = std::numeric_limits<double>::quiet_NaN();
    return ScoreFieldStatus::Missing;
}

bool isMissingCell(const TypedCell& cell)
{
    return cell.kind == CellKind::Missing || (cell.kind == CellKind::Text && isMissingToken(cell.text));
}

} // namespace

std::string typedCellText(const TypedCell& cell, const std::vector<ValueLabel>* labels)
{
    switch (cell.kind) {
    case CellKind::Number:
        if (labels)
            for (const auto& label : *labels)
                if (label.value == cell.number)
                    return label.label;
        return shortestNumber(cell.number);
    case CellKind::Text:
        return std::string(cell.text);
    case CellKind::Date:
        return isoDate(cell.day);
    case CellKind::Missing:
        break;
    }
    return {};
}

std::expected<std::size_t, InputError> typedColumnIndex(const TypedTable& table, const std::string& name, const std::string& role)
{
    const std::vector<std::string> names = columnNames(table);
    InputError error;
    error.file = table.sourceName();
    error.column = name;
    const std::string wanted(trimmed(name));
    const auto count = std::count(names.begin(), names.end(), wanted);
    if (count == 1)
        return static_cast<std::size_t>(std::find(names.begin(), names.end(), wanted) - names.begin());
    if (count > 1) {
        error.problem = "there are " + std::to_string(count) + " columns named '" + wanted + "', so the " + role + " column is ambiguous.";
        error.remedy = "give each column a unique name (in a query, with AS).";
        return std::unexpected(error);
    }
    error.problem = "there is no " + role + " column of that name.";
    const auto suggestions = closestColumnNames(wanted, names);
    error.remedy = suggestions.empty() ? "choose one of the columns: " + quotedList(names) + "."
                                       : "did you mean " + quotedList(suggestions) + "? Column names must match exactly.";
    return std::unexpected(error);
}

std::optional<std::string> eventValueAsCode(const TypedTable& table, const IntakeSettings& settings)
{
    const auto outcome = typedColumnIndex(table, settings.outcomeColumn, "outcome");
    if (!outcome)
        return settings.eventValue;
    if (!settings.eventValue) {
        // Codes labelled as a recognised pair (1 = No, 2 = Yes): the label says which is the event.
        const auto& labels = table.columns()[*outcome].labels;
        if (labels.size() != 2)
            return std::nullopt;
        std::vector<OutcomeLevel> levels;
        for (const auto& label : labels)
            levels.push_back({label.label, lowerAscii(trimmed(label.label)), 1, 0});
        const auto coding = codeOutcome(levels, std::nullopt, table.sourceName(), settings.outcomeColumn);
        if (!coding)
            return std::nullopt;
        return shortestNumber(labels[coding->eventLevel].value);
    }
    const std::string wanted = lowerAscii(trimmed(*settings.eventValue));
    for (const auto& label : table.columns()[*outcome].labels)
        if (lowerAscii(trimmed(label.label)) == wanted)
            return shortestNumber(label.value);
    return settings.eventValue;
}

std::expected<StagedFile, InputError> stageTypedTable(TypedTable& table, const IntakeSettings& settings,
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
    std::vector<const std::vector<ValueLabel>*> groupLabels;
    for (const std::size_t g : indices->groups) {
        const auto& labels = table.columns()[g].labels;
        groupLabels.push_back(labels.empty() ? nullptr : &labels);
    }
    const std::string& file = table.sourceName();
    std::size_t rowsRead = 0;
    std::optional<InputError> tooFar;
    const auto visited = table.forEachRecord([&](std::span<const TypedCell> cells, std::size_t position) {
        if (position > std::numeric_limits<std::uint32_t>::max()) {
            InputError error;
            error.file = file;
            error.line = position;
            error.lineNoun = table.positionNoun();
            error.problem = "the source has more rows than Plumbline can count (about four thousand million).";
            error.remedy = "validate a sample of the rows, or the rows of one period at a time.";
            tooFar = error;
            return false;
        }
        ++rowsRead;
        if (indices->id && isMissingCell(cells[*indices->id])) {
            exclusions.exclude(ExclusionReason::MissingId, file, *settings.idColumn, position);
            return true;
        }
        const auto line = static_cast<std::uint32_t>(position);
        rows.lines.push_back(line);
        rows.outcomeLines.push_back(line);
        rows.outcomeLevel.push_back(staged.outcomeLevels.add(typedCellText(cells[indices->outcome]), position));
        for (std::size_t c = 0; c < indices->scores.size(); ++c) {
            double value = 0.0;
            rows.scoreStatus[c].push_back(readScoreCell(cells[indices->scores[c]], settings.decimalComma, value));
            rows.rawScores[c].push_back(value);
        }
        for (std::size_t g = 0; g < indices->groups.size(); ++g)
            rows.groupCodes[g].push_back(dictionaries[g].code(typedCellText(cells[indices->groups[g]], groupLabels[g])));
        if (indices->id)
            rows.ids.emplace_back(trimmed(typedCellText(cells[*indices->id])));
        return true;
    });
    if (tooFar)
        return std::unexpected(*tooFar);
    if (!visited)
        return std::unexpected(visited.error());
    audit.rowsRead += rowsRead;
    audit.lineNoun = table.positionNoun();
    for (const auto& warning : table.warnings())
        audit.warnings.push_back(warning);
    for (auto& dictionary : dictionaries)
        rows.groupLevels.push_back(dictionary.takeLevels());
    return staged;
}

} // namespace plumbline
