#include "risk_distribution_view.hpp"

#include "chart_style.hpp"
#include "model_palette.hpp"

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
    styleChart(chart, tr("Distribution of predicted risk"));
    setChart(chart);
    setMinimumHeight(150);
    chart->legend()->setAlignment(Qt::AlignRight);
    setAccessibleName(tr("Distribution of predicted risk"));
}

void RiskDistributionView::setSnapshot(SnapshotPointer snapshot, int model, double axisMaximum)
{
    m_snapshot = std::move(snapshot);
    QChart* c = chart();
    clearChart(c);
    m_thresholdLine = nullptr;
    if (!m_snapshot || model < 0 || model >= static_cast<int>(m_snapshot->validation.models.size()))
        return;
    const ModelValidation& m = m_snapshot->validation.models[static_cast<std::size_t>(model)];
    const RiskHistogram& h = m.riskDistribution;
    std::size_t events = 0, nonEvents = 0;
    for (std::size_t b = 0; b < h.events.size(); ++b) {
        events += h.events[b];
        nonEvents += h.nonEvents[b];
    }
    chart()->setTitle(tr("Distribution of predicted risk: %1").arg(QString::fromStdString(m.name)));
    auto* x = probabilityAxis(tr("Predicted risk"), axisMaximum);
    auto* y = new QValueAxis;
    y->setTitleText(tr("Share"));
    y->setLabelFormat(QStringLiteral("%.2f"));
    y->setTickCount(3);
    y->setTitleFont(x->titleFont());
    y->setLabelsFont(x->labelsFont());
    c->addAxis(x, Qt::AlignBottom);
    c->addAxis(y, Qt::AlignLeft);
    // Step outlines of the two histograms (shares within each class, so both classes compare).
    auto outline = [&](const std::vector<std::size_t>& counts, std::size_t total, const QString& name, const QPen& pen) {
        auto* series = new QLineSeries;
        series->setName(name);
        series->setPen(pen);
        for (std::size_t b = 0; b < counts.size(); ++b) {
            const double share = total > 0 ? double(counts[b]) / double(total) : 0.0;
            series->append(h.edges[b], share);
            series->append(h.edges[b + 1], share);
            m_top = std::max(m_top, share);
        }
        c->addSeries(series);
        series->attachAxis(x);
        series->attachAxis(y);
    };
    m_top = 0.05;
    outline(h.nonEvents, nonEvents, tr("without the event"), QPen(QColor(140, 140, 140), 1.5));
    outline(h.events, events, tr("with the event"), QPen(modelColour(model), 2));
    y->setRange(0.0, m_top * 1.1);
    m_thresholdLine = new QLineSeries;
    m_thresholdLine->setPen(QPen(QColor(60, 60, 60), 1.2, Qt::DotLine));
    c->addSeries(m_thresholdLine);
    m_thresholdLine->attachAxis(x);
    m_thresholdLine->attachAxis(y);
    for (QLegendMarker* marker : c->legend()->markers(m_thresholdLine))
        marker->setVisible(false);
    setThreshold(m_threshold);
}

void RiskDistributionView::setThreshold(double threshold)
{
    m_threshold = threshold;
    if (m_thresholdLine)
        m_thresholdLine->replace(QList<QPointF>{QPointF(threshold, 0.0), QPointF(threshold, m_top * 1.1)});
}

double RiskDistributionView::thresholdLineX() const
{
    return m_thresholdLine && m_thresholdLine->count() > 0 ? m_thresholdLine->at(0).x() : -1.0;
}

} // namespace plumbline
