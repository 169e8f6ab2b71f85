#include "chart_style.hpp"

#include <QChart>
#include <QFont>
#include <QValueAxis>

namespace plumbline {

void styleChart(QChart* chart, const QString& title)
{
    QFont titleFont(QStringLiteral("DejaVu Sans"), 11);
    titleFont.setBold(true);
    chart->setTitleFont(titleFont);
    chart->setTitle(title);
    chart->setAnimationOptions(QChart::NoAnimation);
    chart->setBackgroundRoundness(0);
    chart->legend()->setFont(QFont(QStringLiteral("DejaVu Sans"), 9));
    chart->legend()->setAlignment(Qt::AlignBottom);
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
    axis->setTitleFont(QFont(QStringLiteral("DejaVu Sans"), 9));
    axis->setLabelsFont(QFont(QStringLiteral("DejaVu Sans"), 8));
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
}

} // namespace plumbline
