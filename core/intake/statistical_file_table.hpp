#pragma once

#include "intake/statistical_date_format.hpp"
#include "intake/typed_table.hpp"

#include <cstdint>
#include <expected>
#include <memory>
#include <string>
#include <vector>

namespace plumbline {

// True when the path's extension (any case) is one of .sas7bdat .xpt .dta .sav .zsav.
bool isStatisticalFile(const std::string& path);
// Opens the file and reads its metadata (variables, value labels); rows are read by forEachRecord.
std::expected<std::unique_ptr<TypedTable>, InputError> openStatisticalFile(const std::string& path);

// A SAS (.sas7bdat, .xpt), Stata (.dta) or SPSS (.sav, .zsav) data file read with ReadStat.
// Opening reads the variables and value labels; each visit parses the file again and hands on
// one observation at a time, so the file's values are never held. Numbers stay as stored, every
// missing code of the package (SAS .A–.Z, Stata .a–.z, SPSS user-missing values) is Missing, and
// numeric columns with a date format become days since 1970 (statistical_date_format).
class StatisticalFileTable final : public TypedTable {
public:
    // How the file is laid out, from its extension: ReadStat has one parser per layout.
    enum class Layout { Sas7bdat, Xport, Stata, Spss };

    // How one column's values reach a cell.
    struct ColumnReading {
        bool text = false;
        DateScale dates = DateScale::None;
        std::string format; // as the file gives it, for messages
    };

    static std::expected<std::unique_ptr<TypedTable>, InputError> open(const std::string& path, Layout layout);

    const std::string& sourceName() const override { return m_path; }
    const std::vector<TypedColumn>& columns() const override { return m_columns; }
    std::expected<void, InputError> forEachRecord(const Visit& visit) override;
    std::expected<std::string, InputError> fingerprint() const override;

private:
    StatisticalFileTable(std::string path, Layout layout);

    std::string m_path;
    Layout m_layout;
    std::vector<TypedColumn> m_columns;
    std::vector<ColumnReading> m_readings;
    std::int64_t m_rowCount = -1; // -1: the file does not say (SAS transport files)
    std::string m_encoding;       // as the file names it; empty when it does not
};

} // namespace plumbline
