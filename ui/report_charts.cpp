#include "report_charts.hpp"

#include "calibration_chart_view.hpp"
#include "roc_chart_view.hpp"

#include <QDir>

#include <utility>

namespace plumbline {

ReportCharts::ReportCharts(const SnapshotPointer& snapshot, std::optional<double> threshold)
    : m_roc(std::make_unique<RocChartView>())
    , m_calibration(std::make_unique<CalibrationChartView>())
{
    m_roc->setSnapshot(snapshot);
    m_calibration->setSnapshot(snapshot);
    const double marked = threshold.value_or(snapshot ? snapshot->request.panel.decisionThreshold : PanelSettings{}.decisionThreshold);
    m_roc->setThreshold(marked);
    m_calibration->setThreshold(marked);
}

ReportCharts::~ReportCharts() = default;

double ReportCharts::markedThreshold() const
{
    return m_calibration->thresholdLineX();
}

void ReportCharts::draw(ReportChart chart, QPainter* painter, const QRectF& target)
{
    (chart == ReportChart::Roc ? static_cast<ExportableChartView*>(m_roc.get()) : m_calibration.get())
        ->renderInto(painter, target, logicalSize());
}

QByteArray ReportCharts::svg(ReportChart chart)
{
    return (chart == ReportChart::Roc ? static_cast<ExportableChartView*>(m_roc.get()) : m_calibration.get())->svg(logicalSize());
}

bool ReportCharts::exportAll(const QString& folder, QString* error)
{
    if (!QDir().mkpath(folder)) {
        if (error)
            *error = QStringLiteral("the folder %1 cannot be created").arg(folder);
        return false;
    }
    const QSize size(900, 700);
    for (const auto& [view, name] : {std::pair<ExportableChartView*, QString>{m_roc.get(), QStringLiteral("roc")},
                                     std::pair<ExportableChartView*, QString>{m_calibration.get(), QStringLiteral("calibration")}})
        for (const QString& suffix : {QStringLiteral(".png"), QStringLiteral(".svg")})
            if (!view->exportTo(QDir(folder).filePath(name + suffix), size, error))
                return false;
    return true;
}

} // namespace plumbline
