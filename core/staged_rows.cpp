#include "staged_rows.hpp"

#include "field_values.hpp"

#include <limits>

namespace plumbline {

std::uint8_t OutcomeLevelCollector::add(std::string_view field, std::size_t line)
{
    const std::string_view value = trimmed(field);
    if (isMissingToken(value))
        return StagedRows::missingOutcome;
    for (std::size_t i = 0; i < m_levels.size(); ++i)
        if (m_levels[i].text == value) {
            ++m_levels[i].count;
            return static_cast<std::uint8_t>(i);
        }
    const std::string folded = lowerAscii(value);
    for (std::size_t i = 0; i < m_levels.size(); ++i)
        if (m_levels[i].folded == folded) {
            ++m_levels[i].count;
            return static_cast<std::uint8_t>(i);
        }
    if (m_levels.size() >= cap) {
        // Already far from binary; keep counting the overflow in the last slot's neighbour list.
        ++m_levels.back().count;
        return static_cast<std::uint8_t>(m_levels.size() - 1);
    }
    m_levels.push_back({std::string(value), folded, 1, line});
    return static_cast<std::uint8_t>(m_levels.size() - 1);
}

std::uint32_t LevelDictionary::code(std::string_view field)
{
    std::string value(trimmed(field));
    if (isMissingToken(value))
        value = "(missing)";
    const auto [it, inserted] = m_codes.try_emplace(value, static_cast<std::uint32_t>(m_levels.size()));
    if (inserted)
        m_levels.push_back(value);
    return it->second;
}

std::optional<ExclusionReason> recordShapeProblem(const CsvScanner& scanner, std::size_t width)
{
    if (scanner.fields().size() != width)
        return ExclusionReason::WrongFieldCount;
    if (scanner.strayQuote())
        return ExclusionReason::StrayQuote;
    return std::nullopt;
}

ScoreFieldStatus readScoreField(std::string_view field, bool decimalComma, double& value)
{
    if (isMissingToken(field)) {
        value = std::numeric_limits<double>::quiet_NaN();
        return ScoreFieldStatus::Missing;
    }
    const auto parsed = parseNumber(field, decimalComma);
    if (!parsed) {
        value = std::numeric_limits<double>::quiet_NaN();
        return ScoreFieldStatus::NotANumber;
    }
    value = *parsed;
    return ScoreFieldStatus::Number;
}

} // namespace plumbline
