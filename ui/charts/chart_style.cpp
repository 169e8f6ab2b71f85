#include "charts/chart_style.hpp"

#include <QAreaSeries>
#include <QCategoryAxis>
#include <QChart>
#include <QFont>
#include <QLegend>
#include <QLegendMarker>
#include <QValueAxis>

#include <algorithm>

#include <cmath>

namespace plumbline {

namespace {

QFont chartFont(int points)
{
    return QFont(QStringLiteral("DejaVu Sans"), points);
}

// The 1-2-5 step that gives about `wanted` intervals over `span`.
double niceStep(double span, int wanted)
{
    const double raw = span / std::max(1, wanted);
    const double magnitude = std::pow(10.0, std::floor(std::log10(raw)));
    for (const double factor : {1.0, 2.0, 2.5, 5.0, 10.0})
        if (factor * magnitude >= raw)
            return factor * magnitude;
    return 10.0 * magnitude;
}

int decimalsFor(double step)
{
    int decimals = 0;
    while (decimals < 6 && std::abs(step * std::pow(10.0, decimals) - std::round(step * std::pow(10.0, decimals))) > 1e-9)
        ++decimals;
    return decimals;
}

} // namespace

void styleChart(QChart* chart, const QString& title)
{
    QFont titleFont = chartFont(10);
    titleFont.setBold(true);
    chart->setTitleFont(titleFont);
    chart->setTitle(title);
    chart->setAnimationOptions(QChart::NoAnimation);
    chart->setBackgroundRoundness(0);
    chart->legend()->setFont(chartFont(8));
    chart->legend()->setAlignment(Qt::AlignBottom);
    // A line's entry is a short piece of that line (dashes and dots included), a point's a dot.
    chart->legend()->setMarkerShape(QLegend::MarkerShapeFromSeries);
    chart->setMargins(QMargins(4, 4, 4, 4));
}

QValueAxis* probabilityAxis(const QString& title, double maximum)
{
    auto* axis = new QValueAxis;
    axis->setRange(0.0, maximum);
    axis->setTitleText(title);
    // Ticks at round values (every 0.1, or 0.2 on longer axes) so labels never round a tick
    // such as 0.175 to "0.2".
    axis->setTickType(QValueAxis::TicksDynamic);
    axis->setTickAnchor(0.0);
    axis->setTickInterval(maximum > 0.6 ? 0.2 : 0.1);
    axis->setLabelFormat(QStringLiteral("%.1f"));
    axis->setTitleFont(chartFont(9));
    axis->setLabelsFont(chartFont(8));
    return axis;
}

QValueAxis* roundAxis(const QString& title, double low, double high, int wantedTicks)
{
    if (!(high > low)) {
        low -= 0.5;
        high += 0.5;
    }
    const double step = niceStep(high - low, wantedTicks);
    auto* axis = new QValueAxis;
    axis->setRange(std::floor(low / step + 1e-9) * step, std::ceil(high / step - 1e-9) * step);
    axis->setTitleText(title);
    axis->setTickType(QValueAxis::TicksDynamic);
    axis->setTickAnchor(0.0);
    axis->setTickInterval(step);
    axis->setLabelFormat(QStringLiteral("%.%1f").arg(decimalsFor(step)));
    axis->setTitleFont(chartFont(9));
    axis->setLabelsFont(chartFont(8));
    return axis;
}

void clearChart(QChart* chart)
{
    chart->removeAllSeries();
    for (QAbstractAxis* axis : chart->axes()) {
        chart->removeAxis(axis);
        delete axis;
    }
}

void addOnAxes(QChart* chart, QAbstractSeries* series, QAbstractAxis* x, QAbstractAxis* y)
{
    chart->addSeries(series);
    series->attachAxis(x);
    series->attachAxis(y);
    // A band drawn without a border would show in the legend as an empty square: its marker
    // takes the band's own fill, made opaque enough to see.
    if (auto* area = qobject_cast<QAreaSeries*>(series))
        for (QLegendMarker* marker : chart->legend()->markers(area)) {
            QColor fill = area->color();
            fill.setAlpha(std::max(fill.alpha(), 110));
            marker->setBrush(fill);
            marker->setPen(QPen(fill.darker(115)));
            marker->setShape(QLegend::MarkerShapeRectangle);
        }
}

QPen thresholdPen()
{
    return QPen(QColor(200, 40, 40), 1.2, Qt::DashLine);
}

QString thresholdName(double threshold)
{
    return QObject::tr("Threshold %1").arg(threshold, 0, 'f', 3);
}

QCategoryAxis* periodAxis(const std::vector<std::string>& periods)
{
    auto* x = new QCategoryAxis;
    x->setLabelsPosition(QCategoryAxis::AxisLabelsPositionOnValue);
    x->setLabelsFont(QFont(QStringLiteral("DejaVu Sans"), 8));
    x->setTitleFont(QFont(QStringLiteral("DejaVu Sans"), 9));
    x->setTitleText(QObject::tr("Period"));
    x->setRange(-0.5, double(periods.size()) - 0.5);
    std::size_t step = 12;
    for (const std::size_t candidate : {1, 2, 3, 6, 12})
        if (periods.size() <= candidate * 5) {
            step = candidate;
            break;
        }
    for (std::size_t k = 0; k < periods.size(); k += step)
        x->append(QString::fromStdString(periods[k]), double(k));
    return x;
}

} // namespace plumbline
