#include "charts/forest_chart_view.hpp"

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

ForestChartView::ForestChartView(const QString& title, const QString& axisTitle, QWidget* parent)
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

void ForestChartView::setRows(const std::vector<ForestRow>& rows, const Estimate& overall, std::optional<double> reference,
                              int modelIndex)
{
    QChart* c = chart();
    resetChart();
    if (rows.empty())
        return;
    // Rows from the top: "All patients" first, then the levels in the order given.
    std::vector<ForestRow> all{{"All patients", overall, false, {}}};
    all.insert(all.end(), rows.begin(), rows.end());
    double low = reference.value_or(INFINITY), high = reference.value_or(-INFINITY);
    for (const auto& r : all)
        if (r.estimate.value) {
            low = std::min(low, r.estimate.lower.value_or(*r.estimate.value));
            high = std::max(high, r.estimate.upper.value_or(*r.estimate.value));
        }
    if (!std::isfinite(low) || !std::isfinite(high))
        return;
    const double pad = std::max(0.02, 0.08 * (high - low));
    auto* x = roundAxis(m_axisTitle, low - pad, high + pad, 4);
    auto* y = new QCategoryAxis;
    y->setLabelsPosition(QCategoryAxis::AxisLabelsPositionOnValue);
    y->setLabelsFont(QFont(QStringLiteral("DejaVu Sans"), 8));
    const double count = double(all.size());
    y->setRange(-0.5, count - 0.5);
    // QCategoryAxis wants categories in ascending order of value: the bottom row first. With many
    // rows (two years of months) every third is labelled so that labels are not elided.
    const std::size_t step = all.size() > 14 ? 3 : 1;
    for (std::size_t k = all.size(); k-- > 0;) {
        if (k % step != 0)
            continue;
        const QString label = QString::fromStdString(all[k].label) + (all[k].mark.empty() ? QString() : QStringLiteral(" (%1)").arg(QString::fromStdString(all[k].mark)));
        y->append(label, count - 1.0 - double(k));
    }
    c->addAxis(x, Qt::AlignBottom);
    c->addAxis(y, Qt::AlignLeft);
    auto add = [&](QAbstractSeries* series) { addOnAxes(c, series, x, y); };
    auto vertical = [&](double at, QPen pen) {
        auto* line = new QLineSeries;
        line->append(at, -0.5);
        line->append(at, count - 0.5);
        line->setPen(pen);
        add(line);
    };
    if (overall.value)
        vertical(*overall.value, QPen(modelColour(modelIndex), 1, Qt::DashLine));
    if (reference)
        vertical(*reference, QPen(QColor(120, 120, 120), 1, Qt::DotLine));
    auto* points = new QScatterSeries;
    points->setMarkerSize(9);
    points->setColor(modelColour(modelIndex));
    auto* hollow = new QScatterSeries;
    hollow->setMarkerSize(9);
    hollow->setColor(Qt::white);
    hollow->setBorderColor(modelColour(modelIndex));
    for (std::size_t k = 0; k < all.size(); ++k) {
        const Estimate& e = all[k].estimate;
        if (!e.value)
            continue;
        const double row = count - 1.0 - double(k);
        if (e.lower && e.upper) {
            auto* whisker = new QLineSeries;
            whisker->append(*e.lower, row);
            whisker->append(*e.upper, row);
            whisker->setPen(QPen(modelColour(modelIndex), k == 0 ? 3 : 1.5));
            add(whisker);
        }
        (all[k].hollow ? hollow : points)->append(*e.value, row);
    }
    add(points);
    add(hollow);
    // A hovered point names its row and values.
    for (QScatterSeries* series : {points, hollow})
        connect(series, &QScatterSeries::hovered, this, [this, all, count](const QPointF& point, bool state) {
            const auto k = static_cast<std::ptrdiff_t>(std::lround(count - 1.0 - point.y()));
            if (!state || k < 0 || k >= static_cast<std::ptrdiff_t>(all.size())) {
                hideValueTip();
                return;
            }
            const ForestRow& r = all[static_cast<std::size_t>(k)];
            QString tip = QStringLiteral("%1: %2").arg(QString::fromStdString(r.label), QString::fromStdString(estimateText(r.estimate, 3)));
            if (!r.mark.empty())
                tip += QStringLiteral("\n") + QString::fromStdString(r.mark);
            showValueTip(tip);
        });
}

} // namespace plumbline
