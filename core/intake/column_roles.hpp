#pragma once

#include "intake/column_profile.hpp"
#include "intake/score_scale.hpp"

#include <optional>
#include <string>
#include <vector>

namespace plumbline {

// First guesses of what each column is, from names and content, to pre-fill an import dialog.
// Only suggestions: the user confirms every one before anything is computed.
struct ColumnRoles {
    std::optional<std::string> outcome;
    std::vector<std::string> scores;
    std::optional<std::string> id;
    std::vector<std::string> groups;
    std::optional<std::string> period;
    ScoreScale scale = ScoreScale::Probability;
};

ColumnRoles guessColumnRoles(const TableProfile& profile);

// Numbers, or numbers with stray text the intake will count: a column that can hold scores.
bool couldHoldScores(const ColumnProfile& column);
// Text, yes/no or whole numbers with 2 to 100 values: a column that can split patients into
// subgroups (a site, an age band, a payer). Continuous numbers and dates cannot.
bool couldBeSubgroup(const ColumnProfile& column);

// The first rows of a table as parsed (after quoting rules), with their line numbers.
struct TablePreview {
    std::vector<std::string> header;
    std::vector<std::vector<std::string>> rows;
    std::vector<std::size_t> lines;
};
TablePreview previewTable(const DelimitedTable& table, std::size_t maxRows);
// The first rows of a typed source as a delimited export would show them, labelled values as
// their labels, with their positions (sheet rows, observation numbers, result rows).
std::expected<TablePreview, InputError> previewTable(TypedTable& table, std::size_t maxRows);

} // namespace plumbline
