#include "charts/decision_curve_view.hpp"

#include "charts/chart_style.hpp"
#include "charts/model_palette.hpp"
#include "reporting/value_text.hpp"

#include <QAreaSeries>
#include <QChart>
#include <QLineSeries>
#include <QPen>
#include <QValueAxis>

#include <algorithm>
#include <cmath>

namespace plumbline {

namespace {

QString text(double value, int digits)
{
    return QString::fromStdString(fixedText(value, digits));
}

// The decision-curve point nearest to a hovered threshold.
QString curveTip(const ModelValidation& model, double threshold)
{
    const auto& curve = model.decisionCurve;
    const auto nearest = std::min_element(curve.begin(), curve.end(), [&](const auto& a, const auto& b) {
        return std::abs(a.threshold - threshold) < std::abs(b.threshold - threshold);
    });
    if (nearest == curve.end())
        return {};
    return QObject::tr("%1 at threshold %2\nnet benefit %3 (treat all %4), standardised %5")
        .arg(QString::fromStdString(model.name), text(nearest->threshold, 2), text(nearest->netBenefit, 4),
             text(nearest->treatAll, 4), text(nearest->standardized, 3));
}

} // namespace

DecisionCurveView::DecisionCurveView(QWidget* parent)
    : ExportableChartView(parent)
{
    auto* chart = new QChart;
    styleChart(chart, tr("Decision curve: net benefit by threshold"));
    chart->legend()->setAlignment(Qt::AlignRight);
    setChart(chart);
    setMinimumSize(320, 240);
    setObjectName(QStringLiteral("decision-curve"));
    setAccessibleName(tr("Decision curve"));
}

void DecisionCurveView::setSnapshot(SnapshotPointer snapshot)
{
    m_snapshot = std::move(snapshot);
    QChart* c = chart();
    resetChart();
    m_series.clear();
    m_thresholdLine = nullptr;
    if (!m_snapshot || m_snapshot->validation.models.empty() || m_snapshot->validation.models.front().decisionCurve.empty())
        return;
    const auto& models = m_snapshot->validation.models;
    const auto& grid = models.front().decisionCurve;
    double top = 0.0;
    for (const auto& m : models)
        for (const auto& p : m.decisionCurve)
            top = std::max({top, p.netBenefit, p.treatAll, p.upper.value_or(0.0)});
    top = top > 0.0 ? top * 1.1 : 0.05;
    auto* x = probabilityAxis(tr("Threshold probability"), grid.back().threshold);
    x->setMin(grid.front().threshold);
    auto* y = roundAxis(tr("Net benefit"), -0.25 * top, top);
    m_bottom = y->min();
    m_top = y->max();
    c->addAxis(x, Qt::AlignBottom);
    c->addAxis(y, Qt::AlignLeft);
    auto add = [&](QAbstractSeries* series) { addOnAxes(c, series, x, y); };
    for (std::size_t m = 0; m < models.size(); ++m) {
        const auto& curve = models[m].decisionCurve;
        ModelSeries s;
        if (curve.front().lower) {
            auto* lower = new QLineSeries;
            auto* upper = new QLineSeries;
            for (const auto& p : curve) {
                lower->append(p.threshold, std::clamp(p.lower.value_or(p.netBenefit), m_bottom, m_top));
                upper->append(p.threshold, std::clamp(p.upper.value_or(p.netBenefit), m_bottom, m_top));
            }
            s.band = new QAreaSeries(upper, lower);
            upper->setParent(s.band); // the area series does not own its boundary lines
            lower->setParent(s.band);
            s.band->setName(tr("%1 (bootstrap band)").arg(QString::fromStdString(models[m].name)));
            s.band->setColor(bandColour(int(m)));
            s.band->setBorderColor(Qt::transparent);
            add(s.band);
        }
        s.curve = new QLineSeries;
        s.curve->setName(QString::fromStdString(models[m].name));
        for (const auto& p : curve)
            s.curve->append(p.threshold, std::clamp(p.netBenefit, m_bottom, m_top));
        s.curve->setPen(QPen(modelColour(int(m)), 2));
        add(s.curve);
        connect(s.curve, &QLineSeries::hovered, this, [this, m](const QPointF& point, bool state) {
            if (state && m_snapshot)
                showValueTip(curveTip(m_snapshot->validation.models[m], point.x()));
            else
                hideValueTip();
        });
        m_series.push_back(s);
    }
    auto* all = new QLineSeries;
    all->setName(tr("Treat all"));
    // Down to the axis' edge: the last segment ends where treat-all crosses the bottom.
    for (std::size_t k = 0; k < grid.size(); ++k) {
        const auto& p = grid[k];
        if (p.treatAll >= m_bottom) {
            all->append(p.threshold, p.treatAll);
        } else {
            if (k > 0 && grid[k - 1].treatAll > m_bottom) {
                const auto& q = grid[k - 1];
                const double share = (q.treatAll - m_bottom) / (q.treatAll - p.treatAll);
                all->append(q.threshold + share * (p.threshold - q.threshold), m_bottom);
            }
            break;
        }
    }
    all->setPen(QPen(QColor(90, 90, 90), 1.5, Qt::DashLine));
    add(all);
    auto* none = new QLineSeries;
    none->setName(tr("Treat none"));
    none->append(grid.front().threshold, 0.0);
    none->append(grid.back().threshold, 0.0);
    none->setPen(QPen(QColor(90, 90, 90), 1.5, Qt::DotLine));
    add(none);
    m_thresholdLine = new QLineSeries;
    m_thresholdLine->setPen(thresholdPen());
    add(m_thresholdLine);
    setThreshold(m_threshold);
}

void DecisionCurveView::setThreshold(double threshold)
{
    m_threshold = threshold;
    if (!m_thresholdLine)
        return;
    m_thresholdLine->replace(QList<QPointF>{QPointF(threshold, m_bottom), QPointF(threshold, m_top)});
    m_thresholdLine->setName(thresholdName(threshold));
}

void DecisionCurveView::setModelVisible(int model, bool visible)
{
    if (model < 0 || model >= static_cast<int>(m_series.size()))
        return;
    setSeriesVisible(m_series[std::size_t(model)].curve, visible);
    setSeriesVisible(m_series[std::size_t(model)].band, visible);
}

double DecisionCurveView::thresholdLineX() const
{
    return m_thresholdLine && m_thresholdLine->count() > 0 ? m_thresholdLine->at(0).x() : -1.0;
}

} // namespace plumbline
