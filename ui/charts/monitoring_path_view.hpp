#pragma once

#include "metrics/chart_path.hpp"
#include "charts/exportable_chart_view.hpp"

#include <optional>
#include <vector>

namespace plumbline {

// A chart over patients in date order: the cumulative expected-minus-observed count or a CUSUM,
// drawn from the core's thinned path, with a reference line at zero, an optional control limit
// h (dashed) and the signals marked. Shows; never computes.
class MonitoringPathView : public ExportableChartView {
    Q_OBJECT
public:
    MonitoringPathView(const QString& title, const QString& axisTitle, QWidget* parent = nullptr);

    // `signals`: the patients (1-based, as in the path) at which the chart signalled, with S there.
    void setPath(const std::vector<PathPoint>& path, std::optional<double> limit, const std::vector<PathPoint>& signalPoints,
                 int modelIndex);

private:
    QString m_axisTitle;
};

} // namespace plumbline
