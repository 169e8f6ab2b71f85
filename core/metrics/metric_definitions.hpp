#pragma once

#include <string>
#include <string_view>

namespace plumbline {

// What a metric is and where its method was published, in one or two sentences: for tooltips,
// the report's methods section and help. Shared so every output explains a metric the same way.
struct MetricDefinition {
    std::string_view definition;
    std::string_view source;
};

MetricDefinition metricDefinition(std::string_view key);

} // namespace plumbline
