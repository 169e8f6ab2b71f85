#pragma once

#include <cstdint>
#include <optional>
#include <string_view>

namespace plumbline {

// Whether a built-in number format shows a date or time: ids 14-22 and 45-47 (ECMA-376 Part 1,
// 18.8.30, the predefined formats).
bool isBuiltinDateFormat(int numFmtId);
// Whether a custom number format code shows a date: a d, m or y outside quoted text, [brackets]
// (colours, conditions, elapsed-time units), and characters escaped with \ or taken by _ and *.
bool isDateFormatCode(std::string_view code);

// Days since 1970-01-01 of a spreadsheet date serial, the time of day dropped. The 1900 system
// counts 1900-01-01 as 1 and keeps Lotus 1-2-3's phantom 1900-02-29 (serial 60), so serials from
// 61 on are one day ahead of the calendar; the 1904 system counts 1904-01-01 as 0 (ECMA-376
// Part 1, 18.17.4.1). nullopt outside the dates a spreadsheet shows (before its epoch, after
// 9999-12-31, or not finite).
std::optional<std::int64_t> xlsxSerialToDays(double serial, bool date1904);

} // namespace plumbline
