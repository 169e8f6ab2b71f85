#pragma once

#include "intake/column_profile.hpp"
#include "intake/score_scale.hpp"

#include <optional>
#include <string>
#include <string_view>
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
    std::optional<std::string> site; // a column named like a site (looksLikeSiteColumn)
    ScoreScale scale = ScoreScale::Probability;
};

ColumnRoles guessColumnRoles(const TableProfile& profile);

// A name that is a site-like word (hospital, site, facility, centre, center, clinic, practice),
// case-insensitive, alone or with an "_id" or "_name" suffix: "Hospital", "site_id", "centre_name".
bool looksLikeSiteColumn(std::string_view name);
// The first header name that looks like a site column, if any.
std::optional<std::string> guessSiteColumn(const std::vector<std::string>& header);

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
