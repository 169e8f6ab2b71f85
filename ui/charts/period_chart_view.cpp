#include "charts/period_chart_view.hpp"

#include "charts/chart_style.hpp"
#include "charts/model_palette.hpp"
#include "reporting/value_text.hpp"

#include <QAreaSeries>
#include <QCategoryAxis>
#include <QChart>
#include <QLegend>
#include <QLineSeries>
#include <QPen>
#include <QScatterSeries>
#include <QValueAxis>

#include <algorithm>
#include <cmath>

namespace plumbline {

PeriodChartView::PeriodChartView(const QString& title, const QString& axisTitle, QWidget* parent)
    : ExportableChartView(parent)
    , m_axisTitle(axisTitle)
{
    auto* chart = new QChart;
    styleChart(chart, title);
    // Four legend entries do not fit under a chart of 24 periods without being cut: on the right.
    chart->legend()->setAlignment(Qt::AlignRight);
    setChart(chart);
    setMinimumSize(260, 180);
    setAccessibleName(title);
}

void PeriodChartView::setPoints(const std::vector<PeriodPoint>& points, const Estimate& firstYear, std::optional<double> reference,
                                int modelIndex)
{
    QChart* c = chart();
    resetChart();
    if (points.empty())
        return;
    double low = reference.value_or(INFINITY), high = reference.value_or(-INFINITY);
    for (const Estimate* e : {&firstYear})
        if (e->lower && e->upper) {
            low = std::min(low, *e->lower);
            high = std::max(high, *e->upper);
        }
    for (const auto& p : points)
        if (p.estimate.value) {
            low = std::min(low, p.estimate.lower.value_or(*p.estimate.value));
            high = std::max(high, p.estimate.upper.value_or(*p.estimate.value));
        }
    if (!std::isfinite(low) || !std::isfinite(high))
        return;
    const double count = double(points.size());
    std::vector<std::string> names;
    for (const auto& p : points)
        names.push_back(p.period);
    auto* x = periodAxis(names);
    auto* y = roundAxis(m_axisTitle, low, high, 5);
    c->addAxis(x, Qt::AlignBottom);
    c->addAxis(y, Qt::AlignLeft);
    auto add = [&](QAbstractSeries* series) { addOnAxes(c, series, x, y); };
    const QColor colour = modelColour(modelIndex);
    if (firstYear.lower && firstYear.upper) {
        auto* upper = new QLineSeries;
        auto* lower = new QLineSeries;
        upper->append(-0.5, *firstYear.upper);
        upper->append(count - 0.5, *firstYear.upper);
        lower->append(-0.5, *firstYear.lower);
        lower->append(count - 0.5, *firstYear.lower);
        auto* band = new QAreaSeries(upper, lower);
        upper->setParent(band);
        lower->setParent(band);
        band->setName(tr("1st-year CI"));
        band->setColor(QColor(120, 120, 120, 45));
        band->setBorderColor(Qt::transparent);
        add(band);
    }
    if (firstYear.value) {
        auto* line = new QLineSeries;
        line->setName(tr("1st year"));
        line->append(-0.5, *firstYear.value);
        line->append(count - 0.5, *firstYear.value);
        line->setPen(QPen(QColor(90, 90, 90), 1, Qt::DashLine));
        add(line);
    }
    if (reference) {
        auto* line = new QLineSeries;
        line->append(-0.5, *reference);
        line->append(count - 0.5, *reference);
        line->setPen(QPen(QColor(150, 150, 150), 1, Qt::DotLine));
        add(line);
        keepOutOfLegend(line);
    }
    auto* trend = new QLineSeries;
    trend->setName(tr("by period"));
    trend->setPen(QPen(colour, 1.5));
    auto* filled = new QScatterSeries;
    filled->setMarkerSize(7);
    filled->setColor(colour);
    filled->setBorderColor(colour);
    auto* hollow = new QScatterSeries;
    hollow->setName(tr("outside 1st year"));
    hollow->setMarkerSize(8);
    hollow->setColor(Qt::white);
    hollow->setBorderColor(colour);
    // A period without a value (too few patients, or withheld) breaks the line: the line never
    // bridges a gap as if the period had been measured. The segments after a gap are drawn in
    // series of their own, out of the legend.
    QLineSeries* segment = trend;
    std::vector<QLineSeries*> later;
    for (std::size_t k = 0; k < points.size(); ++k) {
        const Estimate& e = points[k].estimate;
        if (!e.value) {
            if (segment->count() > 0) {
                later.push_back(new QLineSeries);
                later.back()->setPen(trend->pen());
                segment = later.back();
            }
            continue;
        }
        if (e.lower && e.upper) {
            auto* whisker = new QLineSeries;
            whisker->append(double(k), *e.lower);
            whisker->append(double(k), *e.upper);
            whisker->setPen(QPen(colour, 1));
            add(whisker);
            keepOutOfLegend(whisker);
        }
        segment->append(double(k), *e.value);
        (points[k].flagged ? hollow : filled)->append(double(k), *e.value);
    }
    add(trend);
    for (QLineSeries* piece : later) {
        add(piece);
        keepOutOfLegend(piece);
    }
    add(filled);
    keepOutOfLegend(filled);
    add(hollow);
    if (hollow->count() == 0)
        keepOutOfLegend(hollow);
    for (QScatterSeries* series : {filled, hollow})
        connect(series, &QScatterSeries::hovered, this, [this, points](const QPointF& point, bool state) {
            const auto k = static_cast<std::ptrdiff_t>(std::lround(point.x()));
            if (!state || k < 0 || k >= static_cast<std::ptrdiff_t>(points.size())) {
                hideValueTip();
                return;
            }
            const PeriodPoint& p = points[static_cast<std::size_t>(k)];
            QString tip = QStringLiteral("%1: %2").arg(QString::fromStdString(p.period), QString::fromStdString(estimateText(p.estimate, 3)));
            if (p.flagged)
                tip += tr("\nits interval misses the first year's");
            showValueTip(tip);
        });
}

} // namespace plumbline
