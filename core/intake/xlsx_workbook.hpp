#pragma once

#include "intake/input_error.hpp"
#include "intake/xlsx_archive.hpp"
#include "intake/xlsx_limits.hpp"

#include <expected>
#include <string>
#include <vector>

namespace plumbline {

// One sheet as the workbook lists it: its name, the zip entry of its part, and whether it is a
// worksheet (a table of cells) rather than a chart sheet or a dialog sheet.
struct XlsxSheetEntry {
    std::string name;
    std::string part;
    bool worksheet = false;
};

// What the workbook part and its relationships say (ECMA-376 Part 1, 12.3.23, and Part 2, Open
// Packaging Conventions): the sheets in workbook order, the date system and where the shared
// strings and styles are. Parts are found through the relationships, never by their usual names.
struct XlsxWorkbook {
    std::vector<XlsxSheetEntry> sheets;
    bool date1904 = false;
    std::string sharedStringsPart; // empty: the workbook has none
    std::string stylesPart;        // empty: the workbook has none

    static std::expected<XlsxWorkbook, InputError> read(const XlsxArchive& archive, const XlsxLimits& limits);
};

// A relationship's target resolved against the folder of the part that holds it, as a zip entry
// name: "worksheets/sheet1.xml" from "xl/workbook.xml" is "xl/worksheets/sheet1.xml"; a target
// starting with "/" is from the package root; "." and ".." segments are applied.
std::string xlsxResolvedTarget(const std::string& sourcePart, const std::string& target);

} // namespace plumbline
