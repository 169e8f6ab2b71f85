#include "charts/roc_chart_view.hpp"

#include "charts/chart_style.hpp"
#include "charts/model_palette.hpp"
#include "reporting/value_text.hpp"

#include <QAreaSeries>
#include <QChart>
#include <QLegendMarker>
#include <QLineSeries>
#include <QPen>
#include <QScatterSeries>
#include <QValueAxis>

#include <cmath>

namespace plumbline {

std::size_t operatingPointIndex(double threshold)
{
    return static_cast<std::size_t>(std::lround(std::clamp(threshold, 0.0, 1.0) / 0.005));
}

namespace {

// "name" over "C 0.719 (0.710–0.728)": two short lines fit beside the plot where one long line
// would be cut (the legend shows rich text, so the name is escaped).
QString legendText(const ModelValidation& model)
{
    const QString name = QString::fromStdString(model.name).toHtmlEscaped();
    const Estimate& c = model.metrics[CStatistic].estimate;
    if (!c.value)
        return name;
    QString text = QStringLiteral("%1<br>C %2").arg(name, QString::fromStdString(fixedText(*c.value, 3)));
    if (c.lower && c.upper)
        text += QStringLiteral(" (%1–%2)").arg(QString::fromStdString(fixedText(*c.lower, 3)), QString::fromStdString(fixedText(*c.upper, 3)));
    return text;
}

// The ROC point nearest to a hovered position: its threshold, sensitivity and specificity.
QString rocTip(const ModelValidation& model, QPointF at)
{
    const RocPoint* best = nullptr;
    double distance = INFINITY;
    for (const auto& p : model.roc) {
        const double d = std::hypot(1.0 - p.specificity - at.x(), p.sensitivity - at.y());
        if (d < distance) {
            distance = d;
            best = &p;
        }
    }
    if (!best)
        return {};
    return QObject::tr("%1\nflag if risk ≥ %2: sensitivity %3, specificity %4")
        .arg(QString::fromStdString(model.name), QString::fromStdString(fixedText(best->threshold, 3)),
             QString::fromStdString(fixedText(best->sensitivity, 3)), QString::fromStdString(fixedText(best->specificity, 3)));
}

} // namespace

RocChartView::RocChartView(QWidget* parent)
    : ExportableChartView(parent)
{
    auto* chart = new QChart;
    styleChart(chart, tr("Discrimination: ROC curve"));
    chart->legend()->setAlignment(Qt::AlignRight);
    setChart(chart);
    setMinimumSize(320, 240);
    setSquarePlot(true);
    setObjectName(QStringLiteral("roc-curve"));
    setAccessibleName(tr("ROC curve"));
}

void RocChartView::addAxes(QAbstractSeries* series)
{
    chart()->addSeries(series);
    for (QAbstractAxis* axis : chart()->axes())
        series->attachAxis(axis);
}

void RocChartView::setSnapshot(SnapshotPointer snapshot)
{
    m_snapshot = std::move(snapshot);
    QChart* c = chart();
    resetChart();
    m_series.clear();
    m_thresholdKey = nullptr;
    c->addAxis(probabilityAxis(tr("1 − specificity (false-positive rate)")), Qt::AlignBottom);
    c->addAxis(probabilityAxis(tr("Sensitivity")), Qt::AlignLeft);
    auto* diagonal = new QLineSeries;
    diagonal->append(0, 0);
    diagonal->append(1, 1);
    diagonal->setPen(QPen(QColor(150, 150, 150), 1, Qt::DashLine));
    addAxes(diagonal);
    keepOutOfLegend(diagonal);
    if (m_snapshot) {
        const auto& models = m_snapshot->validation.models;
        for (std::size_t m = 0; m < models.size(); ++m) {
            const int index = static_cast<int>(m);
            ModelSeries s;
            if (!models[m].rocBand.x.empty()) {
                auto* upper = new QLineSeries;
                auto* lower = new QLineSeries;
                for (std::size_t j = 0; j < models[m].rocBand.x.size(); ++j) {
                    upper->append(models[m].rocBand.x[j], models[m].rocBand.upper[j]);
                    lower->append(models[m].rocBand.x[j], models[m].rocBand.lower[j]);
                }
                s.band = new QAreaSeries(upper, lower);
                upper->setParent(s.band); // the area series does not own its boundary lines
                lower->setParent(s.band);
                s.band->setColor(bandColour(index));
                s.band->setBorderColor(Qt::transparent);
                addAxes(s.band);
                keepOutOfLegend(s.band);
            }
            s.curve = new QLineSeries;
            for (const auto& point : models[m].roc)
                s.curve->append(1.0 - point.specificity, point.sensitivity);
            s.curve->setName(legendText(models[m]));
            s.curve->setPen(QPen(modelColour(index), 2));
            addAxes(s.curve);
            connect(s.curve, &QLineSeries::hovered, this, [this, m](const QPointF& point, bool state) {
                if (state && m_snapshot && m < m_snapshot->validation.models.size())
                    showValueTip(rocTip(m_snapshot->validation.models[m], point));
                else
                    hideValueTip();
            });
            s.marker = new QScatterSeries;
            s.marker->setMarkerSize(11);
            s.marker->setColor(modelColour(index));
            s.marker->setBorderColor(Qt::white);
            addAxes(s.marker);
            keepOutOfLegend(s.marker);
            m_series.push_back(s);
        }
    }
    // One legend entry for the dots that mark the threshold on every curve.
    m_thresholdKey = new QScatterSeries;
    m_thresholdKey->setMarkerSize(9);
    m_thresholdKey->setColor(QColor(90, 90, 90));
    m_thresholdKey->setBorderColor(Qt::white);
    addAxes(m_thresholdKey);
    setThreshold(m_threshold);
    fitPlotArea();
}

void RocChartView::setThreshold(double threshold)
{
    m_threshold = threshold;
    if (m_thresholdKey)
        m_thresholdKey->setName(tr("dots: flag if risk ≥ %1").arg(threshold, 0, 'f', 3));
    if (!m_snapshot)
        return;
    for (std::size_t m = 0; m < m_series.size(); ++m) {
        const auto& points = m_snapshot->validation.models[m].operatingPoints;
        if (points.empty())
            continue;
        const OperatingPoint& p = points[std::min(operatingPointIndex(threshold), points.size() - 1)];
        const OperatingPointSummary s = summarise(p);
        m_series[m].marker->replace(QList<QPointF>{QPointF(1.0 - s.specificity.value_or(0.0), s.sensitivity.value_or(0.0))});
    }
}

void RocChartView::setModelVisible(int model, bool visible)
{
    if (model < 0 || model >= static_cast<int>(m_series.size()))
        return;
    const ModelSeries& s = m_series[static_cast<std::size_t>(model)];
    setSeriesVisible(s.curve, visible);
    setSeriesVisible(s.marker, visible);
    setSeriesVisible(s.band, visible);
}

QPointF RocChartView::markerPosition(int model) const
{
    if (model < 0 || model >= static_cast<int>(m_series.size()) || m_series[static_cast<std::size_t>(model)].marker->count() == 0)
        return {};
    return m_series[static_cast<std::size_t>(model)].marker->at(0);
}

} // namespace plumbline
