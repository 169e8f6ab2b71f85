#pragma once

#include "report/report_document.hpp"

namespace plumbline {

// Pooling across sites in a report: the forest charts per model and measure, a table of each
// site's estimate (small sites withheld by the redacted result, no counts printed), a table of
// the pooled values with τ², I², HKSJ and prediction intervals and the probability of acceptable
// performance in a new site, and the cautions. `shown` is the result redacted for the report.
void addSitePooling(ReportSection& section, const ValidationResult& shown);

} // namespace plumbline
