#pragma once

#include "analyses/monitoring_analysis.hpp"

#include <nlohmann/json.hpp>

namespace plumbline {

// The top-level `monitoring` block (docs/result-json.md): per model and scope (the whole cohort,
// then each site) the thinned expected-minus-observed path, both CUSUM charts with their control
// limits and signals, the case mix and PSI per period, and the coding-shift check.
nlohmann::ordered_json monitoringJson(const MonitoringAnalysis& monitoring);

} // namespace plumbline
