#pragma once

#include "intake/input_error.hpp"
#include "intake/xlsx_archive.hpp"
#include "intake/xlsx_limits.hpp"

#include <cstddef>
#include <cstdint>
#include <expected>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace plumbline {

// The workbook's shared-string table (sharedStrings.xml): the text of every `t="s"` cell, by
// index. Rich text is the concatenation of its runs; phonetic guides (rPh) are left out. The
// texts sit end to end in one buffer, so a large table costs its text plus one offset each.
class XlsxSharedStrings {
public:
    // An empty `part` (no shared strings in the workbook): an empty table. More entries or text
    // than `limits` allow is an InputError.
    static std::expected<XlsxSharedStrings, InputError> read(const XlsxArchive& archive, const std::string& part,
                                                             const XlsxLimits& limits);

    std::size_t size() const { return m_ends.size(); }
    // nullopt: no entry at that index.
    std::optional<std::string_view> at(std::size_t index) const;

private:
    friend class SharedStringsHandler;
    std::string m_text;
    std::vector<std::uint64_t> m_ends; // entry i spans [m_ends[i-1], m_ends[i])
};

} // namespace plumbline
