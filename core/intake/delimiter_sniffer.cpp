#include "intake/delimiter_sniffer.hpp"

#include "intake/csv_scanner.hpp"

#include <array>
#include <cstddef>

namespace plumbline {

namespace {

struct CandidateScore {
    std::size_t headerFields = 0;
    std::size_t consistentRecords = 0;
    std::size_t sampledRecords = 0;
};

CandidateScore scoreCandidate(std::string_view text, char delimiter)
{
    constexpr std::size_t sampleRecords = 50;
    CsvScanner scanner(text, delimiter);
    CandidateScore score;
    if (!scanner.next())
        return score;
    score.headerFields = scanner.fields().size();
    while (score.sampledRecords < sampleRecords && scanner.next()) {
        ++score.sampledRecords;
        if (scanner.fields().size() == score.headerFields)
            ++score.consistentRecords;
    }
    return score;
}

} // namespace

std::optional<char> sniffDelimiter(std::string_view text)
{
    constexpr std::array<char, 4> candidates{',', ';', '\t', '|'};
    std::optional<char> best;
    CandidateScore bestScore;
    for (char candidate : candidates) {
        const CandidateScore score = scoreCandidate(text, candidate);
        if (score.headerFields < 2)
            continue;
        // Steadiness first (share of records with the header's field count), then more fields.
        const auto steadiness = [](const CandidateScore& s) {
            return s.sampledRecords == 0 ? 1.0 : double(s.consistentRecords) / double(s.sampledRecords);
        };
        const bool better = !best || steadiness(score) > steadiness(bestScore) + 1e-9
            || (steadiness(score) > steadiness(bestScore) - 1e-9 && score.headerFields > bestScore.headerFields);
        if (better) {
            best = candidate;
            bestScore = score;
        }
    }
    return best;
}

std::string_view delimiterName(char delimiter)
{
    switch (delimiter) {
    case ',': return "comma";
    case ';': return "semicolon";
    case '\t': return "tab";
    case '|': return "pipe";
    default: return "other";
    }
}

} // namespace plumbline
