#include "cli_intake_options.hpp"

#include "intake/text_file.hpp"

namespace plumbline::cli {

namespace {

// A query kept in a file: read whole (a query is small; a large file is not a query).
std::expected<std::string, InputError> readQueryFile(const std::string& path)
{
    constexpr std::size_t longestQuery = std::size_t{1} << 20;
    auto file = TextFile::load(path, longestQuery);
    if (!file)
        return std::unexpected(file.error());
    if (file->textSize() > longestQuery) {
        InputError error;
        error.file = path;
        error.problem = "the query file is larger than 1 MB, which is not a query.";
        error.remedy = "name the file that holds the SQL query.";
        return std::unexpected(error);
    }
    return file->readText(0, file->textSize());
}

} // namespace

void IntakeOptions::addTo(CLI::App& command, bool required)
{
    // Not required by the parser: a query's result stands in for the file (checked in resolved).
    command.add_option("FILE", settings.cohortFile,
                       "Cohort file: delimited text, a workbook (.xlsx), or a SAS, Stata or SPSS file (.sas7bdat .xpt .dta .sav .zsav)");
    m_fileRequired = required;
    command.add_option("--outcome", settings.outcomeColumn, "Column holding the observed outcome")->required(required);
    command.add_option("--score", settings.scoreColumns, "Column holding a model's score (repeatable)")->required(required);
    command.add_option("--id", idColumn, "Row identifier (required with --outcomes)");
    command.add_option("--outcomes", outcomesFile, "Outcomes in a second file, joined to FILE on the id");
    command.add_option("--outcomes-id", outcomesIdColumn, "The id column's name in the outcomes file, if it differs");
    command.add_option("--event", eventValue, "The outcome value that means 'event' when it is not 1/yes/y/true");
    command.add_option("--scale", scale, "How scores are expressed")
        ->check(CLI::IsMember({"probability", "percent", "logit", "points"}));
    command.add_option("--delimiter", delimiter, "Field delimiter (default: sniffed; 'tab' for a tab)");
    command.add_flag("--decimal-comma", settings.decimalComma, "Read 0,25 as 0.25");
    command.add_option("--group", settings.groupColumns, "Subgroup column (repeatable)");
    command.add_option("--period", periodColumn, "Date column for performance over time");
    command.add_option("--cluster", clusterColumn, "Site column: performance per site, pooled across sites (random effects)");
    command.add_option("--sheet", sheet, "A workbook's sheet, by name or number (default: the first)");
    command.add_option("--database", database,
                       "Read the cohort from a database: postgresql://user@host/db, sqlite:FILE or odbc:DSN=name (no password: "
                       "PGPASSWORD, ~/.pgpass, a service, or PLUMBLINE_ODBC_PASSWORD)");
    command.add_option("--query", query, "With --database: the SQL query whose result is the cohort");
    command.add_option("--query-file", queryFile, "With --database: a file holding that query");
    command.add_option("--max-line-length", settings.maxLineBytes,
                       "Longest line, in bytes, before a file is judged not to be a table (default 1048576)");
}

std::expected<IntakeSettings, InputError> IntakeOptions::resolved(const CLI::App& command) const
{
    IntakeSettings out = settings;
    if (!sheet.empty())
        out.sheet = sheet;
    if (!database.empty())
        out.database = database;
    if (!query.empty() && !queryFile.empty()) {
        InputError error;
        error.problem = "both --query and --query-file were given.";
        error.remedy = "give the query once: in the command or in a file.";
        return std::unexpected(error);
    }
    if (!query.empty())
        out.query = query;
    if (!queryFile.empty()) {
        auto text = readQueryFile(queryFile);
        if (!text)
            return std::unexpected(text.error());
        out.query = std::move(*text);
    }
    if (m_fileRequired && out.cohortFile.empty() && !out.database) {
        InputError error;
        error.problem = "no cohort was given.";
        error.remedy = "name the cohort file, or give --database URI with --query \"SELECT …\".";
        return std::unexpected(error);
    }
    if (!outcomesFile.empty())
        out.outcomesFile = outcomesFile;
    if (!idColumn.empty())
        out.idColumn = idColumn;
    if (!outcomesIdColumn.empty())
        out.outcomesIdColumn = outcomesIdColumn;
    if (!eventValue.empty())
        out.eventValue = eventValue;
    if (!periodColumn.empty())
        out.periodColumn = periodColumn;
    if (clusterColumn)
        out.clusterColumn = clusterColumn;
    out.scale = *scaleFromName(scale);
    out.scaleGiven = command.count("--scale") > 0;
    if (!delimiter.empty()) {
        const std::string d = delimiter == "tab" || delimiter == "\\t" ? std::string("\t") : delimiter;
        if (d.size() != 1 || d == "\"" || d == "\n" || d == "\r") {
            InputError error;
            error.value = delimiter;
            error.problem = "--delimiter takes one character (or 'tab').";
            error.remedy = "give the delimiter as , ; | or tab, or leave it out to have it sniffed.";
            return std::unexpected(error);
        }
        out.delimiter = d[0];
    }
    return out;
}

} // namespace plumbline::cli
