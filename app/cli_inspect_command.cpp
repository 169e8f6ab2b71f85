#include "cli_inspect_command.hpp"

#include "cli_exit.hpp"
#include "cli_text.hpp"
#include "intake/column_profile.hpp"
#include "intake/delimiter_sniffer.hpp"
#include "intake/source_kind.hpp"
#include "intake/typed_source.hpp"

#include <iomanip>
#include <iostream>
#include <memory>

namespace plumbline::cli {

namespace {

struct InspectOptions {
    std::string file;
    std::string delimiter;
    std::string sheet;
    std::string database;
    std::string query;
};

void printProfile(const std::string& source, const std::string& kind, const TableProfile& profile)
{
    std::cout << source << ": " << withThousands(profile.rows) << " data rows, " << profile.columns.size() << " columns, " << kind
              << "\n\n";
    std::cout << std::left << std::setw(22) << "column" << std::setw(9) << "type" << std::right << std::setw(11)
              << "non-missing" << std::setw(10) << "distinct" << "  " << std::left << std::setw(12) << "min"
              << std::setw(12) << "max" << "notes\n";
    for (const auto& column : profile.columns) {
        std::string notes;
        for (const auto& note : column.notes)
            notes += (notes.empty() ? "" : "; ") + note;
        const std::string distinct = withThousands(column.distinct) + (column.distinctCapped ? "+" : "");
        std::cout << std::left << std::setw(22) << column.name << std::setw(9) << column.type << std::right
                  << std::setw(11) << withThousands(column.nonMissing) << std::setw(10) << distinct << "  " << std::left
                  << std::setw(12) << column.minimum << std::setw(12) << column.maximum << notes << '\n';
    }
    if (profile.raggedRows > 0)
        std::cout << "\nproblem: " << withThousands(profile.raggedRows)
                  << " rows have a different number of fields than the header (first on line " << profile.firstRaggedLine
                  << "); they would be excluded.\n";
}

int runInspectTyped(const InspectOptions& options)
{
    IntakeSettings settings;
    settings.cohortFile = options.file;
    if (!options.sheet.empty())
        settings.sheet = options.sheet;
    if (!options.database.empty()) {
        settings.database = options.database;
        settings.query = options.query;
    }
    auto table = openTypedSource(settings);
    if (!table)
        return reportError(table.error());
    const auto profile = profileColumns(**table);
    if (!profile)
        return reportError(profile.error());
    printProfile((*table)->sourceName(), sourceKindName(sourceKindOf(settings)), *profile);
    for (const auto& warning : (*table)->warnings())
        std::cout << "\nwarning: " << warning << '\n';
    return Done;
}

int runInspect(const InspectOptions& options)
{
    if (!options.database.empty() || isTypedSourcePath(options.file)) {
        if (options.database.empty() == options.file.empty()) {
            InputError error;
            error.problem = options.file.empty() ? "nothing to describe was given." : "both a file and a database were given.";
            error.remedy = "name a file, or give --database URI with --query \"SELECT …\".";
            return reportError(error);
        }
        return runInspectTyped(options);
    }
    if (options.file.empty()) {
        InputError error;
        error.problem = "nothing to describe was given.";
        error.remedy = "name a file, or give --database URI with --query \"SELECT …\".";
        return reportError(error);
    }
    auto file = TextFile::load(options.file);
    if (!file)
        return reportError(file.error());
    std::optional<char> delimiter;
    if (!options.delimiter.empty())
        delimiter = options.delimiter == "tab" ? '\t' : options.delimiter[0];
    const auto table = DelimitedTable::open(std::move(*file), delimiter);
    if (!table)
        return reportError(table.error());
    const auto profile = profileColumns(*table);
    if (!profile)
        return reportError(profile.error());
    printProfile(table->fileName(), std::string(delimiterName(table->delimiter())) + "-delimited"
                     + (table->delimiterSniffed() ? " (sniffed)" : ""), *profile);
    return Done;
}

} // namespace

void addInspectCommand(CLI::App& app, int& exitStatus)
{
    auto options = std::make_shared<InspectOptions>();
    CLI::App* command = app.add_subcommand("inspect", "Describe the columns of a cohort (a file or a query's result) and the problems found.");
    command->add_option("FILE", options->file, "File to describe: delimited text, a workbook, or a SAS, Stata or SPSS file");
    command->add_option("--sheet", options->sheet, "A workbook's sheet, by name or number (default: the first)");
    command->add_option("--database", options->database, "Describe a query's result instead: the database (see validate --help)");
    command->add_option("--query", options->query, "With --database: the SQL query");
    command->add_option("--delimiter", options->delimiter, "Field delimiter (default: sniffed; 'tab' for a tab)");
    command->callback([options, &exitStatus] { exitStatus = runInspect(*options); });
}

} // namespace plumbline::cli
