#include "charts/monitoring_path_view.hpp"

#include "charts/chart_style.hpp"
#include "charts/model_palette.hpp"
#include "reporting/value_text.hpp"

#include <QChart>
#include <QLegend>
#include <QLineSeries>
#include <QPen>
#include <QScatterSeries>
#include <QValueAxis>

#include <algorithm>

namespace plumbline {

MonitoringPathView::MonitoringPathView(const QString& title, const QString& axisTitle, QWidget* parent)
    : ExportableChartView(parent)
    , m_axisTitle(axisTitle)
{
    auto* chart = new QChart;
    styleChart(chart, title);
    chart->legend()->setAlignment(Qt::AlignBottom);
    setChart(chart);
    setMinimumSize(260, 180);
    setAccessibleName(title);
}

void MonitoringPathView::setPath(const std::vector<PathPoint>& path, std::optional<double> limit,
                                 const std::vector<PathPoint>& signalPoints, int modelIndex)
{
    QChart* c = chart();
    resetChart();
    if (path.empty())
        return;
    double low = 0.0, high = limit.value_or(0.0);
    for (const auto& p : path) {
        low = std::min(low, p.value);
        high = std::max(high, p.value);
    }
    if (high <= low)
        high = low + 1.0;
    const double last = double(path.back().patient);
    auto* x = roundAxis(tr("Patients in date order"), 0.0, std::max(1.0, last), 5);
    auto* y = roundAxis(m_axisTitle, low, high, 5);
    c->addAxis(x, Qt::AlignBottom);
    c->addAxis(y, Qt::AlignLeft);
    auto add = [&](QAbstractSeries* series) { addOnAxes(c, series, x, y); };
    auto* zero = new QLineSeries;
    zero->append(0.0, 0.0);
    zero->append(last, 0.0);
    zero->setPen(QPen(QColor(150, 150, 150), 1, Qt::DotLine));
    add(zero);
    keepOutOfLegend(zero);
    if (limit) {
        auto* h = new QLineSeries;
        h->setName(tr("control limit h = %1").arg(QString::fromStdString(fixedText(*limit, 2))));
        h->append(0.0, *limit);
        h->append(last, *limit);
        h->setPen(QPen(QColor(90, 90, 90), 1, Qt::DashLine));
        add(h);
    }
    const QColor colour = modelColour(modelIndex);
    auto* line = new QLineSeries;
    line->setName(limit ? tr("CUSUM") : tr("expected − observed"));
    line->setPen(QPen(colour, 1.2));
    for (const auto& p : path)
        line->append(double(p.patient), p.value);
    add(line);
    if (!signalPoints.empty()) {
        auto* marks = new QScatterSeries;
        marks->setName(tr("signal"));
        marks->setMarkerShape(QScatterSeries::MarkerShapeRectangle);
        marks->setMarkerSize(8);
        marks->setColor(Qt::white);
        marks->setBorderColor(colour);
        for (const auto& s : signalPoints)
            marks->append(double(s.patient), s.value);
        add(marks);
    }
}

} // namespace plumbline
