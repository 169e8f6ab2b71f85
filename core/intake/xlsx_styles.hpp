#pragma once

#include "intake/input_error.hpp"
#include "intake/xlsx_archive.hpp"
#include "intake/xlsx_limits.hpp"

#include <cstddef>
#include <expected>
#include <string>
#include <vector>

namespace plumbline {

// Which cell formats (the `s` attribute of a cell, an index into styles.xml's cellXfs) show the
// cell's number as a date, so that such a number is read as a date and not as a serial count.
class XlsxStyles {
public:
    // An empty `part` (no styles in the workbook): no cell shows a date.
    static std::expected<XlsxStyles, InputError> read(const XlsxArchive& archive, const std::string& part,
                                                      const XlsxLimits& limits);

    bool isDate(std::size_t styleIndex) const { return styleIndex < m_dates.size() && m_dates[styleIndex]; }

private:
    std::vector<bool> m_dates;
};

} // namespace plumbline
