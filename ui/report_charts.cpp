#include "report_charts.hpp"

#include "calibration_chart_view.hpp"
#include "roc_chart_view.hpp"

namespace plumbline {

ReportCharts::ReportCharts(const SnapshotPointer& snapshot)
    : m_roc(std::make_unique<RocChartView>())
    , m_calibration(std::make_unique<CalibrationChartView>())
{
    m_roc->setSnapshot(snapshot);
    m_calibration->setSnapshot(snapshot);
    // The charts mark the first decision threshold of the analysis.
    const double threshold = snapshot && !snapshot->request.panel.thresholds.empty() ? snapshot->request.panel.thresholds.front() : 0.2;
    m_roc->setThreshold(threshold);
    m_calibration->setThreshold(threshold);
}

ReportCharts::~ReportCharts() = default;

void ReportCharts::draw(ReportChart chart, QPainter* painter, const QRectF& target)
{
    (chart == ReportChart::Roc ? static_cast<ExportableChartView*>(m_roc.get()) : m_calibration.get())
        ->renderInto(painter, target, logicalSize());
}

QByteArray ReportCharts::svg(ReportChart chart)
{
    return (chart == ReportChart::Roc ? static_cast<ExportableChartView*>(m_roc.get()) : m_calibration.get())->svg(logicalSize());
}

} // namespace plumbline
