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

} // namespace plumbline
