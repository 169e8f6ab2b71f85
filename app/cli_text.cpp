#include "cli_text.hpp"

#include "reporting/cautions.hpp"
#include "files/version.hpp"

#include <cstdio>
#include <iomanip>

namespace plumbline::cli {

namespace {

std::string lineList(const std::vector<std::size_t>& lines, std::size_t rows, const std::string& noun)
{
    std::string out = (rows == 1 ? noun : positionNounPlural(noun)) + " ";
    for (std::size_t i = 0; i < lines.size(); ++i)
        out += (i ? ", " : "") + std::to_string(lines[i]);
    if (rows > lines.size())
        out += ", ...";
    return out;
}

void printTally(std::ostream& out, const ExclusionTally& tally, const std::string& noun)
{
    std::string label = exclusionReasonText(tally.reason);
    if (!tally.column.empty())
        label += " (" + tally.column + ")";
    out << "    " << std::left << std::setw(50) << label << std::right << std::setw(9) << withThousands(tally.rows)
        << "   " << lineList(tally.firstLines, tally.rows, noun) << '\n';
}

} // namespace

std::string withThousands(std::size_t value)
{
    const std::string digits = std::to_string(value);
    std::string out;
    out.reserve(digits.size() + digits.size() / 3);
    for (std::size_t i = 0; i < digits.size(); ++i) {
        if (i > 0 && (digits.size() - i) % 3 == 0)
            out.push_back(',');
        out.push_back(digits[i]);
    }
    return out;
}

void printIntakeSummary(std::ostream& out, const IntakeSettings& settings, const IntakeResult& result)
{
    const IntakeAudit& audit = result.audit;
    out << "Plumbline " << versionString << " - cohort intake\n";
    for (const auto& input : result.inputs) {
        out << "  " << std::left << std::setw(11) << input.role << std::right << input.path
            << (input.sheet ? ", sheet '" + *input.sheet + "'" : std::string()) << "  (" << (input.kind == "delimited text" ? std::string() : input.kind + ", ") << "SHA-256 "
            << (input.query ? "of the result " : "") << input.sha256.substr(0, 12) << "...)\n";
        if (input.query)
            out << "  query      " << *input.query << '\n';
    }
    out << "  outcome    " << settings.outcomeColumn << " (event = '" << audit.eventValue << "')\n";
    for (const auto& model : result.cohort.models)
        out << "  model      " << model.name << " (" << scaleName(result.cohort.scale) << " scale)\n";
    char rate[32];
    std::snprintf(rate, sizeof rate, "%.1f %%", audit.rowsUsed ? 100.0 * double(audit.events) / double(audit.rowsUsed) : 0.0);
    out << "\n  rows read      " << std::setw(9) << withThousands(audit.rowsRead) << '\n';
    out << "  rows used      " << std::setw(9) << withThousands(audit.rowsUsed) << "   (" << withThousands(audit.events)
        << " events, " << withThousands(audit.nonEvents) << " non-events, event rate " << rate << ")\n";
    out << "  rows excluded  " << std::setw(9) << withThousands(audit.rowsExcluded()) << '\n';
    for (const auto& tally : audit.exclusions)
        printTally(out, tally, audit.lineNoun);
    if (audit.join) {
        const JoinSummary& join = *audit.join;
        out << "\n  join on id: " << withThousands(join.matched) << " matched; " << withThousands(join.scoresWithoutOutcome)
            << " score rows without an outcome; " << withThousands(join.outcomesWithoutScore)
            << " outcome rows without a score row\n";
        out << "  outcomes file: " << withThousands(join.outcomeRows) << " rows\n";
        for (const auto& tally : join.outcomeFileExclusions)
            printTally(out, tally, "line");
    }
    for (const auto& warning : audit.warnings)
        out << "\n  warning: " << warning << '\n';
}

void printCautions(std::ostream& out)
{
    out << "\nCautions:\n";
    for (const auto caution : standardCautions)
        out << "  - " << caution << '\n';
}

} // namespace plumbline::cli
