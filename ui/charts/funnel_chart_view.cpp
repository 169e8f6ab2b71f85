#include "charts/funnel_chart_view.hpp"

#include "charts/chart_style.hpp"
#include "charts/model_palette.hpp"
#include "reporting/value_text.hpp"

#include <QChart>
#include <QGraphicsSimpleTextItem>
#include <QLegend>
#include <QLineSeries>
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
    chart->legend()->setAlignment(Qt::AlignRight);
    setChart(chart);
    setMinimumSize(240, 180);
    setObjectName(QStringLiteral("funnel"));
    setAccessibleName(tr("Funnel chart"));
    // The names follow their points when the chart is resized or laid out for an export.
    connect(chart, &QChart::plotAreaChanged, this, [this] { placeLabels(); });
}

void FunnelChartView::setFunnel(const std::vector<FunnelPoint>& points, const FunnelLimits* limits, int modelIndex)
{
    QChart* c = chart();
    resetChart();
    qDeleteAll(m_labels);
    m_labels.clear();
    m_points.clear();
    if (points.empty() || !limits || limits->expected.empty())
        return;
    double low = 1.0, high = 1.0;
    for (const auto& p : points) {
        low = std::min(low, p.oe);
        high = std::max(high, p.oe);
    }
    low = std::min(low, limits->lower998.front());
    high = std::max(high, limits->upper998.front());
    auto* x = roundAxis(tr("Expected events"), limits->expected.front(), limits->expected.back(), 5);
    auto* y = roundAxis(tr("O/E"), std::max(0.0, low - 0.05), high + 0.05, 5);
    c->addAxis(x, Qt::AlignBottom);
    c->addAxis(y, Qt::AlignLeft);
    auto add = [&](QAbstractSeries* series) { addOnAxes(c, series, x, y); };
    // The two pairs of limits differ in style and each has its legend entry.
    const QPen limit95(QColor(70, 70, 70), 1.3, Qt::DashLine), limit998(QColor(70, 70, 70), 1.3, Qt::DotLine);
    auto curve = [&](const std::vector<double>& values, const QString& name, const QPen& pen) {
        auto* line = new QLineSeries;
        line->setName(name);
        for (std::size_t k = 0; k < values.size(); ++k)
            line->append(limits->expected[k], values[k]);
        line->setPen(pen);
        add(line);
        if (name.isEmpty())
            keepOutOfLegend(line);
    };
    curve(limits->upper95, tr("95 % limits"), limit95);
    curve(limits->lower95, QString(), limit95);
    curve(limits->upper998, tr("99.8 % limits"), limit998);
    curve(limits->lower998, QString(), limit998);
    curve(std::vector<double>(limits->expected.size(), 1.0), tr("O/E = 1"), QPen(QColor(150, 150, 150), 1));
    auto* dots = new QScatterSeries;
    dots->setName(tr("Levels"));
    dots->setMarkerSize(9);
    dots->setColor(modelColour(modelIndex));
    dots->setBorderColor(Qt::white);
    for (const auto& p : points)
        dots->append(p.expected, p.oe);
    add(dots);
    m_points = points;
    connect(dots, &QScatterSeries::hovered, this, [this](const QPointF& at, bool state) {
        if (!state)
            hideValueTip();
        for (const auto& p : m_points)
            if (state && p.expected == at.x() && p.oe == at.y())
                showValueTip(tr("%1: O/E %2, %3 observed, %4 expected")
                                 .arg(QString::fromStdString(p.level), QString::fromStdString(fixedText(p.oe, 2)))
                                 .arg(QString::fromStdString(fixedText(p.observed, 0)))
                                 .arg(QString::fromStdString(fixedText(p.expected, 1))));
    });
    placeLabels();
}

// Each point's name beside it: right of the point where there is room, else left, above or
// below, so that names of sites with similar numbers do not overwrite each other.
void FunnelChartView::placeLabels()
{
    qDeleteAll(m_labels);
    m_labels.clear();
    QChart* c = chart();
    const QRectF plot = c->plotArea();
    std::vector<QRectF> taken; // the points themselves first: a name never covers a point
    for (const auto& p : m_points)
        taken.emplace_back(c->mapToPosition(QPointF(p.expected, p.oe)) - QPointF(6, 6), QSizeF(12, 12));
    for (const auto& p : m_points) {
        auto* label = new QGraphicsSimpleTextItem(QString::fromStdString(p.level), c);
        label->setFont(QFont(QStringLiteral("DejaVu Sans"), 8));
        label->setBrush(QColor(40, 40, 40));
        const QPointF at = c->mapToPosition(QPointF(p.expected, p.oe));
        const QSizeF size = label->boundingRect().size();
        const QPointF offsets[] = {{7, -size.height() / 2}, {-7 - size.width(), -size.height() / 2}, {-size.width() / 2, -6 - size.height()},
                                   {-size.width() / 2, 6}, {7, -size.height() - 4}, {7, 4}, {-7 - size.width(), -size.height() - 4},
                                   {-7 - size.width(), 4}};
        QRectF chosen(at + offsets[0], size);
        for (const QPointF& offset : offsets) {
            const QRectF candidate(at + offset, size);
            const bool free = std::none_of(taken.begin(), taken.end(), [&](const QRectF& r) { return r.intersects(candidate); });
            if (free && plot.adjusted(-4, -4, 4, 4).contains(candidate)) {
                chosen = candidate;
                break;
            }
        }
        label->setPos(chosen.topLeft());
        taken.push_back(chosen);
        m_labels.push_back(label);
    }
}

} // namespace plumbline
