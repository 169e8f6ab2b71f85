#include "intake/column_profile.hpp"

#include "intake/field_values.hpp"
#include "intake/typed_table_intake.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <limits>
#include <unordered_set>

namespace plumbline {

namespace {

bool isIsoDate(std::string_view v)
{
    if (v.size() != 10 || v[4] != '-' || v[7] != '-')
        return false;
    for (std::size_t i : {0, 1, 2, 3, 5, 6, 8, 9})
        if (v[i] < '0' || v[i] > '9')
            return false;
    return true;
}

std::string shortNumber(double v)
{
    char buffer[32];
    std::snprintf(buffer, sizeof buffer, "%.6g", v);
    return buffer;
}

// Running tallies for one column.
struct ColumnTally {
    std::size_t numbers = 0;
    std::size_t integers = 0;
    std::size_t dates = 0;
    std::size_t texts = 0;
    std::size_t missing = 0;
    double lo = std::numeric_limits<double>::infinity();
    double hi = -std::numeric_limits<double>::infinity();
    std::string loDate;
    std::string hiDate;
    std::string firstText;
    std::size_t firstTextLine = 0;
    std::unordered_set<std::string> distinct;
    bool capped = false;

    void add(std::string_view field, std::size_t line)
    {
        const std::string_view v = trimmed(field);
        if (isMissingToken(v)) {
            ++missing;
            return;
        }
        if (!capped) {
            distinct.emplace(lowerAscii(v));
            capped = distinct.size() >= distinctCap;
        }
        if (const auto number = parseNumber(v, false); number && std::isfinite(*number)) {
            ++numbers;
            integers += *number == std::floor(*number) ? 1 : 0;
            lo = std::min(lo, *number);
            hi = std::max(hi, *number);
        } else if (isIsoDate(v)) {
            ++dates;
            if (loDate.empty() || v < loDate)
                loDate = v;
            if (hiDate.empty() || v > hiDate)
                hiDate = v;
        } else {
            if (texts++ == 0) {
                firstText = v;
                firstTextLine = line;
            }
        }
    }
};

ColumnProfile describe(const std::string& name, const ColumnTally& t, std::size_t rows, const std::string& lineNoun = "line")
{
    ColumnProfile p;
    p.name = name;
    p.missing = t.missing;
    p.nonMissing = rows - t.missing;
    p.distinct = t.distinct.size();
    p.distinctCapped = t.capped;
    const std::size_t present = p.nonMissing;
    if (present == 0) {
        p.type = "empty";
        p.notes.push_back("every value is missing");
        return p;
    }
    if (p.distinct == 2) {
        p.type = "binary";
        p.levels.assign(t.distinct.begin(), t.distinct.end());
        std::sort(p.levels.begin(), p.levels.end());
        p.notes.push_back("two values: could be the outcome");
    } else if (t.numbers == present) {
        p.type = t.integers == present ? "integer" : "number";
    } else if (t.dates == present) {
        p.type = "date";
    } else {
        p.type = "text";
    }
    if (t.numbers > 0 && t.numbers < present && t.numbers >= present / 2) {
        p.notes.push_back(std::to_string(present - t.numbers) + " values are not numbers (first on " + lineNoun + " "
                          + std::to_string(t.firstTextLine) + ": '" + t.firstText + "')");
    }
    if (t.numbers > 0) {
        p.minimum = shortNumber(t.lo);
        p.maximum = shortNumber(t.hi);
        if (p.type == "number" && t.lo >= 0.0 && t.hi <= 1.0)
            p.notes.push_back("within 0-1: could be a risk score (--scale probability)");
        else if (p.type == "number" && t.lo >= 0.0 && t.hi <= 100.0 && t.hi > 1.0)
            p.notes.push_back("within 0-100: if a risk, use --scale percent");
        else if (t.numbers >= present / 2 && t.lo >= 0.0 && t.hi <= 1.0 && t.hi > 0.0 && p.type == "text")
            p.notes.push_back("mostly risks within 0-1 with some non-numbers: those rows would be excluded");
    } else if (t.dates > 0) {
        p.minimum = t.loDate;
        p.maximum = t.hiDate;
    }
    if (p.type == "text" && !t.capped && p.distinct == present && present > 1)
        p.notes.push_back("all values distinct: could be an id");
    if (p.type == "text" && !t.capped && p.distinct < present && p.distinct > present / 2 && present > 20)
        p.notes.push_back(std::to_string(present - p.distinct) + " repeated values in a mostly unique column: duplicated ids?");
    if (t.missing > 0)
        p.notes.push_back(std::to_string(t.missing) + " missing");
    return p;
}

} // namespace

std::expected<TableProfile, InputError> profileColumns(const DelimitedTable& table, std::size_t maxRows)
{
    TableProfile profile;
    const std::size_t width = table.header().size();
    std::vector<ColumnTally> tallies(width);
    const auto visited = table.forEachRecord([&](const CsvScanner& scanner) {
        if (maxRows > 0 && profile.rows >= maxRows)
            return;
        ++profile.rows;
        const auto& fields = scanner.fields();
        if (fields.size() != width) {
            if (profile.raggedRows++ == 0)
                profile.firstRaggedLine = scanner.line();
        }
        for (std::size_t c = 0; c < width; ++c)
            tallies[c].add(c < fields.size() ? fields[c] : std::string_view(), scanner.line());
    });
    if (!visited)
        return std::unexpected(visited.error());
    for (std::size_t c = 0; c < width; ++c)
        profile.columns.push_back(describe(table.header()[c], tallies[c], profile.rows));
    return profile;
}

std::expected<TableProfile, InputError> profileColumns(TypedTable& table, std::size_t maxRows)
{
    TableProfile profile;
    const auto& columns = table.columns();
    std::vector<ColumnTally> tallies(columns.size());
    const auto visited = table.forEachRecord([&](std::span<const TypedCell> cells, std::size_t position) {
        if (maxRows > 0 && profile.rows >= maxRows)
            return false;
        ++profile.rows;
        for (std::size_t c = 0; c < columns.size() && c < cells.size(); ++c)
            tallies[c].add(typedCellText(cells[c]), position);
        return true;
    });
    if (!visited)
        return std::unexpected(visited.error());
    for (std::size_t c = 0; c < columns.size(); ++c) {
        ColumnProfile column = describe(columns[c].name, tallies[c], profile.rows, table.positionNoun());
        if (!columns[c].labels.empty()) {
            std::string labels;
            for (const auto& label : columns[c].labels)
                labels += (labels.empty() ? "labels: " : ", ") + typedCellText(TypedCell::ofNumber(label.value)) + " = " + label.label;
            column.notes.push_back(labels);
        }
        profile.columns.push_back(std::move(column));
    }
    return profile;
}

} // namespace plumbline
