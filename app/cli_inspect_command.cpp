#include "cli_inspect_command.hpp"

#include "cli_exit.hpp"
#include "cli_text.hpp"
#include "intake/column_profile.hpp"
#include "intake/delimiter_sniffer.hpp"

#include <iomanip>
#include <iostream>
#include <memory>

namespace plumbline::cli {

namespace {

struct InspectOptions {
    std::string file;
    std::string delimiter;
};

void printProfile(const DelimitedTable& table, const TableProfile& profile)
{
    std::cout << table.fileName() << ": " << withThousands(profile.rows) << " data rows, " << profile.columns.size()
              << " columns, " << delimiterName(table.delimiter()) << "-delimited"
              << (table.delimiterSniffed() ? " (sniffed)" : "") << "\n\n";
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

int runInspect(const InspectOptions& options)
{
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
    printProfile(*table, *profile);
    return Done;
}

} // namespace

void addInspectCommand(CLI::App& app, int& exitStatus)
{
    auto options = std::make_shared<InspectOptions>();
    CLI::App* command = app.add_subcommand("inspect", "Describe the columns of a delimited file and the problems found.");
    command->add_option("FILE", options->file, "File to describe")->required();
    command->add_option("--delimiter", options->delimiter, "Field delimiter (default: sniffed; 'tab' for a tab)");
    command->callback([options, &exitStatus] { exitStatus = runInspect(*options); });
}

} // namespace plumbline::cli
