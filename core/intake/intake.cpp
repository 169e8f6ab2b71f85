#include "intake/intake.hpp"

#include "intake/cohort_assembler.hpp"
#include "intake/delimited_table.hpp"
#include "intake/joined_files_intake.hpp"
#include "intake/field_values.hpp"
#include "intake/query_table.hpp"
#include "intake/single_file_intake.hpp"
#include "intake/source_kind.hpp"
#include "intake/typed_source.hpp"
#include "intake/typed_table_intake.hpp"
#include "intake/written_date.hpp"
#include "intake/xlsx_table.hpp"
#include "intake/column_suggest.hpp"

#include <algorithm>
#include <future>
#include <unordered_set>

#if defined(__GLIBC__)
#include <malloc.h>
#endif

namespace plumbline {

namespace {

std::expected<void, InputError> checkSettings(const IntakeSettings& settings)
{
    InputError error;
    error.file = settings.cohortFile;
    if (settings.database) {
        error.file = *settings.database;
        if (!settings.cohortFile.empty()) {
            error.problem = "both a cohort file and a database were given.";
            error.remedy = "give either a file or --database with --query, not both.";
            return std::unexpected(error);
        }
        if (!settings.query || trimmed(*settings.query).empty()) {
            error.problem = "a database was given without a query.";
            error.remedy = "give the SQL query whose result is the cohort (--query \"SELECT …\" or --query-file FILE).";
            return std::unexpected(error);
        }
        if (settings.outcomesFile) {
            error.problem = "outcomes in a second file cannot be joined to a query's result.";
            error.remedy = "join the outcomes in the query itself (SELECT … JOIN …).";
            return std::unexpected(error);
        }
    } else if (settings.query) {
        error.problem = "a query was given without a database.";
        error.remedy = "name the database with --database URI (for example postgresql://analyst@warehouse/quality or sqlite:cohort.db).";
        return std::unexpected(error);
    }
    if (settings.sheet && !isSpreadsheetPath(settings.cohortFile)) {
        error.value = *settings.sheet;
        error.problem = "a sheet was chosen but the cohort is not a spreadsheet (.xlsx).";
        error.remedy = "leave out --sheet, or open the workbook.";
        return std::unexpected(error);
    }
    if (settings.outcomesFile && isTypedSourcePath(settings.cohortFile)) {
        error.problem = "outcomes in a second file can be joined to a delimited text cohort only.";
        error.remedy = "put the outcomes in the same sheet or file as the scores, or export both to delimited text.";
        return std::unexpected(error);
    }
    if (settings.cohortFile.empty() && !settings.database) {
        error.problem = "no cohort file was given.";
        error.remedy = "name the file with the scores (and outcomes), or open a saved analysis (File → Open analysis, or --settings).";
        return std::unexpected(error);
    }
    if (settings.outcomeColumn.empty()) {
        error.problem = "no outcome column was given.";
        error.remedy = "choose the column with the observed outcome (Outcome column in the window, --outcome COLUMN on the command line).";
        return std::unexpected(error);
    }
    if (settings.scoreColumns.empty()) {
        error.problem = "no score column was given.";
        error.remedy = "choose the model's score column (Score columns in the window, --score COLUMN on the command line; several to compare models).";
        return std::unexpected(error);
    }
    std::unordered_set<std::string> seen;
    for (const auto& column : settings.scoreColumns) {
        if (!seen.insert(column).second || column == settings.outcomeColumn) {
            error.column = column;
            error.problem = column == settings.outcomeColumn ? "the outcome column is also given as a score column."
                                                             : "the score column is given twice.";
            error.remedy = "give each score column once, and never the outcome as a score.";
            return std::unexpected(error);
        }
    }
    if (settings.outcomesFile && !settings.idColumn) {
        error.file = *settings.outcomesFile;
        error.problem = "outcomes in a second file need an id to join the two files on.";
        error.remedy = "choose the id column that links the two files (Id column in the window, --id COLUMN and, if the outcomes file calls it differently, --outcomes-id on the command line).";
        return std::unexpected(error);
    }
    return {};
}

// Reaching here means every row was read but the cohort cannot carry a validation. The source
// is named as the staging named it: a query's database has no cohort file.
std::expected<void, InputError> checkEnoughRows(const IntakeAudit& audit, const IntakeSettings& settings, const std::string& source)
{
    if (audit.events > 0 && audit.nonEvents > 0)
        return {};
    InputError error;
    error.kind = ErrorKind::ImpossibleAnalysis;
    error.file = source;
    error.column = settings.outcomeColumn;
    std::string biggest;
    std::size_t biggestRows = 0;
    for (const auto& tally : audit.exclusions)
        if (tally.rows > biggestRows) {
            biggestRows = tally.rows;
            biggest = exclusionReasonText(tally.reason) + (tally.column.empty() ? "" : " ('" + tally.column + "')");
        }
    error.problem = "after exclusions " + std::to_string(audit.rowsUsed) + " of " + std::to_string(audit.rowsRead)
        + " rows remain, with " + std::to_string(audit.events) + " events and " + std::to_string(audit.nonEvents)
        + " non-events; a validation needs both."
        + (biggestRows > 0 ? " Most rows were lost to: " + biggest + " (" + std::to_string(biggestRows) + " rows)." : "");
    error.remedy = "check the column mapping, the scale and the outcome definition against the file.";
    return std::unexpected(error);
}

// Before the outcome is coded: a file of a header alone, or rows that all fell at the structural
// or join checks, would otherwise be reported as "the outcome holds no values".
std::expected<void, InputError> checkRowsToUse(const IntakeAudit& audit, std::size_t staged, const ExclusionCounter& exclusions,
                                               const std::string& file, bool joined)
{
    if (staged > 0)
        return {};
    InputError error;
    error.file = file;
    if (audit.rowsRead == 0) {
        if (audit.lineNoun == "row of the result") {
            error.problem = "the query returned no rows.";
            error.remedy = "check the query's conditions (dates, joins) against the data, or run it in the database first.";
        } else {
            error.problem = audit.lineNoun == "row" ? "the sheet or file has column names but no data rows."
                                                    : "the file has a header row but no data rows.";
            error.remedy = "choose the file (or sheet) with one row per patient under the column names.";
        }
        return std::unexpected(error);
    }
    error.kind = ErrorKind::ImpossibleAnalysis;
    std::string reasons;
    for (const auto& tally : exclusions.tallies())
        reasons += (reasons.empty() ? "" : "; ") + exclusionReasonText(tally.reason) + (tally.column.empty() ? "" : " ('" + tally.column + "')")
            + ": " + std::to_string(tally.rows) + " rows";
    error.problem = "none of the " + std::to_string(audit.rowsRead) + " rows can be used (" + reasons + ").";
    error.remedy = joined ? "check the id columns of both files: each patient's id must appear once in each file."
                          : "check that every row has as many fields as the header and that quoted fields are closed.";
    return std::unexpected(error);
}

bool isAlsoGroup(const IntakeSettings& settings, const std::optional<std::string>& column)
{
    return column && std::find(settings.groupColumns.begin(), settings.groupColumns.end(), *column) != settings.groupColumns.end();
}

// The period and cluster columns are read like group columns (their texts dictionary-coded,
// a missing value the level "(missing)") and moved to the cohort's period and cluster afterwards.
IntakeSettings withPeriodAsGroup(const IntakeSettings& asked)
{
    IntakeSettings settings = asked;
    if (asked.periodColumn && !isAlsoGroup(asked, asked.periodColumn))
        settings.groupColumns.push_back(*asked.periodColumn);
    if (asked.clusterColumn && !isAlsoGroup(settings, asked.clusterColumn))
        settings.groupColumns.push_back(*asked.clusterColumn);
    return settings;
}

// Everything after the staging, whatever the source: the outcome coded, the scale applied, rows
// excluded and counted, the period's dates read once.
std::expected<void, InputError> finishIntake(const IntakeSettings& asked, const IntakeSettings& settings, StagedFile& staged,
                                             const StagedSources& sources, bool joined, ExclusionCounter& exclusions,
                                             IntakeResult& result)
{
    IntakeAudit& audit = result.audit;
    if (!joined && !staged.rows.ids.empty()) {
        std::unordered_set<std::string_view> seen;
        std::size_t repeated = 0;
        for (const auto& id : staged.rows.ids)
            repeated += seen.insert(id).second ? 0 : 1;
        if (repeated > 0)
            audit.warnings.push_back(std::to_string(repeated) + " rows repeat an id already seen in column '"
                                     + *settings.idColumn + "'; with one file they are kept, check that rows are not duplicated.");
    }
    if (auto usable = checkRowsToUse(audit, staged.rows.size(), exclusions, sources.cohortFile, joined); !usable)
        return std::unexpected(usable.error());
    auto cohort = assembleCohort(std::move(staged.rows), staged.outcomeLevels.levels(), settings, sources, exclusions, audit);
    if (!cohort)
        return std::unexpected(cohort.error());
    audit.exclusions = exclusions.tallies();
    if (auto enough = checkEnoughRows(audit, settings, sources.cohortFile); !enough)
        return std::unexpected(enough.error());
    result.cohort = std::move(*cohort);
    // The cluster is copied first: it may be the period column, which the period then moves.
    if (asked.clusterColumn) {
        const auto& groups = result.cohort.groups;
        const auto it = std::find_if(groups.begin(), groups.end(), [&](const CategoricalColumn& c) { return c.name == *asked.clusterColumn; });
        result.cohort.cluster = *it;
    }
    if (asked.periodColumn) {
        auto& groups = result.cohort.groups;
        const auto it = std::find_if(groups.begin(), groups.end(), [&](const CategoricalColumn& c) { return c.name == *asked.periodColumn; });
        result.cohort.period = DateColumn{*it, {}};
        // Each distinct date text is read once, here; the period analysis only applies the
        // day/month order the user chose to what was read.
        for (const auto& level : result.cohort.period->levels)
            result.cohort.period->written.push_back(readWrittenDate(level));
        if (!isAlsoGroup(asked, asked.periodColumn))
            groups.erase(it);
    }
    if (asked.clusterColumn && !isAlsoGroup(asked, asked.clusterColumn) && asked.clusterColumn != asked.periodColumn) {
        auto& groups = result.cohort.groups;
        groups.erase(std::find_if(groups.begin(), groups.end(), [&](const CategoricalColumn& c) { return c.name == *asked.clusterColumn; }));
    }
    return {};
}

// Whether a query sorts its result (ORDER BY, any case, any spacing); a rough reading of the text
// that serves only to warn.
bool hasOrderBy(const std::string& query)
{
    std::string words;
    for (const char c : lowerAscii(query)) {
        const bool space = c == ' ' || c == '\t' || c == '\n' || c == '\r';
        if (!space)
            words += c;
        else if (!words.empty() && words.back() != ' ')
            words += ' ';
    }
    return words.find("order by") != std::string::npos;
}

InputFingerprint delimitedInput(std::string role, std::string path, std::string sha256, std::size_t rows)
{
    InputFingerprint input;
    input.role = std::move(role);
    input.path = std::move(path);
    input.sha256 = std::move(sha256);
    input.rows = rows;
    return input;
}

void giveBackStagingMemory()
{
#if defined(__GLIBC__)
    // The staging freed columns that the allocator keeps for reuse (those below its mapping
    // threshold, and the second thread's arena): given back now, a ten-million-row cohort's
    // analysis starts from the cohort's own memory instead of about 90 MB above it.
    malloc_trim(0);
#endif
}

} // namespace

std::expected<IntakeResult, InputError> runIntake(const IntakeSettings& settings)
{
    if (auto ok = checkSettings(settings); !ok)
        return std::unexpected(ok.error());
    if (sourceKindOf(settings) != SourceKind::DelimitedText) {
        auto table = openTypedSource(settings);
        if (!table)
            return std::unexpected(table.error());
        return runIntake(settings, **table);
    }
    auto cohortFile = TextFile::load(settings.cohortFile, settings.maxLineBytes);
    if (!cohortFile)
        return std::unexpected(cohortFile.error());
    std::optional<TextFile> outcomesFile;
    if (settings.outcomesFile) {
        auto loaded = TextFile::load(*settings.outcomesFile, settings.maxLineBytes);
        if (!loaded)
            return std::unexpected(loaded.error());
        outcomesFile = std::move(*loaded);
    }
    return runIntake(settings, std::move(*cohortFile), std::move(outcomesFile));
}

std::expected<IntakeResult, InputError> runIntake(const IntakeSettings& asked, TypedTable& table)
{
    if (auto ok = checkSettings(asked); !ok)
        return std::unexpected(ok.error());
    IntakeSettings settings = withPeriodAsGroup(asked);
    settings.eventValue = eventValueAsCode(table, settings);
    IntakeResult result;
    ExclusionCounter exclusions;
    auto staged = stageTypedTable(table, settings, exclusions, result.audit);
    if (!staged) {
        InputError error = staged.error();
        // A workbook opened at its first sheet may hold the cohort on another one: say which exist.
        if (const auto sheet = table.sheetName(); sheet && !error.column.empty() && error.problem.starts_with("there is no ")) {
            if (const auto sheets = xlsxSheetNames(settings.cohortFile); sheets && sheets->size() > 1)
                error.remedy += " This is sheet '" + *sheet + "' of " + std::to_string(sheets->size()) + ": " + quotedList(*sheets)
                    + "; choose another with --sheet NAME (the Sheet box in the window).";
        }
        return std::unexpected(error);
    }
    if (settings.query && !hasOrderBy(*settings.query))
        result.audit.warnings.push_back("The query has no ORDER BY, so the database may return the rows in another order next time: "
                                        "the result's SHA-256, the bootstrap's draws and the row numbers would then change although "
                                        "the data did not. Add ORDER BY a unique key (the encounter id, say) to make the run repeatable.");
    const StagedSources sources{table.sourceName(), table.sourceName()};
    if (auto finished = finishIntake(asked, settings, *staged, sources, false, exclusions, result); !finished)
        return std::unexpected(finished.error());
    auto fingerprint = table.fingerprint();
    if (!fingerprint)
        return std::unexpected(fingerprint.error());
    InputFingerprint input;
    input.role = "cohort";
    input.path = settings.database ? databaseDisplayName(*settings.database) : settings.cohortFile;
    input.sha256 = std::move(*fingerprint);
    input.rows = result.audit.rowsRead;
    input.kind = sourceKindName(sourceKindOf(settings));
    input.sheet = table.sheetName() ? table.sheetName() : settings.sheet;
    input.query = settings.query;
    result.inputs.push_back(std::move(input));
    giveBackStagingMemory();
    return result;
}

std::expected<IntakeResult, InputError> runIntake(const IntakeSettings& asked, TextFile cohortFile,
                                                  std::optional<TextFile> outcomesFile)
{
    if (auto ok = checkSettings(asked); !ok)
        return std::unexpected(ok.error());
    const IntakeSettings settings = withPeriodAsGroup(asked);
    auto cohortTable = DelimitedTable::open(std::move(cohortFile), settings.delimiter);
    if (!cohortTable)
        return std::unexpected(cohortTable.error());
    // Fingerprint on the second core while the first one parses; the table (and so its file)
    // outlives the future, whose destructor waits.
    const TextFile& cohortBytes = cohortTable->file();
    auto cohortHash = std::async(std::launch::async, [&cohortBytes] { return cohortBytes.fingerprint(); });

    IntakeResult result;
    IntakeAudit& audit = result.audit;
    audit.delimiter = cohortTable->delimiter();
    audit.delimiterSniffed = cohortTable->delimiterSniffed();
    ExclusionCounter exclusions;
    StagedSources sources{cohortTable->fileName(), cohortTable->fileName()};
    std::expected<StagedFile, InputError> staged = std::unexpected(InputError{});
    std::optional<DelimitedTable> outcomesTable;
    std::string outcomesHash;
    if (outcomesFile) {
        auto fingerprint = outcomesFile->fingerprint();
        if (!fingerprint)
            return std::unexpected(fingerprint.error());
        outcomesHash = std::move(*fingerprint);
        auto opened = DelimitedTable::open(std::move(*outcomesFile), settings.delimiter);
        if (!opened)
            return std::unexpected(opened.error());
        outcomesTable = std::move(*opened);
        sources.outcomeFile = outcomesTable->fileName();
        staged = stageJoinedFiles(*cohortTable, *outcomesTable, settings, exclusions, audit);
    } else {
        staged = stageSingleFile(*cohortTable, settings, exclusions, audit);
    }
    if (!staged)
        return std::unexpected(staged.error());
    if (auto finished = finishIntake(asked, settings, *staged, sources, outcomesTable.has_value(), exclusions, result); !finished)
        return std::unexpected(finished.error());
    auto cohortFingerprint = cohortHash.get();
    if (!cohortFingerprint)
        return std::unexpected(cohortFingerprint.error());
    result.inputs.push_back(delimitedInput("cohort", settings.cohortFile, std::move(*cohortFingerprint), audit.rowsRead));
    giveBackStagingMemory();
    if (outcomesTable)
        result.inputs.push_back(delimitedInput("outcomes", *settings.outcomesFile, outcomesHash, audit.join->outcomeRows));
    return result;
}

} // namespace plumbline
