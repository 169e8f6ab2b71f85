#pragma once

#include "files/cohort_cells.hpp"

#include <cstddef>
#include <cstdint>
#include <string>

namespace plumbline {

// The invented demo scenario (see sample-data/README.md): five hospitals of one network,
// 24 months of discharges, a supplier's 30-day readmission score and a locally refitted score,
// with built-in truths the workbench should reveal and a few data-entry defects for the audit.
struct SimulationSettings {
    std::size_t rows = 24000;
    std::uint64_t seed = 20240101;
    int decimals = 4; // of the risks written (1-12); the sample files use 4
};

// The cohort as CSV text and, on request, the same discharges as a shuffled scores file and a
// shuffled outcomes file with unmatched ids, duplicated ids and malformed rows; on request also
// the cohort as typed cells (for a workbook or a Stata file), cell for cell what a reading of the
// CSV gives: the risks as the numbers their written digits stand for, `NA` and an empty outcome
// as missing cells, the date as a date and a damaged score (`#VALUE!`) as text in its score
// column, so every format carries the same defects. Deterministic: the same settings give the
// same bytes and cells.
struct SimulatedFiles {
    std::string cohort;
    std::string scores;
    std::string outcomes;
    CohortCells cells;
};

SimulatedFiles simulateCohort(const SimulationSettings& settings, bool withSplitFiles, bool withCells = false);

} // namespace plumbline
