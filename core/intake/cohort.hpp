#pragma once

#include "intake/score_scale.hpp"
#include "intake/written_date.hpp"

#include <cstddef>
#include <cstdint>
#include <optional>
#include <string>
#include <vector>

namespace plumbline {

// One model's scores for the rows of the cohort (complete cases, same order as the outcome).
struct ModelScores {
    std::string name;            // the score column
    std::vector<double> values;  // probabilities, or raw points when the scale is Points
};

// A dictionary-coded column used for subgroups (a missing value is its own level, "(missing)").
struct CategoricalColumn {
    std::string name;
    std::vector<std::string> levels;
    std::vector<std::uint32_t> codes; // one per cohort row, index into levels
};

// The period column: its date texts dictionary-coded, and each level's date as written, read
// once at intake so that the period analysis (and the command line's check before it) never
// parses the texts again.
struct DateColumn : CategoricalColumn {
    std::vector<WrittenDate> written; // one per level
};

// The rows that enter the analysis, as a struct of arrays. Every vector has rows() entries.
struct Cohort {
    std::vector<std::uint8_t> outcome;        // 1 = event, 0 = non-event
    std::vector<ModelScores> models;
    ScoreScale scale = ScoreScale::Probability;
    std::vector<std::string> ids;             // filled only when an id column was given
    std::vector<CategoricalColumn> groups;
    std::optional<DateColumn> period;         // the date texts, dictionary-coded, and their dates as written
    std::optional<CategoricalColumn> cluster;   // the site of each row (--cluster), "(missing)" a level
    std::vector<std::uint32_t> sourceLines;   // line of each row in the cohort file

    std::size_t rows() const { return outcome.size(); }
    std::size_t events() const;
};

} // namespace plumbline
