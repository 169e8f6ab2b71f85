#include "intake/delimiter_sniffer.hpp"

#include "intake/csv_scanner.hpp"
#include "intake/record_reader.hpp"

#include <array>
#include <cstddef>

namespace plumbline {

namespace {

struct CandidateScore {
    std::size_t headerFields = 0;
    std::size_t consistentRecords = 0;
    std::size_t sampledRecords = 0;
};

// Records: a CsvScanner over text in memory or a RecordReader over a file.
template <typename Records>
CandidateScore scoreCandidate(Records records)
{
    constexpr std::size_t sampleRecords = 50;
    CandidateScore score;
    if (!records.next())
        return score;
    score.headerFields = records.fields().size();
    while (score.sampledRecords < sampleRecords && records.next()) {
        ++score.sampledRecords;
        if (records.fields().size() == score.headerFields)
            ++score.consistentRecords;
    }
    return score;
}

template <typename RecordsOf>
std::optional<char> bestDelimiter(RecordsOf recordsOf)
{
    constexpr std::array<char, 4> candidates{',', ';', '\t', '|'};
    std::optional<char> best;
    CandidateScore bestScore;
    for (char candidate : candidates) {
        const CandidateScore score = scoreCandidate(recordsOf(candidate));
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

} // namespace

std::optional<char> sniffDelimiter(std::string_view text)
{
    return bestDelimiter([text](char delimiter) { return CsvScanner(text, delimiter); });
}

std::optional<char> sniffDelimiter(const TextFile& file)
{
    // A file that cannot be read to the end is reported by the pass over its records.
    return bestDelimiter([&file](char delimiter) { return RecordReader(file, delimiter); });
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
