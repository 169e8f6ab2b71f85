#pragma once

#include <cstddef>
#include <map>
#include <optional>
#include <string>
#include <tuple>
#include <vector>

namespace plumbline {

// Why a row was left out. The order here is the order in which rows are checked, so each
// excluded row is counted once, under the first reason that applies.
enum class ExclusionReason {
    WrongFieldCount,
    StrayQuote,
    MissingId,
    DuplicateId,
    NoMatchingOutcome,
    OutcomeIdDuplicated,
    IdDuplicatedInScores,
    MissingOutcome,
    MissingScore,
    ScoreNotANumber,
    ScoreNotFinite,
    ScoreOutOfRange,
};

std::string exclusionReasonText(ExclusionReason reason);

// The plural of a position noun ("line" → "lines", "row of the result" → "rows of the result").
std::string positionNounPlural(const std::string& noun);

// All rows excluded for one reason (and one column, where the reason concerns a column).
struct ExclusionTally {
    ExclusionReason reason;
    std::string file;                     // the file whose lines are listed
    std::string column;                   // empty when the reason is not about one column
    std::size_t rows = 0;
    std::vector<std::size_t> firstLines;  // first five source lines, in file order
};

// What each score column cost: rows whose value in this column was unusable, and how many
// rows would have been kept had this column alone been left out of the analysis.
struct ScoreColumnCost {
    std::string column;
    std::size_t unusable = 0;
    std::size_t onlyThisColumn = 0;
};

// The two-file join, from both sides.
struct JoinSummary {
    std::size_t scoreRows = 0;
    std::size_t outcomeRows = 0;
    std::size_t matched = 0;
    std::size_t scoresWithoutOutcome = 0;
    std::size_t outcomesWithoutScore = 0;
    // Outcome-file rows that could not take part (missing or duplicated id, malformed rows).
    // outcomeRows = matched + outcomesWithoutScore + Σ outcomeFileExclusions.rows
    std::vector<ExclusionTally> outcomeFileExclusions;
};

// Every row of the cohort file, accounted for: rowsRead = rowsUsed + Σ exclusions.rows.
struct IntakeAudit {
    std::size_t rowsRead = 0;
    std::size_t rowsUsed = 0;
    std::size_t events = 0;
    std::size_t nonEvents = 0;
    std::size_t blankLinesSkipped = 0;
    char delimiter = ',';
    bool delimiterSniffed = true;
    // What first_lines count: "line" of a text file, or "row" of a sheet, a statistical file or a
    // query result (a typed source has no delimiter, and delimiter is then left at its default).
    std::string lineNoun = "line";
    std::string eventValue;
    std::string nonEventValue;
    std::vector<ExclusionTally> exclusions;
    std::vector<ScoreColumnCost> scoreColumns;
    std::optional<JoinSummary> join;
    std::vector<std::string> warnings;

    std::size_t rowsExcluded() const;
    bool balances() const; // rowsRead == rowsUsed + rowsExcluded() (and the join balances)
};

// Collects exclusions row by row and hands them out in a stable order.
class ExclusionCounter {
public:
    static constexpr std::size_t linesKept = 5;

    void exclude(ExclusionReason reason, const std::string& file, const std::string& column, std::size_t line);
    // Adds the tallies of a later part of the same file, whose lines count from `lineShift` + 1.
    void absorb(const ExclusionCounter& later, std::size_t lineShift);
    std::size_t total() const { return m_total; }
    std::vector<ExclusionTally> tallies() const; // ordered by reason, then first line

private:
    std::map<std::tuple<ExclusionReason, std::string, std::string>, ExclusionTally> m_tallies;
    std::size_t m_total = 0;
};

} // namespace plumbline
