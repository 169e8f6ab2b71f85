#include "intake/cohort_assembler.hpp"

#include <cmath>
#include <cstdio>

namespace plumbline {

namespace {

std::string percentText(double fraction)
{
    char buffer[32];
    std::snprintf(buffer, sizeof buffer, "%.1f %%", 100.0 * fraction);
    return buffer;
}

std::string numberText(double value)
{
    char buffer[32];
    std::snprintf(buffer, sizeof buffer, "%.10g", value);
    return buffer;
}

// Under the default scale, more than 1 % of scores outside [0, 1] means the scale is wrong:
// stop and say which scale fits rather than exclude most of the cohort or guess silently.
std::expected<void, InputError> checkProbabilityScale(const StagedRows& staged, const IntakeSettings& settings,
                                                      const StagedSources& sources, IntakeAudit& audit)
{
    constexpr double tolerated = 0.01;
    for (std::size_t c = 0; c < staged.rawScores.size(); ++c) {
        std::vector<double> finite;
        std::size_t outside = 0;
        std::size_t firstOutside = staged.size();
        for (std::size_t r = 0; r < staged.size(); ++r) {
            const double v = staged.rawScores[c][r];
            const ScoreFieldStatus status = staged.scoreStatus[c][r];
            if ((status != ScoreFieldStatus::Number && status != ScoreFieldStatus::Underflow) || !std::isfinite(v))
                continue;
            finite.push_back(v);
            if (v < 0.0 || v > 1.0) {
                ++outside;
                if (firstOutside == staged.size())
                    firstOutside = r;
            }
        }
        if (finite.empty() || double(outside) <= tolerated * double(finite.size()))
            continue;
        const double share = double(outside) / double(finite.size());
        const std::string& column = settings.scoreColumns[c];
        if (settings.scaleGiven) {
            audit.warnings.push_back("Column '" + column + "': " + std::to_string(outside) + " scores ("
                                     + percentText(share) + ") lie outside 0-1 and are excluded, as --scale probability asks.");
            continue;
        }
        const ScaleSuggestion suggestion = suggestScale(finite);
        InputError error;
        error.file = sources.cohortFile;
        error.line = staged.lines[firstOutside];
        error.column = column;
        error.value = numberText(staged.rawScores[c][firstOutside]);
        error.problem = std::to_string(outside) + " of " + std::to_string(finite.size()) + " scores (" + percentText(share)
            + ") lie outside 0-1, so they are not probabilities: " + suggestion.reason + ".";
        error.remedy = "if that is how the model reports risk, choose the scale " + std::string(scaleName(suggestion.scale))
            + " (Score scale in the window, --scale " + std::string(scaleName(suggestion.scale))
            + " on the command line); to exclude the values outside 0-1 instead, choose probability (--scale probability).";
        return std::unexpected(error);
    }
    return {};
}

void warnAboutUnderflow(const StagedRows& staged, const IntakeSettings& settings, const StagedSources& sources, IntakeAudit& audit)
{
    for (std::size_t c = 0; c < staged.scoreStatus.size(); ++c) {
        std::size_t count = 0, first = 0;
        for (std::size_t r = 0; r < staged.size(); ++r)
            if (staged.scoreStatus[c][r] == ScoreFieldStatus::Underflow && count++ == 0)
                first = staged.lines[r];
        if (count > 0)
            audit.warnings.push_back("Column '" + settings.scoreColumns[c] + "' of " + sources.cohortFile + ": " + std::to_string(count)
                                     + " scores are nearer to 0 than a number can hold (below 2.2e-308 in size) and were read as 0 (first on line "
                                     + std::to_string(first) + ").");
    }
}

struct RowVerdict {
    bool usable = true;
    ExclusionReason reason = ExclusionReason::MissingScore;
    std::size_t column = 0;
};

RowVerdict scoreVerdict(ScoreFieldStatus status, double raw, ScoreScale scale)
{
    if (status == ScoreFieldStatus::Missing)
        return {false, ExclusionReason::MissingScore, 0};
    if (status == ScoreFieldStatus::NotANumber)
        return {false, ExclusionReason::ScoreNotANumber, 0};
    if (!std::isfinite(raw))
        return {false, ExclusionReason::ScoreNotFinite, 0};
    if (!convertScore(raw, scale))
        return {false, ExclusionReason::ScoreOutOfRange, 0};
    return {};
}

// Keeps only the group levels that occur among the rows used (`codes`, already cut to them), in
// order of first appearance; the codes are renumbered in place.
CategoricalColumn compactGroup(std::string name, const std::vector<std::string>& levels, std::vector<std::uint32_t>&& codes)
{
    CategoricalColumn column;
    column.name = std::move(name);
    std::vector<std::int64_t> remap(levels.size(), -1);
    for (std::uint32_t& code : codes) {
        if (remap[code] < 0) {
            remap[code] = static_cast<std::int64_t>(column.levels.size());
            column.levels.push_back(levels[code]);
        }
        code = static_cast<std::uint32_t>(remap[code]);
    }
    column.codes = std::move(codes);
    return column;
}

} // namespace

std::expected<Cohort, InputError> assembleCohort(StagedRows&& staged, const std::vector<OutcomeLevel>& levels,
                                                 const IntakeSettings& settings, const StagedSources& sources,
                                                 ExclusionCounter& exclusions, IntakeAudit& audit)
{
    const auto coding = codeOutcome(levels, settings.eventValue, sources.outcomeFile, settings.outcomeColumn);
    if (!coding)
        return std::unexpected(coding.error());
    audit.eventValue = levels[coding->eventLevel].text;
    audit.nonEventValue = levels[coding->nonEventLevel].text;
    if (settings.scale == ScoreScale::Probability)
        if (auto checked = checkProbabilityScale(staged, settings, sources, audit); !checked)
            return std::unexpected(checked.error());

    const std::size_t columns = settings.scoreColumns.size();
    warnAboutUnderflow(staged, settings, sources, audit);
    audit.scoreColumns.assign(columns, {});
    for (std::size_t c = 0; c < columns; ++c)
        audit.scoreColumns[c].column = settings.scoreColumns[c];

    // Row indices fit 32 bits as the lines do (StagedRows::lines); half the memory of size_t.
    std::vector<std::uint32_t> usedRows;
    usedRows.reserve(staged.size());
    std::vector<RowVerdict> verdicts(columns);
    for (std::size_t r = 0; r < staged.size(); ++r) {
        if (staged.outcomeLevel[r] == StagedRows::missingOutcome) {
            exclusions.exclude(ExclusionReason::MissingOutcome, sources.outcomeFile, settings.outcomeColumn,
                               staged.outcomeLines[r]);
            continue;
        }
        std::size_t failing = 0;
        std::size_t firstFailing = columns;
        for (std::size_t c = 0; c < columns; ++c) {
            verdicts[c] = scoreVerdict(staged.scoreStatus[c][r], staged.rawScores[c][r], settings.scale);
            if (!verdicts[c].usable) {
                ++failing;
                ++audit.scoreColumns[c].unusable;
                if (firstFailing == columns)
                    firstFailing = c;
            }
        }
        if (failing == 0) {
            usedRows.push_back(static_cast<std::uint32_t>(r));
            continue;
        }
        if (failing == 1)
            ++audit.scoreColumns[firstFailing].onlyThisColumn;
        exclusions.exclude(verdicts[firstFailing].reason, sources.cohortFile, settings.scoreColumns[firstFailing],
                           staged.lines[r]);
    }

    // The cohort's columns are the staged ones with the unused rows squeezed out in place, so no
    // column is ever held twice (a large file's staged and assembled columns would not fit the
    // memory a ten-million-row cohort is allowed), and nothing is copied when every row is used.
    auto keepUsedRows = [&](auto& column) {
        if (usedRows.size() == column.size())
            return;
        // usedRows ascends, so usedRows[k] >= k; a row that stays put is not moved onto itself
        // (a string moved onto itself is left unspecified).
        for (std::size_t k = 0; k < usedRows.size(); ++k)
            if (usedRows[k] != k)
                column[k] = std::move(column[usedRows[k]]);
        column.resize(usedRows.size());
    };
    Cohort cohort;
    cohort.scale = settings.scale;
    keepUsedRows(staged.outcomeLevel);
    for (auto& level : staged.outcomeLevel)
        level = level == coding->eventLevel ? 1 : 0;
    cohort.outcome = std::move(staged.outcomeLevel);
    keepUsedRows(staged.lines);
    cohort.sourceLines = std::move(staged.lines);
    staged.outcomeLines = {};
    staged.scoreStatus = {};
    for (std::size_t c = 0; c < columns; ++c) {
        std::vector<double>& values = staged.rawScores[c];
        keepUsedRows(values);
        for (double& value : values)
            value = *convertScore(value, settings.scale);
        cohort.models.push_back({settings.scoreColumns[c], std::move(values)});
    }
    if (!staged.ids.empty()) {
        keepUsedRows(staged.ids);
        cohort.ids = std::move(staged.ids);
    }
    for (std::size_t g = 0; g < staged.groupCodes.size(); ++g) {
        keepUsedRows(staged.groupCodes[g]);
        cohort.groups.push_back(compactGroup(settings.groupColumns[g], staged.groupLevels[g], std::move(staged.groupCodes[g])));
    }

    audit.rowsUsed = cohort.rows();
    audit.events = cohort.events();
    audit.nonEvents = audit.rowsUsed - audit.events;
    return cohort;
}

} // namespace plumbline
