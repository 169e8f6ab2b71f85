#include "intake/source_kind.hpp"

#include "intake/field_values.hpp"

#include <array>

namespace plumbline {

namespace {

bool endsWith(std::string_view text, std::string_view ending)
{
    return text.size() >= ending.size() && text.substr(text.size() - ending.size()) == ending;
}

} // namespace

SourceKind sourceKindOfPath(std::string_view path)
{
    const std::string lower = lowerAscii(path);
    if (endsWith(lower, ".xlsx"))
        return SourceKind::Spreadsheet;
    for (const std::string_view ending : std::array<std::string_view, 5>{".sas7bdat", ".xpt", ".dta", ".sav", ".zsav"})
        if (endsWith(lower, ending))
            return SourceKind::StatisticalFile;
    return SourceKind::DelimitedText;
}

SourceKind sourceKindOf(const IntakeSettings& settings)
{
    return settings.database ? SourceKind::Database : sourceKindOfPath(settings.cohortFile);
}

std::string sourceKindName(SourceKind kind)
{
    switch (kind) {
    case SourceKind::Spreadsheet: return "spreadsheet";
    case SourceKind::StatisticalFile: return "statistical file";
    case SourceKind::Database: return "database query";
    case SourceKind::DelimitedText: break;
    }
    return "delimited text";
}

} // namespace plumbline
