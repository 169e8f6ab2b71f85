#pragma once

#include "intake/input_error.hpp"
#include "intake/typed_table.hpp"

#include <expected>
#include <optional>
#include <string>
#include <vector>

namespace plumbline {

// What the three query readers (PostgreSQL, SQLite, ODBC) share: the names, the positions, the
// checks of the result's column names and the fingerprint taken while the rows stream past.
// sourceName() is "query result (DISPLAY)", DISPLAY being databaseDisplayName of the database,
// so a message or the audit says which database the rows came from without any secret.
class QueryResultTable : public TypedTable {
public:
    const std::string& sourceName() const override { return m_sourceName; }
    std::string positionNoun() const override { return "row of the result"; }
    const std::vector<TypedColumn>& columns() const override { return m_columns; }
    // Runs the query again on every call; the fingerprint is that of the last visit.
    std::expected<void, InputError> forEachRecord(const Visit& visit) final;
    std::expected<std::string, InputError> fingerprint() const override;

protected:
    QueryResultTable(std::string displayName, std::vector<TypedColumn> columns);

    enum class StreamEnd { Complete, Stopped };
    // Runs the query and hands every row to `visit`, stopping when it returns false. A failure
    // part-way is an InputError naming the row reached.
    virtual std::expected<StreamEnd, InputError> streamRows(const Visit& visit) = 0;

    const std::string& displayName() const { return m_displayName; }
    // An InputError about this database: file = the display name, line = the result row (0: none).
    InputError error(std::size_t row, std::string problem, std::string remedy) const;

private:
    std::string m_displayName;
    std::string m_sourceName;
    std::vector<TypedColumn> m_columns;
    std::optional<std::string> m_fingerprint;
    std::string m_fingerprintGap; // why there is no fingerprint yet
};

// An InputError about a database: file = its display name, no row.
InputError databaseError(const std::string& displayName, std::string problem, std::string remedy);

// The result's column names as TypedColumns, or an InputError when one is unnamed (empty, or
// PostgreSQL's "?column?") or two share a name: the intake finds columns by name.
std::expected<std::vector<TypedColumn>, InputError> namedResultColumns(const std::vector<std::string>& names,
                                                                      const std::string& displayName);

} // namespace plumbline
