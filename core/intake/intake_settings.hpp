#pragma once

#include "intake/score_scale.hpp"

#include <optional>
#include <string>
#include <vector>

namespace plumbline {

// Where the data are and how to read them: the column mapping of an analysis.
struct IntakeSettings {
    std::string cohortFile;                   // scores (and outcomes, unless outcomesFile is set); empty with a database
    std::optional<std::string> sheet;         // a spreadsheet's sheet: its name or 1-based number; nullopt: the first
    std::optional<std::string> database;      // a database URI (no password in it); the cohort is then the query's result
    std::optional<std::string> query;         // the SQL query whose result is the cohort (with database)
    std::optional<std::string> outcomesFile;  // outcomes in a second file, joined on the id
    std::string outcomeColumn;
    std::vector<std::string> scoreColumns;
    std::optional<std::string> idColumn;
    std::optional<std::string> outcomesIdColumn; // defaults to idColumn
    std::vector<std::string> groupColumns;
    std::optional<std::string> periodColumn;  // a date column; checked at intake, analysed by period later
    std::optional<std::string> clusterColumn; // the site of each row; performance is pooled across its levels
    std::optional<std::string> eventValue;
    ScoreScale scale = ScoreScale::Probability;
    bool scaleGiven = false;                  // the user chose the scale explicitly
    std::optional<char> delimiter;            // nullopt: sniffed
    bool decimalComma = false;
    std::size_t maxLineBytes = std::size_t{1} << 20; // a longer line means the file is not a table
};

} // namespace plumbline
