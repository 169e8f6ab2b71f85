#pragma once

// One worksheet of an .xlsx workbook as a TypedTable. The zip is read with minizip and the XML
// with expat: both are in Debian, written in C and small, and both stream: minizip inflates an
// entry a chunk at a time and expat parses each chunk as it comes, so a sheet of a million rows
// passes from the zip through the parser a row at a time, with neither the XML text nor a
// document tree ever held in memory. Only the shared-string table is kept whole (cells point
// into it by index); bounds on every part's inflated size and on that table (XlsxLimits) turn a
// zip bomb into a message.

#include "intake/input_error.hpp"
#include "intake/typed_table.hpp"
#include "intake/xlsx_limits.hpp"

#include <expected>
#include <memory>
#include <optional>
#include <string>
#include <vector>

namespace plumbline {

// Whether the path names an .xlsx workbook, by its extension (any case).
bool isSpreadsheetFile(const std::string& path);

// The workbook's sheet names in workbook order.
std::expected<std::vector<std::string>, InputError> xlsxSheetNames(const std::string& path);

// The sheet `sheet` of the workbook as a table: a sheet name, or a 1-based number written as
// text ("2"); nullopt: the first sheet. A name that is also a number is taken as the name when a
// sheet has that name. The sheet's first non-empty row names the columns; the rows after it are
// the records, each at its row number in the sheet.
std::expected<std::unique_ptr<TypedTable>, InputError> openXlsxTable(const std::string& path,
                                                                   const std::optional<std::string>& sheet);
// As above, with other bounds (tests lower them).
std::expected<std::unique_ptr<TypedTable>, InputError> openXlsxTable(const std::string& path,
                                                                   const std::optional<std::string>& sheet,
                                                                   const XlsxLimits& limits);

} // namespace plumbline
