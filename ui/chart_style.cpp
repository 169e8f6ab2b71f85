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
    axis->setLabelFormat(QStringLiteral("%.1f"));
    axis->setTickCount(maximum >= 0.99 ? 6 : 5);
    axis->setTitleFont(QFont(QStringLiteral("DejaVu Sans"), 9));
    axis->setLabelsFont(QFont(QStringLiteral("DejaVu Sans"), 8));
    return axis;
}

} // namespace plumbline
