#include "intake/intake_audit.hpp"

#include <algorithm>

namespace plumbline {

std::string exclusionReasonText(ExclusionReason reason)
{
    switch (reason) {
    case ExclusionReason::WrongFieldCount: return "wrong number of fields";
    case ExclusionReason::StrayQuote: return "text after a closing quote";
    case ExclusionReason::MissingId: return "missing id";
    case ExclusionReason::DuplicateId: return "duplicate id";
    case ExclusionReason::NoMatchingOutcome: return "no matching outcome row";
    case ExclusionReason::OutcomeIdDuplicated: return "id duplicated in the outcomes file";
    case ExclusionReason::IdDuplicatedInScores: return "id duplicated in the scores file";
    case ExclusionReason::MissingOutcome: return "missing outcome";
    case ExclusionReason::MissingScore: return "missing score";
    case ExclusionReason::ScoreNotANumber: return "score is not a number";
    case ExclusionReason::ScoreNotFinite: return "score is not finite";
    case ExclusionReason::ScoreOutOfRange: return "score outside the scale's range";
    }
    return "unknown";
}

std::size_t IntakeAudit::rowsExcluded() const
{
    std::size_t total = 0;
    for (const auto& tally : exclusions)
        total += tally.rows;
    return total;
}

bool IntakeAudit::balances() const
{
    if (rowsRead != rowsUsed + rowsExcluded() || rowsUsed != events + nonEvents)
        return false;
    if (!join)
        return true;
    std::size_t outcomeExcluded = 0;
    for (const auto& tally : join->outcomeFileExclusions)
        outcomeExcluded += tally.rows;
    return join->outcomeRows == join->matched + join->outcomesWithoutScore + outcomeExcluded
        && join->scoreRows == rowsRead;
}

void ExclusionCounter::exclude(ExclusionReason reason, const std::string& file, const std::string& column,
                               std::size_t line)
{
    auto [it, inserted] = m_tallies.try_emplace({reason, file, column});
    ExclusionTally& tally = it->second;
    if (inserted) {
        tally.reason = reason;
        tally.file = file;
        tally.column = column;
    }
    ++tally.rows;
    ++m_total;
    // Lines may arrive out of file order (joins); keep the five smallest.
    if (tally.firstLines.size() < linesKept || line < tally.firstLines.back()) {
        tally.firstLines.insert(std::upper_bound(tally.firstLines.begin(), tally.firstLines.end(), line), line);
        if (tally.firstLines.size() > linesKept)
            tally.firstLines.pop_back();
    }
}

void ExclusionCounter::absorb(const ExclusionCounter& later, std::size_t lineShift)
{
    for (const auto& [key, tally] : later.m_tallies) {
        // Every line of this counter comes before every line of `later`: its first lines are
        // followed by the later ones.
        ExclusionTally& mine = m_tallies.try_emplace(key, ExclusionTally{tally.reason, tally.file, tally.column, 0, {}}).first->second;
        mine.rows += tally.rows;
        for (const std::size_t line : tally.firstLines)
            if (mine.firstLines.size() < linesKept)
                mine.firstLines.push_back(line + lineShift);
    }
    m_total += later.m_total;
}

std::vector<ExclusionTally> ExclusionCounter::tallies() const
{
    std::vector<ExclusionTally> out;
    out.reserve(m_tallies.size());
    for (const auto& [key, tally] : m_tallies)
        out.push_back(tally);
    std::stable_sort(out.begin(), out.end(), [](const ExclusionTally& a, const ExclusionTally& b) {
        if (a.reason != b.reason)
            return a.reason < b.reason;
        return a.firstLines.front() < b.firstLines.front();
    });
    return out;
}

std::string positionNounPlural(const std::string& noun)
{
    const std::size_t space = noun.find(' ');
    return space == std::string::npos ? noun + "s" : noun.substr(0, space) + "s" + noun.substr(space);
}

} // namespace plumbline
