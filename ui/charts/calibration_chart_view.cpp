#include "charts/calibration_chart_view.hpp"

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

QString text(double value, int digits)
{
    return QString::fromStdString(fixedText(value, digits));
}

} // namespace

CalibrationChartView::CalibrationChartView(QWidget* parent)
    : ExportableChartView(parent)
{
    auto* chart = new QChart;
    styleChart(chart, tr("Calibration: observed against predicted risk"));
    chart->legend()->setAlignment(Qt::AlignRight);
    setChart(chart);
    setMinimumSize(320, 240);
    setSquarePlot(true);
    setObjectName(QStringLiteral("calibration-plot"));
    setAccessibleName(tr("Calibration plot"));
}

void CalibrationChartView::attach(QAbstractSeries* series, bool inLegend)
{
    chart()->addSeries(series);
    for (QAbstractAxis* axis : chart()->axes())
        series->attachAxis(axis);
    if (!inLegend)
        keepOutOfLegend(series);
}

// The risk group whose point is nearest to a position of the chart (hover and click report the
// position, which may lie anywhere on the marker), within 3 % of the axis.
int CalibrationChartView::groupAt(int model, const QPointF& point) const
{
    const auto& groups = m_snapshot->validation.models[static_cast<std::size_t>(model)].riskGroups;
    int nearest = -1;
    double best = 0.03 * m_maximum;
    for (std::size_t k = 0; k < groups.size(); ++k) {
        const double d = std::hypot(groups[k].meanPredicted - point.x(), groups[k].observedRate - point.y());
        if (d <= best) {
            best = d;
            nearest = static_cast<int>(k);
        }
    }
    return nearest;
}

QString CalibrationChartView::groupTip(int model, int group) const
{
    const ModelValidation& m = m_snapshot->validation.models[static_cast<std::size_t>(model)];
    const RiskGroup& g = m.riskGroups[static_cast<std::size_t>(group)];
    return tr("%1, risk group %2 (risks %3–%4)\n%5 patients, %6 with the event\nmean predicted %7, observed %8 (%9–%10)")
        .arg(QString::fromStdString(m.name))
        .arg(g.group)
        .arg(text(g.riskMin, 3), text(g.riskMax, 3))
        .arg(g.n)
        .arg(g.events)
        .arg(text(g.meanPredicted, 3), text(g.observedRate, 3), text(g.ciLower, 3), text(g.ciUpper, 3));
}

