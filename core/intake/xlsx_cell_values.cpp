#include "intake/xlsx_cell_values.hpp"

#include "intake/written_date.hpp"
#include "intake/xlsx_dates.hpp"

#include <array>
#include <charconv>
#include <chrono>
#include <cmath>
#include <cstdio>
#include <optional>

namespace plumbline {

namespace {

std::optional<double> number(std::string_view text)
{
    double value = 0.0;
    const auto [end, error] = std::from_chars(text.data(), text.data() + text.size(), value);
    if (error != std::errc() || end != text.data() + text.size() || !std::isfinite(value))
        return std::nullopt;
    return value;
}

// A `t="d"` cell holds an ISO 8601 date (ECMA-376 Part 1, 18.17.4); its time is dropped.
std::optional<std::int64_t> isoDays(std::string_view text)
{
    const WrittenDate written = readWrittenDate(text);
    if (written.shape != WrittenDate::Shape::Iso)
        return std::nullopt;
    const std::chrono::year_month_day date{std::chrono::year(written.year), std::chrono::month(static_cast<unsigned>(written.first)),
                                           std::chrono::day(static_cast<unsigned>(written.second))};
    if (!date.ok())
        return std::nullopt;
    return std::chrono::sys_days(date).time_since_epoch().count();
}

std::string isoText(std::int64_t days)
{
    const std::chrono::year_month_day date{std::chrono::sys_days(std::chrono::days(days))};
    std::array<char, 24> text{};
    std::snprintf(text.data(), text.size(), "%04d-%02u-%02u", static_cast<int>(date.year()),
                  static_cast<unsigned>(date.month()), static_cast<unsigned>(date.day()));
    return text.data();
}

std::string notA(const char* what, XlsxCellType type)
{
    const char* typeName = type == XlsxCellType::Boolean ? "a true/false cell" : "a number cell";
    return std::string("the cell is ") + typeName + " but its stored value is not " + what + ".";
}

} // namespace

XlsxCellValues::XlsxCellValues(const XlsxSharedStrings& strings, const XlsxStyles& styles, bool date1904)
    : m_strings(strings)
    , m_styles(styles)
    , m_date1904(date1904)
{
}

std::expected<XlsxCellValues::Reading, std::string> XlsxCellValues::read(const XlsxRawCell& raw) const
{
    const std::string_view value = raw.value;
    const bool formulaString = raw.type == XlsxCellType::FormulaString;
    if (raw.hasFormula && !formulaString && value.empty())
        return Reading{TypedCell::missing(), Note::FormulaWithoutValue};
    if (value.empty())
        return Reading{}; // an empty cell, or an empty text
    switch (raw.type) {
    case XlsxCellType::Number: {
        const auto parsed = number(value);
        if (!parsed)
            return std::unexpected(notA("a number", raw.type));
        if (!m_styles.isDate(raw.style))
            return Reading{TypedCell::ofNumber(*parsed)};
        if (const auto days = xlsxSerialToDays(*parsed, m_date1904))
            return Reading{TypedCell::ofDate(*days)};
        return Reading{TypedCell::missing(), Note::DateOutOfRange};
    }
    case XlsxCellType::SharedString: {
        const auto index = number(value);
        const auto text = index && *index >= 0 && *index == std::floor(*index) && *index < 1e15
                              ? m_strings.at(static_cast<std::size_t>(*index)) : std::nullopt;
        if (!text)
            return std::unexpected("the cell points at shared string " + std::string(value) + ", which the workbook's table of "
                                   + std::to_string(m_strings.size()) + " strings does not hold.");
        return Reading{text->empty() ? TypedCell::missing() : TypedCell::ofText(*text)};
    }
    case XlsxCellType::InlineString:
    case XlsxCellType::FormulaString:
        return Reading{TypedCell::ofText(value)};
    case XlsxCellType::Boolean:
        if (value == "1" || value == "true")
            return Reading{TypedCell::ofNumber(1.0)};
        if (value == "0" || value == "false")
            return Reading{TypedCell::ofNumber(0.0)};
        return std::unexpected(notA("0 or 1", raw.type));
    case XlsxCellType::Error:
        // Its code as text, as a delimited export writes it: a score there is "not a number".
        return Reading{TypedCell::ofText(value), Note::ErrorValue};
    case XlsxCellType::IsoDate:
        if (const auto days = isoDays(value))
            return Reading{TypedCell::ofDate(*days)};
        return std::unexpected(std::string("the cell is a date cell but its stored value is not a date written YYYY-MM-DD."));
    }
    return Reading{};
}

std::expected<std::string, std::string> XlsxCellValues::name(const XlsxRawCell& raw) const
{
    if (raw.type == XlsxCellType::Error)
        return raw.value;
    const auto reading = read(raw);
    if (!reading)
        return std::unexpected(reading.error());
    const TypedCell& cell = reading->cell;
    switch (cell.kind) {
    case CellKind::Missing:
        return std::string();
    case CellKind::Text:
        return std::string(cell.text);
    case CellKind::Date:
        return isoText(cell.day);
    case CellKind::Number:
        break;
    }
    if (raw.type == XlsxCellType::Boolean)
        return std::string(cell.number != 0.0 ? "TRUE" : "FALSE");
    std::array<char, 32> digits{};
    const auto written = std::to_chars(digits.data(), digits.data() + digits.size(), cell.number);
    return std::string(digits.data(), written.ptr);
}

} // namespace plumbline
