#pragma once

#include <cstddef>
#include <cstdint>

namespace plumbline {

// Bounds on what a workbook may make the reader inflate or hold, so that a small hostile file
// (a zip bomb, a shared-string table of billions of entries) ends in a message instead of
// exhausting memory or time. The defaults are generous: far above any real cohort workbook.
// Tests lower them to prove each bound is enforced.
struct XlsxLimits {
    std::uint64_t partBytes = std::uint64_t{4} << 30;       // inflated size of any one XML part
    std::size_t sharedStrings = std::size_t{50'000'000};    // entries of the shared-string table
    std::uint64_t sharedStringBytes = std::uint64_t{2} << 30; // their text, all together
    std::size_t cellBytes = std::size_t{1} << 20;           // one cell's text (a spreadsheet keeps 32,767 characters)
};

} // namespace plumbline