void CalibrationChartView::setSnapshot(SnapshotPointer snapshot)
{
    m_snapshot = std::move(snapshot);
    QChart* c = chart();
    resetChart();
    m_series.clear();
    m_highlightModel = -1;
    m_maximum = m_snapshot ? axisEnd(m_snapshot->validation) : 1.0;
    c->addAxis(probabilityAxis(tr("Predicted risk"), m_maximum), Qt::AlignBottom);
    c->addAxis(probabilityAxis(tr("Observed proportion"), m_maximum), Qt::AlignLeft);
    auto* ideal = new QLineSeries;
    ideal->setName(tr("Ideal"));
    ideal->append(0, 0);
    ideal->append(m_maximum, m_maximum);
    ideal->setPen(QPen(QColor(120, 120, 120), 1, Qt::DashLine));
    attach(ideal, true);
    // The ring goes under the points, so that the point stays the one hovered and clicked.
    m_highlight = new QScatterSeries;
    m_highlight->setMarkerSize(18);
    m_highlight->setColor(Qt::transparent);
    m_highlight->setBorderColor(QColor(30, 30, 30));
    attach(m_highlight, false);
    if (m_snapshot) {
        const auto& models = m_snapshot->validation.models;
        for (std::size_t m = 0; m < models.size(); ++m) {
            const int index = static_cast<int>(m);
            const ModelValidation& model = models[m];
            const QString name = QString::fromStdString(model.name);
            ModelSeries s;
            if (!model.calibrationBand.x.empty()) {
                auto* upper = new QLineSeries;
                auto* lower = new QLineSeries;
                for (std::size_t j = 0; j < model.calibrationBand.x.size(); ++j) {
                    upper->append(model.calibrationBand.x[j], std::clamp(model.calibrationBand.upper[j], 0.0, m_maximum));
                    lower->append(model.calibrationBand.x[j], std::clamp(model.calibrationBand.lower[j], 0.0, m_maximum));
                }
                s.band = new QAreaSeries(upper, lower);
                upper->setParent(s.band); // the area series does not own its boundary lines
                lower->setParent(s.band);
                s.band->setColor(bandColour(index));
                s.band->setBorderColor(Qt::transparent);
                attach(s.band, false);
            }
            if (!model.calibrationCurve.empty()) {
                s.curve = new QLineSeries;
                for (const auto& point : model.calibrationCurve) // clamped for display only
                    s.curve->append(point.predicted, std::clamp(point.observed, 0.0, m_maximum));
                s.curve->setName(name);
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
            s.groups->setMarkerSize(8);
            s.groups->setColor(modelColour(index));
            s.groups->setBorderColor(Qt::white);
            for (const auto& g : model.riskGroups)
                s.groups->append(g.meanPredicted, g.observedRate);
            attach(s.groups, false);
            connect(s.groups, &QScatterSeries::hovered, this, [this, index](const QPointF& point, bool state) {
                const int group = state ? groupAt(index, point) : -1;
                if (group >= 0)
                    showValueTip(groupTip(index, group));
                else
                    hideValueTip();
                emit riskGroupHovered(index, group);
            });
            connect(s.groups, &QScatterSeries::clicked, this, [this, index](const QPointF& point) {
                const int group = groupAt(index, point);
                if (group >= 0)
                    emit riskGroupClicked(index, group);
            });
            m_series.push_back(s);
        }
    }
    m_visible.assign(m_series.size(), true);
    // One legend entry explains the points of every model; the lines are the smoothed curves.
    if (m_snapshot && !m_snapshot->validation.models.empty()) {
        auto* key = new QScatterSeries;
        key->setName(tr("points: risk groups, %1 % CI").arg(m_snapshot->validation.settings.confidence * 100.0));
        key->setMarkerSize(8);
        key->setColor(QColor(90, 90, 90));
        key->setBorderColor(Qt::white);
        attach(key, true);
        auto* lines = new QLineSeries;
        // The band comes from the bootstrap: while it runs (or without one) none is named. The
        // entry stays as short as it was, so the two charts of the Overview keep one size.
        bool banded = false;
        for (const auto& model : m_snapshot->validation.models)
            banded = banded || !model.calibrationBand.x.empty();
        lines->setName(banded ? tr("lines: smoothed, with band") : tr("lines: smoothed"));
        lines->setPen(QPen(QColor(90, 90, 90), 2));
        attach(lines, true);
    }
    m_thresholdLine = new QLineSeries;
    m_thresholdLine->setPen(thresholdPen());
    attach(m_thresholdLine, true);
    setThreshold(m_threshold);
    fitPlotArea();
}

void CalibrationChartView::setThreshold(double threshold)
{
    m_threshold = threshold;
    if (!m_thresholdLine)
        return;
    m_thresholdLine->replace(QList<QPointF>{QPointF(threshold, 0.0), QPointF(threshold, m_maximum)});
    m_thresholdLine->setName(thresholdName(threshold));
}

void CalibrationChartView::setModelVisible(int model, bool visible)
{
    if (model < 0 || model >= static_cast<int>(m_series.size()))
        return;
    m_visible[static_cast<std::size_t>(model)] = visible;
    const ModelSeries& s = m_series[static_cast<std::size_t>(model)];
    for (QAbstractSeries* series : std::initializer_list<QAbstractSeries*>{s.groups, s.curve, s.band})
        setSeriesVisible(series, visible);
    for (QLineSeries* whisker : s.whiskers)
        setSeriesVisible(whisker, visible);
    if (!visible && model == m_highlightModel)
        highlightRiskGroup(-1, -1); // no ring around a point that is not shown
}

void CalibrationChartView::highlightRiskGroup(int model, int group)
{
    if (!m_highlight)
        return;
    m_highlight->clear();
    m_highlightModel = -1;
    if (!m_snapshot || model < 0 || group < 0 || model >= static_cast<int>(m_snapshot->validation.models.size())
        || !m_visible[static_cast<std::size_t>(model)])
        return;
    const auto& groups = m_snapshot->validation.models[static_cast<std::size_t>(model)].riskGroups;
    if (group < static_cast<int>(groups.size())) {
        m_highlight->append(groups[static_cast<std::size_t>(group)].meanPredicted, groups[static_cast<std::size_t>(group)].observedRate);
        m_highlightModel = model;
    }
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
