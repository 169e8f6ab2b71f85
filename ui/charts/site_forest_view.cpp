#include "charts/site_forest_view.hpp"

#include "charts/chart_style.hpp"
#include "charts/model_palette.hpp"
#include "reporting/value_text.hpp"

#include <QCategoryAxis>
#include <QChart>
#include <QLineSeries>
#include <QPen>
#include <QScatterSeries>
#include <QValueAxis>

#include <algorithm>
#include <cmath>

namespace plumbline {

SiteForestView::SiteForestView(const QString& title, const QString& axisTitle, QWidget* parent)
    : ExportableChartView(parent)
    , m_axisTitle(axisTitle)
{
    auto* chart = new QChart;
    styleChart(chart, title);
    chart->legend()->setVisible(false);
    setChart(chart);
    setMinimumSize(240, 180);
    setAccessibleName(title);
}

void SiteForestView::clear()
{
    resetChart();
    m_labels.clear();
}

void SiteForestView::setMeasure(const PooledMeasure& measure, std::optional<double> reference, int modelIndex)
{
    clear();
    QChart* c = chart();
    if (measure.sites.empty())
        return;
    // Rows from the top: the sites in name order, then the pooled value, then a new site.
    const bool pooled = measure.pooled.has_value();
    const bool predicted = measure.predictionLower.has_value();
    const std::size_t rows = measure.sites.size() + (pooled ? 1 : 0) + (predicted ? 1 : 0);
    double low = reference.value_or(INFINITY), high = reference.value_or(-INFINITY);
    for (const auto& s : measure.sites) {
        low = std::min(low, s.lower);
        high = std::max(high, s.upper);
    }
    if (pooled) {
        low = std::min(low, *measure.hksjLower);
        high = std::max(high, *measure.hksjUpper);
    }
    if (predicted) {
        low = std::min(low, *measure.predictionLower);
        high = std::max(high, *measure.predictionUpper);
    }
    if (!std::isfinite(low) || !std::isfinite(high))
        return;
    const double pad = std::max(0.02, 0.08 * (high - low));
    auto* x = roundAxis(m_axisTitle, low - pad, high + pad, 4);
    auto* y = new QCategoryAxis;
    y->setLabelsPosition(QCategoryAxis::AxisLabelsPositionOnValue);
    y->setLabelsFont(QFont(QStringLiteral("DejaVu Sans"), 8));
    const double count = double(rows);
    y->setRange(-0.5, count - 0.5);
    for (const auto& s : measure.sites)
        m_labels << QString::fromStdString(s.site);
    if (pooled)
        m_labels << tr("Pooled (REML, HKSJ)");
    if (predicted)
        m_labels << tr("New site (%1 % prediction)").arg(std::lround(measure.pool->confidence * 100.0));
    // QCategoryAxis wants ascending values: the bottom row first; every third with many sites.
    const int step = rows > 14 ? 3 : 1;
    for (int k = int(rows) - 1; k >= 0; --k)
        if (k % step == 0 || k >= int(measure.sites.size()))
            y->append(m_labels[k], count - 1.0 - double(k));
    c->addAxis(x, Qt::AlignBottom);
    c->addAxis(y, Qt::AlignLeft);
    auto add = [&](QAbstractSeries* series) { addOnAxes(c, series, x, y); };
    const QColor colour = modelColour(modelIndex);
    if (reference) {
        auto* line = new QLineSeries;
        line->append(*reference, -0.5);
        line->append(*reference, count - 0.5);
        line->setPen(QPen(QColor(120, 120, 120), 1, Qt::DotLine));
        add(line);
    }
    if (pooled) {
        auto* line = new QLineSeries; // the pooled value through every row
        line->append(*measure.pooled, -0.5);
        line->append(*measure.pooled, count - 0.5);
        line->setPen(QPen(colour, 1, Qt::DashLine));
        add(line);
    }
    auto* points = new QScatterSeries;
    points->setMarkerSize(9);
    points->setColor(colour);
    // A whisker is a series of its own: beyond 100 sites (a column that is not really a site)
    // only the points are drawn, so the chart stays quick; the tooltip still gives each interval.
    const bool whiskers = measure.sites.size() <= 100;
    for (std::size_t k = 0; k < measure.sites.size(); ++k) {
        const SiteEstimate& s = measure.sites[k];
        const double row = count - 1.0 - double(k);
        if (whiskers) {
            auto* whisker = new QLineSeries;
            whisker->append(s.lower, row);
            whisker->append(s.upper, row);
            whisker->setPen(QPen(colour, 1.5));
            add(whisker);
        }
        points->append(s.estimate, row);
    }
    add(points);
    if (pooled) {
        const double row = count - 1.0 - double(measure.sites.size());
        auto* diamond = new QLineSeries;
        diamond->append(*measure.hksjLower, row);
        diamond->append(*measure.pooled, row + 0.3);
        diamond->append(*measure.hksjUpper, row);
        diamond->append(*measure.pooled, row - 0.3);
        diamond->append(*measure.hksjLower, row);
        diamond->setPen(QPen(colour, 2));
        add(diamond);
    }
    if (predicted) {
        const double row = 0.0;
        auto* bar = new QLineSeries;
        bar->append(*measure.predictionLower, row);
        bar->append(*measure.predictionUpper, row);
        bar->setPen(QPen(colour, 5, Qt::SolidLine, Qt::FlatCap));
        add(bar);
    }
    // A hovered site names its values.
    const auto sites = measure.sites;
    connect(points, &QScatterSeries::hovered, this, [this, sites, count](const QPointF& point, bool state) {
        const auto k = static_cast<std::ptrdiff_t>(std::lround(count - 1.0 - point.y()));
        if (!state || k < 0 || k >= static_cast<std::ptrdiff_t>(sites.size())) {
            hideValueTip();
            return;
        }
        const SiteEstimate& s = sites[static_cast<std::size_t>(k)];
        showValueTip(QStringLiteral("%1: %2 (%3 to %4), n %5").arg(QString::fromStdString(s.site), QString::fromStdString(fixedText(s.estimate, 3)),
                                                                     QString::fromStdString(fixedText(s.lower, 3)),
                                                                     QString::fromStdString(fixedText(s.upper, 3)))
                         .arg(s.n));
    });
}

} // namespace plumbline
