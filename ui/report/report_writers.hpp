#pragma once

#include "intake/input_error.hpp"
#include "report/report_charts.hpp"
#include "report/report_document.hpp"

#include <expected>
#include <string>

namespace plumbline {

// The report writers, shared by the window's Export and the CLI. Each writes under a temporary
// name and renames, so a failed export leaves no partial or half-overwritten file.

// One CSV per table in `folder` (created if needed), named after the table. The set is written
// together: if any table cannot be written, every file in the folder stays as it was.
std::expected<void, InputError> writeCsvTables(const ReportDocument& document, const std::string& folder);
// The paths writeCsvTables would write (to check them against the inputs first).
std::vector<std::string> csvTablePaths(const ReportDocument& document, const std::string& folder);

// A self-contained HTML file: inline CSS and inline SVG charts, no scripts, no external
// references; text from the data is escaped.
std::expected<void, InputError> writeHtmlReport(const ReportDocument& document, ReportCharts& charts, const std::string& path);

// A PDF on A4 with vector charts.
std::expected<void, InputError> writePdfReport(const ReportDocument& document, ReportCharts& charts, const std::string& path);

// An XLSX workbook with one sheet per table (libxlsxwriter); numbers as numbers.
std::expected<void, InputError> writeXlsxReport(const ReportDocument& document, const std::string& path);

// PDF or HTML by the file's suffix.
std::expected<void, InputError> writeReport(const ReportDocument& document, ReportCharts& charts, const std::string& path);

// Table ids made unique across the document (several reclassification tables, say).
std::vector<std::string> uniqueTableNames(const ReportDocument& document);

} // namespace plumbline
