#include "analyses/capacity_lookup.hpp"

#include "analyses/capacity_analysis.hpp"

#include <algorithm>
#include <cmath>

namespace plumbline {

CapacityLookup capacityLookup(const ValidationResult& result, const Cohort& cohort, std::optional<DateFormat> dateFormat)
{
    CapacityLookup out;
    out.patients = cohort.rows();
    if (const auto span = cohortDateSpan(cohort, dateFormat))
        out.spanDays = span->days;
    for (const auto& model : result.models) {
        out.models.push_back(model.name);
        std::vector<std::size_t> flagged;
        if (out.thresholds.empty())
            for (const auto& point : model.operatingPoints)
                out.thresholds.push_back(point.threshold);
        for (const auto& point : model.operatingPoints)
            flagged.push_back(point.tp + point.fp);
        out.flagged.push_back(std::move(flagged));
    }
    return out;
}

std::size_t CapacityLookup::flaggedAt(std::size_t model, double threshold) const
{
    if (model >= flagged.size() || thresholds.empty())
        return 0;
    const auto nearest = std::min_element(thresholds.begin(), thresholds.end(),
                                          [&](double a, double b) { return std::abs(a - threshold) < std::abs(b - threshold); });
    return flagged[model][std::size_t(nearest - thresholds.begin())];
}

CapacitySpec CapacityLookup::capacityAt(std::size_t model, double threshold) const
{
    const double count = double(flaggedAt(model, threshold));
    CapacitySpec spec;
    if (spanDays && *spanDays > 0.0) {
        spec.kind = CapacitySpec::Kind::Rate;
        spec.unit = CapacitySpec::Unit::Week;
        spec.amount = std::round(count * 7.0 / *spanDays * 10.0) / 10.0;
    } else {
        spec.kind = CapacitySpec::Kind::Share;
        spec.amount = patients ? std::round(1000.0 * count / double(patients)) / 10.0 : 0.0;
    }
    return spec;
}

std::optional<std::size_t> CapacityLookup::patientsAllowed(const CapacitySpec& capacity) const
{
    double number = 0.0;
    if (capacity.kind == CapacitySpec::Kind::Share)
        number = capacity.amount / 100.0 * double(patients);
    else if (spanDays)
        number = capacity.amount * *spanDays / capacity.unitDays();
    else
        return std::nullopt;
    return std::size_t(std::clamp(std::floor(number + 1e-9), 0.0, double(patients)));
}

double CapacityLookup::thresholdFor(std::size_t model, std::size_t allowed) const
{
    if (model >= flagged.size() || thresholds.empty())
        return 0.0;
    // Flagged counts fall as the threshold rises: the first that fits.
    for (std::size_t s = 0; s < thresholds.size(); ++s)
        if (flagged[model][s] <= allowed)
            return thresholds[s];
    return thresholds.back();
}

} // namespace plumbline
