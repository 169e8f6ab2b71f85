#include "intake/typed_source.hpp"

#include "intake/query_table.hpp"
#include "intake/source_kind.hpp"
#include "intake/statistical_file_table.hpp"
#include "intake/xlsx_table.hpp"

namespace plumbline {

std::expected<std::unique_ptr<TypedTable>, InputError> openTypedSource(const IntakeSettings& settings)
{
    switch (sourceKindOf(settings)) {
    case SourceKind::Database:
        return openQueryTable(*settings.database, settings.query.value_or(""));
    case SourceKind::Spreadsheet:
        return openXlsxTable(settings.cohortFile, settings.sheet);
    case SourceKind::StatisticalFile:
        return openStatisticalFile(settings.cohortFile);
    case SourceKind::DelimitedText:
        break;
    }
    InputError error;
    error.file = settings.cohortFile;
    error.problem = "the file is delimited text, not a typed source.";
    error.remedy = "this is a fault in Plumbline: please report it with the command you ran.";
    return std::unexpected(error);
}

} // namespace plumbline
