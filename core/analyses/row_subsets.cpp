#include "analyses/row_subsets.hpp"

namespace plumbline {

RowSubsets::RowSubsets(std::span<const std::uint32_t> codes, std::span<const std::uint32_t> subsetOfCode, std::size_t subsets)
    : m_codes(codes)
    , m_subsetOfCode(subsetOfCode.begin(), subsetOfCode.end())
    , m_rows(subsets)
{
    std::vector<std::size_t> sizes(subsets, 0);
    for (const std::uint32_t code : codes)
        if (m_subsetOfCode[code] != none)
            ++sizes[m_subsetOfCode[code]];
    for (std::size_t s = 0; s < subsets; ++s)
        m_rows[s].reserve(sizes[s]);
    for (std::size_t i = 0; i < codes.size(); ++i)
        if (const std::uint32_t s = m_subsetOfCode[codes[i]]; s != none)
            m_rows[s].push_back(static_cast<std::uint32_t>(i));
}

std::vector<ScoreOrder> RowSubsets::orders(const ScoreOrder& cohortOrder) const
{
    // Each row's position among its subset's rows; rows of no subset keep none.
    std::vector<std::uint32_t> positionInSubset(m_codes.size(), none);
    for (const auto& rows : m_rows)
        for (std::size_t k = 0; k < rows.size(); ++k)
            positionInSubset[rows[k]] = static_cast<std::uint32_t>(k);
    std::vector<ScoreOrder> out(m_rows.size());
    for (std::size_t s = 0; s < m_rows.size(); ++s)
        out[s].reserve(m_rows[s].size());
    for (const std::uint32_t row : cohortOrder)
        if (const std::uint32_t s = m_subsetOfCode[m_codes[row]]; s != none)
            out[s].push_back(positionInSubset[row]);
    return out;
}

} // namespace plumbline
