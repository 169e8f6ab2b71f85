#include "intake/staged_rows.hpp"

#include "intake/field_values.hpp"

#include <cmath>
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

std::vector<std::uint8_t> OutcomeLevelCollector::absorb(const OutcomeLevelCollector& later, std::size_t lineShift)
{
    std::vector<std::uint8_t> index;
    for (const OutcomeLevel& level : later.m_levels) {
        std::size_t i = 0;
        while (i < m_levels.size() && m_levels[i].text != level.text)
            ++i;
        if (i == m_levels.size()) {
            i = 0;
            while (i < m_levels.size() && m_levels[i].folded != level.folded)
                ++i;
        }
        if (i < m_levels.size()) {
            m_levels[i].count += level.count;
        } else if (m_levels.size() >= cap) {
            i = m_levels.size() - 1;
            m_levels[i].count += level.count;
        } else {
            m_levels.push_back({level.text, level.folded, level.count, level.firstLine + lineShift});
        }
        index.push_back(static_cast<std::uint8_t>(i));
    }
    return index;
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
    // Tiny numbers are zeros that could not be written as such: one rule for both signs, so
    // that 1e-400 and -1e-310 are read alike (as 0), not one kept and the other excluded.
    const bool subnormal = value != 0.0 && std::abs(value) < std::numeric_limits<double>::min();
    const bool roundedToZero = value == 0.0 && field.find_first_of("123456789") < field.find_first_of("eE");
    if (subnormal || roundedToZero) {
        value = 0.0;
        return ScoreFieldStatus::Underflow;
    }
    return ScoreFieldStatus::Number;
}

} // namespace plumbline
