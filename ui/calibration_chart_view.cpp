#include "calibration_chart_view.hpp"

#include "chart_style.hpp"
#include "model_palette.hpp"

#include <QAreaSeries>
#include <QChart>
#include <QLegendMarker>
#include <QLineSeries>
#include <QPen>
#include <QScatterSeries>
#include <QValueAxis>

#include <algorithm>
#include <cmath>

namespace plumbline {

namespace {

// Axes end at the next tenth above the largest risk or observed proportion shown: the plot stays
// square (ideal line at 45°) without wasting the upper part on empty space.
double axisEnd(const ValidationResult& result)
{
    double top = 0.1;
    for (const auto& model : result.models) {
        for (const auto& g : model.riskGroups)
            top = std::max({top, g.meanPredicted, g.ciUpper});
        for (const auto& point : model.calibrationCurve)
            top = std::max(top, point.predicted);
    }
    return std::min(1.0, std::ceil(top * 10.0 - 1e-9) / 10.0);
}

} // namespace

CalibrationChartView::CalibrationChartView(QWidget* parent)
    : ExportableChartView(parent)
{
    auto* chart = new QChart;
    styleChart(chart, tr("Calibration: observed against predicted risk"));
    setChart(chart);
    setMinimumSize(320, 200);
    setAccessibleName(tr("Calibration plot"));
}

void CalibrationChartView::attach(QAbstractSeries* series, bool inLegend)
{
    chart()->addSeries(series);
    for (QAbstractAxis* axis : chart()->axes())
        series->attachAxis(axis);
    if (!inLegend)
        for (QLegendMarker* marker : chart()->legend()->markers(series))
            marker->setVisible(false);
}

void CalibrationChartView::setSnapshot(SnapshotPointer snapshot)
{
    m_snapshot = std::move(snapshot);
    QChart* c = chart();
    clearChart(c);
    m_series.clear();
    m_maximum = m_snapshot ? axisEnd(m_snapshot->validation) : 1.0;
    c->addAxis(probabilityAxis(tr("Predicted risk  (points: risk groups with 95 % CI; lines: smoothed, with band)"), m_maximum),
               Qt::AlignBottom);
    c->addAxis(probabilityAxis(tr("Observed proportion"), m_maximum), Qt::AlignLeft);
    auto* ideal = new QLineSeries;
    ideal->setName(tr("Ideal"));
    ideal->append(0, 0);
    ideal->append(m_maximum, m_maximum);
    ideal->setPen(QPen(QColor(120, 120, 120), 1, Qt::DashLine));
    attach(ideal, true);
    if (m_snapshot) {
        const auto& models = m_snapshot->validation.models;
        for (std::size_t m = 0; m < models.size(); ++m) {
            const int index = static_cast<int>(m);
            const ModelValidation& model = models[m];
            ModelSeries s;
            if (!model.calibrationBand.x.empty()) {
                auto* upper = new QLineSeries;
                auto* lower = new QLineSeries;
                for (std::size_t j = 0; j < model.calibrationBand.x.size(); ++j) {
                    upper->append(model.calibrationBand.x[j], std::clamp(model.calibrationBand.upper[j], 0.0, m_maximum));
                    lower->append(model.calibrationBand.x[j], std::clamp(model.calibrationBand.lower[j], 0.0, m_maximum));
                }
                s.band = new QAreaSeries(upper, lower);
                s.band->setColor(bandColour(index));
                s.band->setBorderColor(Qt::transparent);
                attach(s.band, false);
            }
            if (!model.calibrationCurve.empty()) {
                s.curve = new QLineSeries;
                for (const auto& point : model.calibrationCurve) // clamped for display only
                    s.curve->append(point.predicted, std::clamp(point.observed, 0.0, m_maximum));
                s.curve->setName(QString::fromStdString(model.name));
                s.curve->setPen(QPen(modelColour(index), 2));
                attach(s.curve, true);
            }
            for (const auto& g : model.riskGroups) {
                auto* whisker = new QLineSeries;
                whisker->append(g.meanPredicted, g.ciLower);
                whisker->append(g.meanPredicted, g.ciUpper);
                whisker->setPen(QPen(modelColour(index), 1.2));
                attach(whisker, false);
                s.whiskers.push_back(whisker);
            }
            s.groups = new QScatterSeries;
            s.groups->setName(tr("%1 (risk groups)").arg(QString::fromStdString(model.name)));
            s.groups->setMarkerSize(8);
            s.groups->setColor(modelColour(index));
            s.groups->setBorderColor(Qt::white);
            for (const auto& g : model.riskGroups)
                s.groups->append(g.meanPredicted, g.observedRate);
            attach(s.groups, false);
            connect(s.groups, &QScatterSeries::hovered, this, [this, index](const QPointF& point, bool state) {
                if (!state) {
                    emit riskGroupHovered(index, -1);
                    return;
                }
                const auto& groups = m_snapshot->validation.models[static_cast<std::size_t>(index)].riskGroups;
                for (std::size_t k = 0; k < groups.size(); ++k)
                    if (groups[k].meanPredicted == point.x() && groups[k].observedRate == point.y())
                        emit riskGroupHovered(index, static_cast<int>(k));
            });
            m_series.push_back(s);
        }
    }
    m_highlight = new QScatterSeries;
    m_highlight->setMarkerSize(18);
    m_highlight->setColor(Qt::transparent);
    m_highlight->setBorderColor(QColor(30, 30, 30));
    attach(m_highlight, false);
    m_thresholdLine = new QLineSeries;
    m_thresholdLine->setName(tr("Threshold"));
    m_thresholdLine->setPen(QPen(QColor(60, 60, 60), 1.2, Qt::DotLine));
    attach(m_thresholdLine, false);
    setThreshold(m_threshold);
}

void CalibrationChartView::setThreshold(double threshold)
{
    m_threshold = threshold;
    if (m_thresholdLine)
        m_thresholdLine->replace(QList<QPointF>{QPointF(threshold, 0.0), QPointF(threshold, m_maximum)});
}

void CalibrationChartView::setModelVisible(int model, bool visible)
{
    if (model < 0 || model >= static_cast<int>(m_series.size()))
        return;
    const ModelSeries& s = m_series[static_cast<std::size_t>(model)];
    for (QAbstractSeries* series : std::initializer_list<QAbstractSeries*>{s.groups, s.curve, s.band})
        if (series)
            series->setVisible(visible);
    for (QLineSeries* whisker : s.whiskers)
        whisker->setVisible(visible);
}

void CalibrationChartView::highlightRiskGroup(int model, int group)
{
    if (!m_highlight)
        return;
    m_highlight->clear();
    if (!m_snapshot || model < 0 || group < 0 || model >= static_cast<int>(m_snapshot->validation.models.size()))
        return;
    const auto& groups = m_snapshot->validation.models[static_cast<std::size_t>(model)].riskGroups;
    if (group < static_cast<int>(groups.size()))
        m_highlight->append(groups[static_cast<std::size_t>(group)].meanPredicted,
                            groups[static_cast<std::size_t>(group)].observedRate);
}

double CalibrationChartView::thresholdLineX() const
{
    return m_thresholdLine && m_thresholdLine->count() > 0 ? m_thresholdLine->at(0).x() : -1.0;
}

QPointF CalibrationChartView::highlightedPoint() const
{
    return m_highlight && m_highlight->count() > 0 ? m_highlight->at(0) : QPointF(-1, -1);
}

} // namespace plumbline
