#pragma once

#include "metrics/score_order.hpp"

#include <cstddef>
#include <cstdint>
#include <limits>
#include <span>
#include <vector>

namespace plumbline {

// The rows of a cohort split into disjoint subsets by a dictionary-coded column (the periods of
// a date column, the first and latest year), each subset's rows kept in data order as 32-bit row
// numbers. A subset's order by ascending score is read off the whole cohort's: filtered to the
// subset and renumbered, the cohort's order (by score, then row) is the subset's own
// ascendingOrder, so no subset is sorted again.
class RowSubsets {
public:
    static constexpr std::uint32_t none = std::numeric_limits<std::uint32_t>::max();

    // Row i belongs to subset subsetOfCode[codes[i]], or to none.
    RowSubsets(std::span<const std::uint32_t> codes, std::span<const std::uint32_t> subsetOfCode, std::size_t subsets);

    std::size_t size() const { return m_rows.size(); }
    const std::vector<std::uint32_t>& rows(std::size_t subset) const { return m_rows[subset]; }
    // Each subset's ascending order, as positions among its own rows.
    std::vector<ScoreOrder> orders(const ScoreOrder& cohortOrder) const;

private:
    std::span<const std::uint32_t> m_codes;
    std::vector<std::uint32_t> m_subsetOfCode;
    std::vector<std::vector<std::uint32_t>> m_rows;
};

} // namespace plumbline
