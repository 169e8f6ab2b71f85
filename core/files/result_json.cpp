#include "files/result_json.hpp"

#include "files/version.hpp"

#include <chrono>
#include <ctime>

namespace plumbline {

namespace {

nlohmann::ordered_json tallyJson(const ExclusionTally& tally)
{
    nlohmann::ordered_json out;
    out["reason"] = exclusionReasonText(tally.reason);
    out["column"] = tally.column.empty() ? nlohmann::ordered_json(nullptr) : nlohmann::ordered_json(tally.column);
    out["file"] = tally.file;
    out["rows"] = tally.rows;
    out["first_lines"] = tally.firstLines;
    return out;
}

template <typename T>
nlohmann::ordered_json optionalJson(const std::optional<T>& value)
{
    return value ? nlohmann::ordered_json(*value) : nlohmann::ordered_json(nullptr);
}

} // namespace

std::string utcTimestamp()
{
    const std::time_t now = std::chrono::system_clock::to_time_t(std::chrono::system_clock::now());
    std::tm utc{};
    gmtime_r(&now, &utc);
    char buffer[32];
    std::strftime(buffer, sizeof buffer, "%Y-%m-%dT%H:%M:%SZ", &utc);
    return buffer;
}

nlohmann::ordered_json provenanceJson(const std::string& createdUtc)
{
    return {{"version", versionString}, {"created", createdUtc}};
}

nlohmann::ordered_json inputsJson(const std::vector<InputFingerprint>& inputs)
{
    nlohmann::ordered_json out = nlohmann::ordered_json::array();
    for (const auto& input : inputs)
        out.push_back({{"role", input.role}, {"path", input.path}, {"sha256", input.sha256}, {"rows", input.rows},
                       {"kind", input.kind}, {"sheet", optionalJson(input.sheet)}, {"query", optionalJson(input.query)}});
    return out;
}

nlohmann::ordered_json intakeSettingsJson(const IntakeSettings& settings)
{
    nlohmann::ordered_json out;
    out["cohort_file"] = settings.cohortFile;
    out["sheet"] = optionalJson(settings.sheet);
    out["database"] = optionalJson(settings.database);
    out["query"] = optionalJson(settings.query);
    out["outcomes_file"] = optionalJson(settings.outcomesFile);
    out["outcome"] = settings.outcomeColumn;
    out["scores"] = settings.scoreColumns;
    out["id"] = optionalJson(settings.idColumn);
    out["outcomes_id"] = optionalJson(settings.outcomesIdColumn);
    out["groups"] = settings.groupColumns;
    out["period"] = optionalJson(settings.periodColumn);
    out["cluster"] = optionalJson(settings.clusterColumn);
    out["event"] = optionalJson(settings.eventValue);
    out["scale"] = std::string(scaleName(settings.scale));
    out["delimiter"] = settings.delimiter ? nlohmann::ordered_json(std::string(1, *settings.delimiter))
                                          : nlohmann::ordered_json(nullptr);
    out["decimal_comma"] = settings.decimalComma;
    return out;
}

nlohmann::ordered_json cohortJson(const IntakeAudit& audit)
{
    nlohmann::ordered_json out;
    out["rows_read"] = audit.rowsRead;
    out["rows_used"] = audit.rowsUsed;
    out["rows_excluded"] = audit.rowsExcluded();
    out["events"] = audit.events;
    out["non_events"] = audit.nonEvents;
    out["event_rate"] = audit.rowsUsed > 0 ? nlohmann::ordered_json(double(audit.events) / double(audit.rowsUsed))
                                           : nlohmann::ordered_json(nullptr);
    out["event_value"] = audit.eventValue;
    out["non_event_value"] = audit.nonEventValue;
    const bool text = audit.lineNoun == "line";
    out["delimiter"] = text ? nlohmann::ordered_json(std::string(1, audit.delimiter)) : nlohmann::ordered_json(nullptr);
    out["delimiter_sniffed"] = text && audit.delimiterSniffed;
    out["blank_lines_skipped"] = audit.blankLinesSkipped;
    out["first_lines_count"] = audit.lineNoun;
    nlohmann::ordered_json exclusions = nlohmann::ordered_json::array();
    for (const auto& tally : audit.exclusions)
        exclusions.push_back(tallyJson(tally));
    out["exclusions"] = exclusions;
    nlohmann::ordered_json costs = nlohmann::ordered_json::array();
    for (const auto& cost : audit.scoreColumns)
        costs.push_back({{"column", cost.column}, {"unusable", cost.unusable}, {"only_this_column", cost.onlyThisColumn}});
    out["score_columns"] = costs;
    out["join"] = nullptr; // filled when outcomes came from a second file
    if (audit.join) {
        const JoinSummary& join = *audit.join;
        nlohmann::ordered_json joinOut;
        joinOut["score_rows"] = join.scoreRows;
        joinOut["outcome_rows"] = join.outcomeRows;
        joinOut["matched"] = join.matched;
        joinOut["scores_without_outcome"] = join.scoresWithoutOutcome;
        joinOut["outcomes_without_score"] = join.outcomesWithoutScore;
        nlohmann::ordered_json outcomeExclusions = nlohmann::ordered_json::array();
        for (const auto& tally : join.outcomeFileExclusions)
            outcomeExclusions.push_back(tallyJson(tally));
        joinOut["outcome_file_exclusions"] = outcomeExclusions;
        out["join"] = joinOut;
    }
    return out;
}

} // namespace plumbline
