#pragma once

#include "intake/cohort.hpp"
#include "analyses/capacity_spec.hpp"
#include "analyses/period_analysis.hpp"
#include "analyses/validation.hpp"

#include <cstddef>
#include <optional>
#include <string>
#include <vector>

namespace plumbline {

// What a capacity box beside the threshold slider needs, so that it looks values up and never
// computes: per model the patients flagged (risk ≥ t) at every threshold of the operating points'
// grid (every 0.005), the cohort's size and its date span (docs/methods.md §21c).
struct CapacityLookup {
    std::vector<std::string> models;
    std::vector<double> thresholds;                // the grid
    std::vector<std::vector<std::size_t>> flagged; // [model][grid step]
    std::size_t patients = 0;
    std::optional<double> spanDays;                // first to last date, both counted; empty without dates

    // Patients flagged at the grid threshold nearest `threshold`.
    std::size_t flaggedAt(std::size_t model, double threshold) const;
    // Those patients as a capacity: per week over the span when there are dates, else a share
    // (the amount rounded to one decimal, as a box shows it).
    CapacitySpec capacityAt(std::size_t model, double threshold) const;
    // The patients a capacity allows (rounded down, as in the capacity analysis); nullopt for a
    // rate without dates.
    std::optional<std::size_t> patientsAllowed(const CapacitySpec& capacity) const;
    // The lowest grid threshold that flags at most `allowed` patients, highest risk first.
    double thresholdFor(std::size_t model, std::size_t allowed) const;
};

CapacityLookup capacityLookup(const ValidationResult& result, const Cohort& cohort, std::optional<DateFormat> dateFormat);

} // namespace plumbline
