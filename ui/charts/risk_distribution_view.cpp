#include "charts/risk_distribution_view.hpp"

#include "charts/chart_style.hpp"
#include "charts/model_palette.hpp"
#include "reporting/value_text.hpp"

#include <QChart>
#include <QLegendMarker>
#include <QLineSeries>
#include <QPen>
#include <QValueAxis>

#include <algorithm>

namespace plumbline {

RiskDistributionView::RiskDistributionView(QWidget* parent)
    : ExportableChartView(parent)
{
    auto* chart = new QChart;
    styleChart(chart, QString()); // the legend names the model; the row is short
    chart->legend()->setAlignment(Qt::AlignRight);
    setChart(chart);
    setMinimumHeight(110);
    setObjectName(QStringLiteral("risk-distribution"));
    setAccessibleName(tr("Distribution of predicted risk"));
}

void RiskDistributionView::setSnapshot(SnapshotPointer snapshot, int model, double axisMaximum)
{
    m_snapshot = std::move(snapshot);
    m_axisMaximum = axisMaximum;
    m_model = model;
    draw();
}

void RiskDistributionView::setModel(int model)
{
    m_model = model;
    draw();
}

void RiskDistributionView::draw()
{
    QChart* c = chart();
    resetChart();
    m_thresholdLine = nullptr;
    if (!m_snapshot || m_model < 0 || m_model >= static_cast<int>(m_snapshot->validation.models.size()))
        return;
    const ModelValidation& m = m_snapshot->validation.models[static_cast<std::size_t>(m_model)];
    const RiskHistogram& h = m.riskDistribution;
    std::size_t events = 0, nonEvents = 0;
    for (std::size_t b = 0; b < h.events.size(); ++b) {
        events += h.events[b];
        nonEvents += h.nonEvents[b];
    }
    // Step outlines of the two histograms (shares within each class, so both classes compare).
    m_top = 0.01;
    for (std::size_t b = 0; b < h.events.size(); ++b) {
        m_top = std::max(m_top, events > 0 ? double(h.events[b]) / double(events) : 0.0);
        m_top = std::max(m_top, nonEvents > 0 ? double(h.nonEvents[b]) / double(nonEvents) : 0.0);
    }
    auto* x = probabilityAxis(tr("Predicted risk"), m_axisMaximum);
    auto* y = roundAxis(tr("Share"), 0.0, m_top, 2);
    const QString name = QString::fromStdString(m.name);
    m_top = y->max();
    c->addAxis(x, Qt::AlignBottom);
    c->addAxis(y, Qt::AlignLeft);
    auto outline = [&](const std::vector<std::size_t>& counts, std::size_t total, const QString& label, const QPen& pen) {
        auto* series = new QLineSeries;
        series->setName(label);
        series->setPen(pen);
        for (std::size_t b = 0; b < counts.size(); ++b) {
            const double share = total > 0 ? double(counts[b]) / double(total) : 0.0;
            series->append(h.edges[b], share);
            series->append(h.edges[b + 1], share);
        }
        addOnAxes(c, series, x, y);
    };
    const QColor colour = modelColour(m_model);
    outline(h.events, events, tr("%1: with the event").arg(name), QPen(colour, 2));
    outline(h.nonEvents, nonEvents, tr("%1: without").arg(name), QPen(colour.lighter(140), 1.5, Qt::DotLine));
    m_thresholdLine = new QLineSeries;
    m_thresholdLine->setPen(thresholdPen());
    addOnAxes(c, m_thresholdLine, x, y);
    keepOutOfLegend(m_thresholdLine);
    setThreshold(m_threshold);
    fitPlotArea();
}

void RiskDistributionView::setThreshold(double threshold)
{
    m_threshold = threshold;
    if (m_thresholdLine)
        m_thresholdLine->replace(QList<QPointF>{QPointF(threshold, 0.0), QPointF(threshold, m_top)});
}

double RiskDistributionView::thresholdLineX() const
{
    return m_thresholdLine && m_thresholdLine->count() > 0 ? m_thresholdLine->at(0).x() : -1.0;
}

} // namespace plumbline
