#include "cli_intake_options.hpp"

namespace plumbline::cli {

void IntakeOptions::addTo(CLI::App& command, bool required)
{
    command.add_option("FILE", settings.cohortFile, "Cohort file: scores (and outcomes, unless --outcomes)")->required(required);
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
    command.add_option("--max-line-length", settings.maxLineBytes,
                       "Longest line, in bytes, before a file is judged not to be a table (default 1048576)");
}

std::expected<IntakeSettings, InputError> IntakeOptions::resolved(const CLI::App& command) const
{
    IntakeSettings out = settings;
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
