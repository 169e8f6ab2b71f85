#include "charts/update_calibration_view.hpp"

#include "charts/chart_style.hpp"
#include "charts/model_palette.hpp"

#include <QChart>
#include <QLegendMarker>
#include <QLineSeries>
#include <QPen>
#include <QScatterSeries>
#include <QValueAxis>

#include <algorithm>
#include <cmath>

namespace plumbline {

UpdateCalibrationView::UpdateCalibrationView(QWidget* parent)
    : ExportableChartView(parent)
{
    auto* chart = new QChart;
    styleChart(chart, tr("Calibration before and after updating"));
    chart->legend()->setAlignment(Qt::AlignRight);
    setChart(chart);
    setMinimumSize(320, 240);
    setSquarePlot(true);
    setObjectName(QStringLiteral("updating-calibration"));
    setAccessibleName(tr("Calibration before and after updating"));
}

void UpdateCalibrationView::setGroups(const std::vector<RiskGroup>& original, const std::vector<RiskGroup>& updated,
                                      int modelIndex)
{
    QChart* c = chart();
    resetChart();
    double top = 0.1;
    for (const auto* groups : {&original, &updated})
        for (const auto& g : *groups)
            top = std::max({top, g.meanPredicted, g.observedRate});
    m_top = std::min(1.0, std::ceil(top * 10.0 - 1e-9) / 10.0);
    auto* x = probabilityAxis(tr("Predicted risk"), m_top);
    auto* y = probabilityAxis(tr("Observed proportion"), m_top);
    c->addAxis(x, Qt::AlignBottom);
    c->addAxis(y, Qt::AlignLeft);
    auto add = [&](QAbstractSeries* series) { addOnAxes(c, series, x, y); };
    auto* ideal = new QLineSeries;
    ideal->setName(tr("Ideal"));
    ideal->append(0, 0);
    ideal->append(m_top, m_top);
    ideal->setPen(QPen(QColor(120, 120, 120), 1, Qt::DashLine));
    add(ideal);
    auto points = [&](const std::vector<RiskGroup>& groups, const QString& name, QColor colour, QScatterSeries::MarkerShape shape) {
        auto* series = new QScatterSeries;
        series->setName(name);
        series->setMarkerShape(shape);
        series->setMarkerSize(9);
        series->setColor(colour);
        series->setBorderColor(colour.darker(130));
        for (const auto& g : groups)
            series->append(g.meanPredicted, g.observedRate);
        add(series);
    };
    // Different colours and shapes, so that the two sets read apart in print and for colour-blind readers.
    points(original, tr("original risks"), QColor(150, 150, 150), QScatterSeries::MarkerShapeRectangle);
    points(updated, tr("updated risks"), modelColour(modelIndex), QScatterSeries::MarkerShapeCircle);
    m_threshold = new QLineSeries;
    m_threshold->setPen(thresholdPen());
    add(m_threshold);
    keepOutOfLegend(m_threshold);
    fitPlotArea();
}

void UpdateCalibrationView::setThreshold(double threshold)
{
    if (m_threshold)
        m_threshold->replace(QList<QPointF>{QPointF(threshold, 0.0), QPointF(threshold, m_top)});
}

} // namespace plumbline
