#include "intake/single_file_intake.hpp"

#include "intake/field_values.hpp"

#include <atomic>
#include <future>
#include <string>

namespace plumbline {

namespace {

std::expected<ColumnIndices, InputError> resolveColumns(const DelimitedTable& table, const IntakeSettings& settings)
{
    return resolveColumnIndices(settings, [&](const std::string& name, const std::string& role) { return table.column(name, role); });
}

// The rows of one part of the file, with everything counted while reading them.
struct StagedPart {
    StagedFile staged;
    std::vector<LevelDictionary> dictionaries;
    ExclusionCounter exclusions;
    std::size_t rowsRead = 0;
    DelimitedTable::RecordRun run;
};

// Reads the records of [from, stopAt) (or on to the end when no record ends at stopAt) into a part.
std::expected<StagedPart, InputError> stagePart(const DelimitedTable& table, const IntakeSettings& settings,
                                                const ColumnIndices& indices, std::size_t from, std::size_t stopAt,
                                                const std::atomic<bool>* abandon)
{
    StagedPart part;
    StagedRows& rows = part.staged.rows;
    rows.rawScores.resize(indices.scores.size());
    rows.scoreStatus.resize(indices.scores.size());
    rows.groupCodes.resize(indices.groups.size());
    part.dictionaries.resize(indices.groups.size());
    const std::size_t width = table.header().size();
    const std::string& file = table.fileName();
    const auto run = table.forEachRecordFrom(from, stopAt, abandon, [&](const CsvScanner& scanner) {
        ++part.rowsRead;
        const auto& fields = scanner.fields();
        const std::size_t line = scanner.line();
        if (const auto shape = recordShapeProblem(scanner, width)) {
            part.exclusions.exclude(*shape, file, {}, line);
            return;
        }
        if (indices.id && isMissingToken(fields[*indices.id])) {
            part.exclusions.exclude(ExclusionReason::MissingId, file, *settings.idColumn, line);
            return;
        }
        rows.lines.push_back(static_cast<std::uint32_t>(line));
        rows.outcomeLines.push_back(static_cast<std::uint32_t>(line));
        rows.outcomeLevel.push_back(part.staged.outcomeLevels.add(fields[indices.outcome], line));
        for (std::size_t c = 0; c < indices.scores.size(); ++c) {
            double value = 0.0;
            rows.scoreStatus[c].push_back(readScoreField(fields[indices.scores[c]], settings.decimalComma, value));
            rows.rawScores[c].push_back(value);
        }
        for (std::size_t g = 0; g < indices.groups.size(); ++g)
            rows.groupCodes[g].push_back(part.dictionaries[g].code(fields[indices.groups[g]]));
        if (indices.id)
            rows.ids.emplace_back(trimmed(fields[*indices.id]));
    });
    if (!run)
        return std::unexpected(run.error());
    part.run = *run;
    return part;
}

// Moves `later` onto the end of `into`, freeing each of its columns once appended, so the join
// holds one extra column at a time.
template <typename T>
void appendColumn(std::vector<T>& into, std::vector<T>& later)
{
    into.reserve(into.size() + later.size());
    into.insert(into.end(), std::make_move_iterator(later.begin()), std::make_move_iterator(later.end()));
    std::vector<T>().swap(later);
}

// Joins the second part onto the first: its lines shifted by the lines before it, its outcome
// levels and group codes renumbered into the first part's (levels first seen in the second part
// come after the first part's, as one pass over the file would number them).
void joinParts(StagedPart& first, StagedPart& second, std::size_t lineShift)
{
    StagedRows& into = first.staged.rows;
    StagedRows& later = second.staged.rows;
    for (auto& line : later.lines)
        line += static_cast<std::uint32_t>(lineShift);
    for (auto& line : later.outcomeLines)
        line += static_cast<std::uint32_t>(lineShift);
    appendColumn(into.lines, later.lines);
    appendColumn(into.outcomeLines, later.outcomeLines);
    const auto levelMap = first.staged.outcomeLevels.absorb(second.staged.outcomeLevels, lineShift);
    for (auto& level : later.outcomeLevel)
        if (level != StagedRows::missingOutcome)
            level = levelMap[level];
    appendColumn(into.outcomeLevel, later.outcomeLevel);
    for (std::size_t c = 0; c < into.rawScores.size(); ++c) {
        appendColumn(into.rawScores[c], later.rawScores[c]);
        appendColumn(into.scoreStatus[c], later.scoreStatus[c]);
    }
    for (std::size_t g = 0; g < into.groupCodes.size(); ++g) {
        std::vector<std::uint32_t> codeMap;
        for (const std::string& level : second.dictionaries[g].takeLevels())
            codeMap.push_back(first.dictionaries[g].code(level));
        for (auto& code : later.groupCodes[g])
            code = codeMap[code];
        appendColumn(into.groupCodes[g], later.groupCodes[g]);
    }
    appendColumn(into.ids, later.ids);
    first.exclusions.absorb(second.exclusions, lineShift);
    first.rowsRead += second.rowsRead;
    first.run.blankLinesSkipped += second.run.blankLinesSkipped;
}

// Text offset of the start of the first line after `near`, or nullopt when there is none.
std::optional<std::size_t> lineStartAfter(const TextFile& file, std::size_t near)
{
    constexpr std::size_t window = std::size_t{1} << 16;
    for (std::size_t from = near; from < file.textSize(); from += window) {
        const auto text = file.readText(from, from + window);
        if (!text)
            return std::nullopt;
        if (const std::size_t newline = text->find('\n'); newline != std::string::npos)
            return from + newline + 1;
    }
    return std::nullopt;
}

} // namespace

std::expected<StagedFile, InputError> stageSingleFile(const DelimitedTable& table, const IntakeSettings& settings,
                                                      ExclusionCounter& exclusions, IntakeAudit& audit)
{
    const std::size_t size = table.file().textSize();
    return stageSingleFile(table, settings, exclusions, audit,
                           size >= twoThreadIntakeBytes ? std::optional<std::size_t>(size / 2) : std::nullopt);
}

std::expected<StagedFile, InputError> stageSingleFile(const DelimitedTable& table, const IntakeSettings& settings,
                                                      ExclusionCounter& exclusions, IntakeAudit& audit,
                                                      std::optional<std::size_t> splitNear)
{
    const auto indices = resolveColumns(table, settings);
    if (!indices)
        return std::unexpected(indices.error());
    const std::optional<std::size_t> split = splitNear ? lineStartAfter(table.file(), *splitNear) : std::nullopt;
    std::atomic<bool> abandon{false};
    std::future<std::expected<StagedPart, InputError>> second;
    if (split)
        second = std::async(std::launch::async, [&] { return stagePart(table, settings, *indices, *split, std::string::npos, &abandon); });
    auto first = stagePart(table, settings, *indices, 0, split.value_or(std::string::npos), nullptr);
    const bool joined = first && first->run.stoppedAt;
    if (split && !joined)
        abandon = true; // the first part read on past the guess (or failed): its result stands alone
    std::expected<StagedPart, InputError> later = std::unexpected(InputError{});
    if (split)
        later = second.get();
    if (!first)
        return std::unexpected(first.error());
    if (joined) {
        const std::size_t lineShift = first->run.lineAfter - 1;
        if (!later) {
            InputError error = later.error();
            if (error.line > 0)
                error.line += lineShift;
            return std::unexpected(error);
        }
        // More than the collector's cap of outcome levels in the second part alone would have been
        // counted differently by one pass; such a file is refused anyway, but read it as one pass would.
        if (later->staged.outcomeLevels.levels().size() >= OutcomeLevelCollector::cap)
            return stageSingleFile(table, settings, exclusions, audit, std::nullopt);
        joinParts(*first, *later, lineShift);
    }
    StagedPart& part = *first;
    audit.rowsRead += part.rowsRead;
    audit.blankLinesSkipped = part.run.blankLinesSkipped;
    exclusions.absorb(part.exclusions, 0);
    for (auto& dictionary : part.dictionaries)
        part.staged.rows.groupLevels.push_back(dictionary.takeLevels());
    return std::move(part.staged);
}

} // namespace plumbline
