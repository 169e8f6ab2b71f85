#pragma once

#include "intake/input_error.hpp"
#include "intake/typed_cell.hpp"

#include <cstddef>
#include <expected>
#include <functional>
#include <optional>
#include <span>
#include <string>
#include <vector>

namespace plumbline {

// A value label of a statistical file: the code as stored and the text shown for it.
struct ValueLabel {
    double value = 0.0;
    std::string label;
};

// One column of a typed source: its name and, for statistical files, its value labels.
struct TypedColumn {
    std::string name;
    std::vector<ValueLabel> labels;
};

// A table whose cells carry their type: a statistical file, a spreadsheet's sheet or a query's
// result. The intake reads it like a delimited file (same mapping, same audit, same messages),
// with rows named by their position in the source instead of a text line.
class TypedTable {
public:
    // Called once per record, in order: one cell per column, and the record's position, the
    // number a person finds it by (a sheet's row number, an observation number, a result row),
    // counted from 1. Returning false stops the visit early (a preview).
    using Visit = std::function<bool(std::span<const TypedCell> cells, std::size_t position)>;

    virtual ~TypedTable() = default;

    // Where the rows come from, as messages and the audit name it: the path, with the sheet
    // ("cohort.xlsx, sheet 'Cohort'"), or "query result".
    virtual const std::string& sourceName() const = 0;
    // How a record's position is called in messages and the audit: "row" or "row of the result".
    virtual std::string positionNoun() const { return "row"; }
    virtual const std::vector<TypedColumn>& columns() const = 0;
    // A workbook's sheet by its name (even when it was chosen by number); nullopt for other sources.
    virtual std::optional<std::string> sheetName() const { return std::nullopt; }

    // Visits every record. A failure part-way (a truncated file, a dropped connection) is an
    // InputError naming the position reached; rows already visited must then be thrown away.
    virtual std::expected<void, InputError> forEachRecord(const Visit& visit) = 0;

    // What the reader noticed that the user should know (a formula without a cached value...).
    virtual std::vector<std::string> warnings() const { return {}; }
    // The fingerprint recorded for the input: the file's SHA-256, or for a query the SHA-256 of
    // the result set as read (known after a complete visit).
    virtual std::expected<std::string, InputError> fingerprint() const = 0;
};

} // namespace plumbline
