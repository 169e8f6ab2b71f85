#include "intake/xlsx_dates.hpp"

#include <cmath>

namespace plumbline {

bool isBuiltinDateFormat(int numFmtId)
{
    return (numFmtId >= 14 && numFmtId <= 22) || (numFmtId >= 45 && numFmtId <= 47);
}

bool isDateFormatCode(std::string_view code)
{
    bool quoted = false;
    int bracketDepth = 0;
    for (std::size_t i = 0; i < code.size(); ++i) {
        const char c = code[i];
        if (quoted) {
            quoted = c != '"';
            continue;
        }
        if (c == '"') {
            quoted = true;
        } else if (c == '[') {
            ++bracketDepth;
        } else if (c == ']') {
            bracketDepth = bracketDepth > 0 ? bracketDepth - 1 : 0;
        } else if (bracketDepth > 0) {
            continue;
        } else if (c == '\\' || c == '_' || c == '*') {
            ++i; // the next character is shown (or padded with) as it is
        } else if (c == 'd' || c == 'D' || c == 'm' || c == 'M' || c == 'y' || c == 'Y') {
            return true;
        }
    }
    return false;
}

std::optional<std::int64_t> xlsxSerialToDays(double serial, bool date1904)
{
    // 9999-12-31 is serial 2958465 in the 1900 system and 2957003 in the 1904 system.
    const double last = date1904 ? 2957003.0 : 2958465.0;
    if (!std::isfinite(serial) || serial < 0.0 || serial >= last + 1.0)
        return std::nullopt;
    const auto whole = static_cast<std::int64_t>(std::floor(serial));
    if (date1904)
        return whole - 24107; // 1904-01-01 is 24,107 days before 1970-01-01
    // 1900-01-01 (serial 1) is 25,567 days before 1970-01-01; serial 0 is the day before it.
    return whole < 61 ? whole - 1 - 25567 : whole - 2 - 25567;
}

} // namespace plumbline
