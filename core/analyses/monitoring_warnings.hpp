#pragma once

#include "analyses/monitoring_analysis.hpp"

#include <string>
#include <vector>

namespace plumbline {

// What the monitoring found, in plain words for the run's warnings (the decision summary, the
// window's status and the command line show those): each model and scope whose worse-outcome
// CUSUM signalled, each coding-shift question with its numbers, each chart whose in-control run
// length fell short of its target. Sites below the small-cell number have no scope, so they are
// never named here.
std::vector<std::string> monitoringWarnings(const MonitoringAnalysis& monitoring);

} // namespace plumbline
