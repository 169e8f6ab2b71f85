#include "intake/query_result_table.hpp"

#include "intake/result_fingerprint.hpp"

#include <set>
#include <utility>

namespace plumbline {

QueryResultTable::QueryResultTable(std::string displayName, std::vector<TypedColumn> columns)
    : m_displayName(std::move(displayName))
    , m_sourceName("query result (" + m_displayName + ")")
    , m_columns(std::move(columns))
    , m_fingerprintGap("the query result has not been read yet.")
{
}

std::expected<void, InputError> QueryResultTable::forEachRecord(const Visit& visit)
{
    m_fingerprint.reset();
    m_fingerprintGap = "the query result was not read to its end.";
    ResultFingerprint digest(m_columns);
    auto hashed = [&](std::span<const TypedCell> cells, std::size_t position) {
        digest.addRecord(cells);
        return visit(cells, position);
    };
    auto end = streamRows(hashed);
    if (!end) {
        m_fingerprintGap = "reading the query result failed.";
        return std::unexpected(std::move(end.error()));
    }
    if (*end == StreamEnd::Complete)
        m_fingerprint = digest.hexDigest();
    return {};
}

std::expected<std::string, InputError> QueryResultTable::fingerprint() const
{
    if (m_fingerprint)
        return *m_fingerprint;
    return std::unexpected(error(0, m_fingerprintGap,
                                 "read the whole result before asking for its fingerprint (a preview stops early)."));
}

InputError QueryResultTable::error(std::size_t row, std::string problem, std::string remedy) const
{
    InputError failure = databaseError(m_displayName, std::move(problem), std::move(remedy));
    failure.line = row;
    failure.lineNoun = positionNoun(); // "row of the result 7", not "line 7": there are no lines
    return failure;
}

InputError databaseError(const std::string& displayName, std::string problem, std::string remedy)
{
    InputError failure;
    failure.file = displayName;
    failure.problem = std::move(problem);
    failure.remedy = std::move(remedy);
    return failure;
}

std::expected<std::vector<TypedColumn>, InputError> namedResultColumns(const std::vector<std::string>& names,
                                                                      const std::string& displayName)
{
    std::vector<TypedColumn> columns;
    std::set<std::string> seen;
    for (std::size_t i = 0; i < names.size(); ++i) {
        InputError failure;
        failure.file = displayName;
        failure.column = names[i];
        if (names[i].empty() || names[i] == "?column?") {
            failure.problem = "column " + std::to_string(i + 1) + " of the query result has no name.";
            failure.remedy = "give it one in the query, e.g. SELECT count(*) AS patients.";
            return std::unexpected(failure);
        }
        if (!seen.insert(names[i]).second) {
            failure.problem = "two columns of the query result share this name, so neither could be chosen by it.";
            failure.remedy = "give each an alias in the query, e.g. SELECT a.id AS patient_id, b.id AS visit_id.";
            return std::unexpected(failure);
        }
        columns.push_back(TypedColumn{names[i], {}});
    }
    return columns;
}

} // namespace plumbline
