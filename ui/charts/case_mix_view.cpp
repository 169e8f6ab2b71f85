#include "charts/case_mix_view.hpp"

#include "charts/chart_style.hpp"
#include "charts/model_palette.hpp"
#include "reporting/value_text.hpp"

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

CaseMixView::CaseMixView(QWidget* parent)
    : ExportableChartView(parent)
{
    auto* chart = new QChart;
    styleChart(chart, tr("Predicted and observed by period"));
    chart->legend()->setAlignment(Qt::AlignBottom);
    setChart(chart);
    setMinimumSize(260, 180);
    setAccessibleName(tr("Predicted and observed by period"));
}

void CaseMixView::setPoints(const std::vector<CaseMixPoint>& points, int modelIndex)
{
    QChart* c = chart();
    resetChart();
    if (points.empty())
        return;
    double high = 0.0;
    for (const auto& p : points)
        high = std::max({high, p.meanPredicted, p.observedRate});
    std::vector<std::string> names;
    for (const auto& p : points)
        names.push_back(p.period);
    auto* x = periodAxis(names);
    auto* y = roundAxis(tr("Risk"), 0.0, std::max(0.01, high), 5);
    c->addAxis(x, Qt::AlignBottom);
    c->addAxis(y, Qt::AlignLeft);
    const QColor colour = modelColour(modelIndex);
    auto* predicted = new QLineSeries;
    predicted->setName(tr("mean predicted"));
    predicted->setPen(QPen(colour, 1.5));
    auto* observed = new QLineSeries;
    observed->setName(tr("observed rate"));
    observed->setPen(QPen(QColor(60, 60, 60), 1.5, Qt::DashLine));
    auto* dots = new QScatterSeries;
    dots->setMarkerSize(6);
    dots->setColor(colour);
    dots->setBorderColor(colour);
    for (std::size_t k = 0; k < points.size(); ++k) {
        predicted->append(double(k), points[k].meanPredicted);
        observed->append(double(k), points[k].observedRate);
        dots->append(double(k), points[k].meanPredicted);
    }
    for (QAbstractSeries* series : {static_cast<QAbstractSeries*>(predicted), static_cast<QAbstractSeries*>(observed),
                                    static_cast<QAbstractSeries*>(dots)})
        addOnAxes(c, series, x, y);
    keepOutOfLegend(dots);
    connect(dots, &QScatterSeries::hovered, this, [this, points](const QPointF& point, bool state) {
        const auto k = static_cast<std::ptrdiff_t>(std::lround(point.x()));
        if (!state || k < 0 || k >= static_cast<std::ptrdiff_t>(points.size())) {
            hideValueTip();
            return;
        }
        const CaseMixPoint& p = points[static_cast<std::size_t>(k)];
        showValueTip(tr("%1: mean predicted %2, observed %3, PSI %4")
                         .arg(QString::fromStdString(p.period))
                         .arg(QString::fromStdString(fixedText(p.meanPredicted, 3)))
                         .arg(QString::fromStdString(fixedText(p.observedRate, 3)))
                         .arg(QString::fromStdString(fixedText(p.psi, 3))));
    });
}

} // namespace plumbline
