#pragma once

#include "intake/cohort.hpp"
#include "analyses/panel_settings.hpp"
#include "metrics/score_order.hpp"
#include "analyses/subgroup_results.hpp"

#include <cstddef>

namespace plumbline {

// The panel on each level's rows (a validation of those rows, levels in name order), then
// Cochran's Q and the funnel of each column.
// `orders`, when given, holds each model's ascendingOrder over the whole cohort: each level's
// order is then read off it instead of sorted again.
SubgroupAnalysis analyseSubgroups(const Cohort& cohort, const PanelSettings& settings, std::size_t minimumCell,
                                  const std::vector<ScoreOrder>& orders = {});

// Exact Poisson control limit for O/E at expected E and two-sided level 1 − p (Spiegelhalter
// 2005, with the interpolation of his appendix). `upper` selects the upper limit.
double funnelLimit(double expected, double p, bool upper);

} // namespace plumbline
