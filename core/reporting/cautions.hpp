#pragma once

#include <array>
#include <string_view>

namespace plumbline {

// The cautions every output carries (CLI, window, reports). One source so they never drift apart.
inline constexpr std::array<std::string_view, 3> standardCautions{
    "A validation supports, and does not replace, clinical and governance review of a model.",
    "Results depend on the quality of the local data and on how the outcome was defined and recorded.",
    "Follow local policy and regulation on the use of risk models in patient care.",
};

// Said wherever a capacity threshold is shown (CLI, window, report): it was fitted to past volume.
inline constexpr std::string_view capacityCaution =
    "A threshold chosen to flag a capacity on past patients flags a different number when volume or case mix changes: "
    "watch the number flagged each period against what the team can take.";
// How to read pooled performance across sites (--cluster), shown wherever it is.
inline constexpr std::array<std::string_view, 2> siteCautions{
    "The prediction interval and the probability of acceptable performance describe a new site like those pooled; a site with another case mix, coding or care pathway may fall outside them.",
    "With few sites the between-site variance is poorly estimated, so these intervals are themselves uncertain: validate the model in the new site before relying on it.",
};

} // namespace plumbline
