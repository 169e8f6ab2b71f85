#pragma once

#include "files/analysis_file.hpp"
#include "run/analysis_snapshot.hpp"
#include "reporting/disclosure_plan.hpp"

#include <optional>
#include <utility>
#include <string>
#include <vector>

namespace plumbline {

// A cell of a report table: its text, its number (for spreadsheets), and whether it was
// suppressed by the small-cell rule.
struct ReportCell {
    std::string text;
    std::optional<double> number;
    bool suppressed = false;
    // An interval's ends as numbers: the printed formats show `text` ("0.70 to 0.74"), the
    // workbook and CSV two numeric columns.
    std::optional<std::pair<double, double>> interval;

    ReportCell(std::string shown = {}, std::optional<double> value = std::nullopt, bool withheld = false,
               std::optional<std::pair<double, double>> ends = std::nullopt)
        : text(std::move(shown)), number(value), suppressed(withheld), interval(ends)
    {
    }
};

struct ReportTable {
    std::string id;    // file-safe name: the CSV file and the spreadsheet's sheet
    std::string title;
    std::vector<std::string> headers;
    std::vector<std::vector<ReportCell>> rows;
    std::string note;
    // Rows left out of the printed formats (PDF, HTML) but kept in the workbook and CSV, e.g. the
    // decision curve's full grid; empty: every row is printed.
    std::vector<bool> onlyInData;
};

// The table as the printed formats show it: without the rows marked `onlyInData` or a column
// empty in every row.
ReportTable printedRows(const ReportTable& table);

// The table as the workbook and CSV hold it, for analysts: every interval as two numeric columns
// ("… lower", "… upper") after its column (which keeps the estimate, or goes when it held only the
// interval), p-values and other numbers shown in words as their numbers, and "-" placeholders
// empty.
ReportTable dataColumns(const ReportTable& table);

// The charts a report can hold, drawn by the window's own views.
enum class ReportChart {
    Roc, Calibration, DecisionCurve,
    SubgroupC, SubgroupOe, SubgroupSlope, SubgroupCalibration, SubgroupFunnel, // per subgroup column and model
    OverTimeC, OverTimeOe,                                                     // per model
    SiteC, SiteOe, SiteSlope,                                                  // per model, across sites (--cluster)
    MonitoringExpectedMinusObserved, MonitoringWorse, MonitoringBetter         // per model, the whole cohort
};

// One chart of a report: its kind and, for the subgroup charts, which column and model (the
// window's choice index: columns in order, each with every model), for the charts over time
// which model.
struct ReportChartRef {
    ReportChart kind = ReportChart::Roc;
    int choice = 0;
};

struct ReportSection {
    std::string title;
    std::vector<std::string> paragraphs;
    std::vector<ReportTable> tables;
    std::vector<ReportChartRef> charts;
    std::vector<std::string> closing; // paragraphs after the tables
    bool pageBreakAfter = false;      // the next section starts a new page (printed formats)
};

// The whole report as content, in a reviewer's order; the PDF, HTML, spreadsheet and CSV
// writers only lay it out, so every format carries the same numbers. Aggregates only: no row,
// id or line number of the data appears; counts below `minimumCell` are suppressed.
struct ReportDocument {
    std::string title;
    std::string subtitle;
    // Names this analysis: derived from the inputs' SHA-256 and the settings, so the same data and
    // settings give the same id and any change gives another ("PL-" and 12 hex digits).
    std::string documentId;
    std::vector<ReportSection> sections;

    std::vector<const ReportTable*> tables() const;
};

// The small-cell plan of a report on this snapshot (see core/reporting/disclosure_plan.hpp).
DisclosurePlan disclosurePlanOf(const AnalysisSnapshot& s, std::size_t minimumCell);
// The snapshot as a report's charts may draw it: what the plan withholds left out.
SnapshotPointer snapshotForReport(const AnalysisSnapshot& s, std::size_t minimumCell);

ReportDocument buildReport(const AnalysisSnapshot& snapshot, const ReportFields& fields, std::size_t minimumCell,
                           const std::string& createdUtc);

// A value from the data (a column name, a group label) made safe for a spreadsheet or CSV
// cell: a leading =, +, - or @ would make it a formula, so it is prefixed with a quote.
std::string neutralisedForSpreadsheet(const std::string& text);

} // namespace plumbline
