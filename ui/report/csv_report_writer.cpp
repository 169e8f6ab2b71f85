#include "report/report_writers.hpp"

#include "files/atomic_file.hpp"
#include "files/csv_quoting.hpp"

#include <filesystem>
#include <map>

namespace plumbline {

namespace {

std::string csvField(const ReportCell& cell)
{
    // Numbers are written as they read; any text (labels from the data included) is neutralised
    // so that a spreadsheet never takes it for a formula, then quoted when it needs to be.
    return csvQuoted(cell.number ? cell.text : neutralisedForSpreadsheet(cell.text));
}

} // namespace

std::vector<std::string> uniqueTableNames(const ReportDocument& document)
{
    std::map<std::string, int> seen;
    std::vector<std::string> names;
    for (const ReportTable* table : document.tables()) {
        const int n = ++seen[table->id];
        names.push_back(n == 1 ? table->id : table->id + "_" + std::to_string(n));
    }
    return names;
}

std::expected<void, InputError> writeCsvTables(const ReportDocument& document, const std::string& folder)
{
    std::error_code error;
    std::filesystem::create_directories(folder, error);
    if (error) {
        InputError e;
        e.file = folder;
        e.problem = "the folder for the tables cannot be created (" + error.message() + ").";
        e.remedy = "choose a folder you may write to.";
        return std::unexpected(e);
    }
    const auto tables = document.tables();
    const auto paths = csvTablePaths(document, folder);
    std::vector<OutputFile> files;
    for (std::size_t t = 0; t < tables.size(); ++t) {
        const ReportTable table = dataColumns(*tables[t]);
        std::string csv;
        for (std::size_t c = 0; c < table.headers.size(); ++c) {
            if (c > 0)
                csv.push_back(',');
            csv.append(csvField({table.headers[c], std::nullopt, false}));
        }
        csv.push_back('\n');
        for (const auto& row : table.rows) {
            for (std::size_t c = 0; c < row.size(); ++c) {
                if (c > 0)
                    csv.push_back(',');
                csv.append(csvField(row[c]));
            }
            csv.push_back('\n');
        }
        files.push_back({paths[t], std::move(csv)});
    }
    return writeFilesTogether(files);
}

std::vector<std::string> csvTablePaths(const ReportDocument& document, const std::string& folder)
{
    std::vector<std::string> paths;
    for (const auto& name : uniqueTableNames(document))
        paths.push_back((std::filesystem::path(folder) / (name + ".csv")).string());
    return paths;
}

std::expected<void, InputError> writeReport(const ReportDocument& document, ReportCharts& charts, const std::string& path)
{
    const std::string suffix = std::filesystem::path(path).extension().string();
    if (suffix == ".html" || suffix == ".htm")
        return writeHtmlReport(document, charts, path);
    if (suffix == ".pdf")
        return writePdfReport(document, charts, path);
    InputError e;
    e.file = path;
    e.problem = "a report is written as PDF (.pdf) or HTML (.html); this name has neither suffix.";
    e.remedy = "name the report file ending in .pdf or .html (use --xlsx or --csv-dir for tables).";
    return std::unexpected(e);
}

} // namespace plumbline
