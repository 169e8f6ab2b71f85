#pragma once

#include "intake/typed_table.hpp"

#include <string>
#include <vector>

namespace plumbline::test {

// A typed source held in memory: what a statistical file, a sheet or a query would hand the
// intake, written out cell by cell in a test. Positions are given per row.
class MemoryTable : public TypedTable {
public:
    struct Cell {
        CellKind kind = CellKind::Missing;
        double number = 0.0;
        std::string text;
        std::int64_t day = 0;
    };

    MemoryTable(std::string source, std::vector<TypedColumn> columns) : m_source(std::move(source)), m_columns(std::move(columns)) {}

    void addRow(std::vector<Cell> cells, std::size_t position) { m_rows.push_back({std::move(cells), position}); }
    // The visit fails with this error after `rows` rows (a dropped connection, a truncated file).
    void failAfter(std::size_t rows, InputError error) { m_failAfter = rows; m_failure = std::move(error); }
    std::size_t rowsVisited() const { return m_visited; }

    const std::string& sourceName() const override { return m_source; }
    const std::vector<TypedColumn>& columns() const override { return m_columns; }
    std::vector<std::string> warnings() const override { return m_warnings; }
    void addWarning(std::string warning) { m_warnings.push_back(std::move(warning)); }
    std::expected<std::string, InputError> fingerprint() const override { return std::string(64, 'a'); }

    std::expected<void, InputError> forEachRecord(const Visit& visit) override
    {
        std::vector<TypedCell> cells;
        for (const auto& row : m_rows) {
            if (m_visited == m_failAfter)
                return std::unexpected(m_failure);
            cells.clear();
            for (const Cell& cell : row.cells)
                cells.push_back({cell.kind, cell.number, cell.text, cell.day});
            ++m_visited;
            if (!visit(cells, row.position))
                return {};
        }
        return {};
    }

    static Cell number(double value) { return {CellKind::Number, value, {}, 0}; }
    static Cell text(std::string value) { return {CellKind::Text, 0.0, std::move(value), 0}; }
    static Cell date(std::int64_t days) { return {CellKind::Date, 0.0, {}, days}; }
    static Cell missing() { return {}; }

private:
    struct Row {
        std::vector<Cell> cells;
        std::size_t position;
    };
    std::string m_source;
    std::vector<TypedColumn> m_columns;
    std::vector<Row> m_rows;
    std::vector<std::string> m_warnings;
    std::size_t m_failAfter = static_cast<std::size_t>(-1);
    InputError m_failure;
    std::size_t m_visited = 0;
};

} // namespace plumbline::test
