#include "decision_curve_view.hpp"

#include "chart_style.hpp"
#include "model_palette.hpp"

#include <QAreaSeries>
#include <QChart>
#include <QLineSeries>
#include <QPen>
#include <QValueAxis>

#include <algorithm>

namespace plumbline {

DecisionCurveView::DecisionCurveView(QWidget* parent)
    : ExportableChartView(parent)
{
    auto* chart = new QChart;
    styleChart(chart, tr("Decision curve"));
    setChart(chart);
    setMinimumSize(320, 240);
    setAccessibleName(tr("Decision curve"));
}

void DecisionCurveView::setSnapshot(SnapshotPointer snapshot)
{
    QChart* c = chart();
    c->removeAllSeries();
    m_thresholdLine = nullptr;
    for (QAbstractAxis* axis : c->axes()) {
        c->removeAxis(axis);
        delete axis;
    }
    if (!snapshot || snapshot->validation.models.empty() || snapshot->validation.models.front().decisionCurve.empty())
        return;
    const auto& models = snapshot->validation.models;
    const auto& grid = models.front().decisionCurve;
    double top = 0.0;
    for (const auto& m : models)
        for (const auto& p : m.decisionCurve)
            top = std::max({top, p.netBenefit, p.treatAll, p.upper.value_or(0.0)});
    m_top = top > 0.0 ? top * 1.1 : 0.05;
    m_bottom = -0.25 * m_top;
    auto* x = probabilityAxis(tr("Threshold probability"), grid.back().threshold);
    x->setMin(grid.front().threshold);
    auto* y = new QValueAxis;
    y->setTitleText(tr("Net benefit"));
    y->setRange(m_bottom, m_top);
    y->applyNiceNumbers(); // round tick values; the threshold line spans the rounded range
    m_bottom = y->min();
    m_top = y->max();
    y->setLabelFormat(QStringLiteral("%.2f"));
    c->addAxis(x, Qt::AlignBottom);
    c->addAxis(y, Qt::AlignLeft);
    auto add = [&](QAbstractSeries* series) { addOnAxes(c, series, x, y); };
    for (std::size_t m = 0; m < models.size(); ++m) {
        const auto& curve = models[m].decisionCurve;
        if (curve.front().lower) {
            auto* lower = new QLineSeries;
            auto* upper = new QLineSeries;
            for (const auto& p : curve) {
                lower->append(p.threshold, std::clamp(p.lower.value_or(p.netBenefit), m_bottom, m_top));
                upper->append(p.threshold, std::clamp(p.upper.value_or(p.netBenefit), m_bottom, m_top));
            }
            auto* band = new QAreaSeries(upper, lower);
            band->setName(tr("%1 (bootstrap band)").arg(QString::fromStdString(models[m].name)));
            band->setColor(bandColour(int(m)));
            band->setBorderColor(Qt::transparent);
            add(band);
        }
        auto* line = new QLineSeries;
        line->setName(QString::fromStdString(models[m].name));
        for (const auto& p : curve)
            line->append(p.threshold, std::clamp(p.netBenefit, m_bottom, m_top));
        line->setPen(QPen(modelColour(int(m)), 2));
        add(line);
    }
    auto* all = new QLineSeries;
    all->setName(tr("Treat all"));
    for (const auto& p : grid)
        if (p.treatAll >= m_bottom)
            all->append(p.threshold, p.treatAll);
    all->setPen(QPen(QColor(90, 90, 90), 1.5, Qt::DashLine));
    add(all);
    auto* none = new QLineSeries;
    none->setName(tr("Treat none"));
    none->append(grid.front().threshold, 0.0);
    none->append(grid.back().threshold, 0.0);
    none->setPen(QPen(QColor(90, 90, 90), 1.5, Qt::DotLine));
    add(none);
    m_thresholdLine = new QLineSeries;
    m_thresholdLine->setName(tr("Threshold"));
    m_thresholdLine->setPen(QPen(QColor(200, 40, 40), 1, Qt::DashDotLine));
    add(m_thresholdLine);
}

void DecisionCurveView::setThreshold(double threshold)
{
    if (!m_thresholdLine)
        return;
    m_thresholdLine->clear();
    m_thresholdLine->append(threshold, m_bottom);
    m_thresholdLine->append(threshold, m_top);
}

} // namespace plumbline
