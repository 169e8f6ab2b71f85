#include "funnel_chart_view.hpp"

#include "chart_style.hpp"
#include "model_palette.hpp"

#include <QChart>
#include <QLegend>
#include <QLegendMarker>
#include <QLineSeries>
#include <QLogValueAxis>
#include <QPen>
#include <QScatterSeries>
#include <QValueAxis>

#include <algorithm>

namespace plumbline {

FunnelChartView::FunnelChartView(QWidget* parent)
    : ExportableChartView(parent)
{
    auto* chart = new QChart;
    styleChart(chart, tr("Funnel: O/E against expected events"));
    setChart(chart);
    setMinimumSize(280, 220);
    setAccessibleName(tr("Funnel chart"));
}

void FunnelChartView::setFunnel(const std::vector<FunnelPoint>& points, const FunnelLimits* limits, int modelIndex)
{
    QChart* c = chart();
    clearChart(c);
    if (points.empty() || !limits || limits->expected.empty())
        return;
    double low = 1.0, high = 1.0;
    for (const auto& p : points) {
        low = std::min(low, p.oe);
        high = std::max(high, p.oe);
    }
    low = std::min(low, limits->lower998.front());
    high = std::max(high, limits->upper998.front());
    auto* x = new QLogValueAxis;
    x->setRange(limits->expected.front(), limits->expected.back());
    x->setTitleText(tr("Expected events (log scale)"));
    x->setLabelFormat(QStringLiteral("%.0f"));
    x->setLabelsFont(QFont(QStringLiteral("DejaVu Sans"), 8));
    auto* y = new QValueAxis;
    y->setRange(std::max(0.0, low - 0.05), high + 0.05);
    y->setTitleText(tr("Observed / expected"));
    y->setLabelFormat(QStringLiteral("%.2f"));
    y->setLabelsFont(QFont(QStringLiteral("DejaVu Sans"), 8));
    c->addAxis(x, Qt::AlignBottom);
    c->addAxis(y, Qt::AlignLeft);
    auto add = [&](QAbstractSeries* series) { addOnAxes(c, series, x, y); };
    auto curve = [&](const std::vector<double>& values, const QString& name, QPen pen) {
        auto* line = new QLineSeries;
        line->setName(name);
        for (std::size_t k = 0; k < values.size(); ++k)
            line->append(limits->expected[k], values[k]);
        line->setPen(pen);
        add(line);
        return line;
    };
    curve(limits->upper95, tr("95 % limits"), QPen(QColor(90, 90, 90), 1, Qt::DashLine));
    curve(limits->lower95, QString(), QPen(QColor(90, 90, 90), 1, Qt::DashLine));
    curve(limits->upper998, tr("99.8 % limits"), QPen(QColor(90, 90, 90), 1, Qt::DotLine));
    curve(limits->lower998, QString(), QPen(QColor(90, 90, 90), 1, Qt::DotLine));
    curve(std::vector<double>(limits->expected.size(), 1.0), tr("O/E = 1"), QPen(QColor(150, 150, 150), 1));
    auto* dots = new QScatterSeries;
    dots->setName(tr("Levels"));
    dots->setMarkerSize(10);
    dots->setColor(modelColour(modelIndex));
    for (const auto& p : points)
        dots->append(p.expected, p.oe);
    add(dots);
    // Unnamed series (the lower limits) stay out of the legend.
    for (QLegendMarker* marker : c->legend()->markers())
        if (marker->label().isEmpty())
            marker->setVisible(false);
}

} // namespace plumbline
