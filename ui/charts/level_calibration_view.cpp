#include "charts/level_calibration_view.hpp"

#include "charts/chart_style.hpp"
#include "charts/model_palette.hpp"

#include <QChart>
#include <QLegend>
#include <QLineSeries>
#include <QPen>
#include <QValueAxis>

#include <algorithm>

namespace plumbline {

LevelCalibrationView::LevelCalibrationView(QWidget* parent)
    : ExportableChartView(parent)
{
    auto* chart = new QChart;
    styleChart(chart, tr("Calibration by level"));
    chart->legend()->setAlignment(Qt::AlignRight);
    setChart(chart);
    // Not held square: the level names beside the plot need the room more than the 45° line does.
    setMinimumSize(240, 180);
    setObjectName(QStringLiteral("calibration-by-level"));
    setAccessibleName(tr("Calibration curves by subgroup level"));
}

void LevelCalibrationView::setCurves(const std::vector<LevelCurve>& levels)
{
    QChart* c = chart();
    resetChart();
    if (levels.empty())
        return;
    // The axes end where the curves' predicted risks end (rounded up), as on the calibration tab.
    double maximum = 0.1;
    for (const auto& level : levels)
        for (const auto& p : level.curve)
            maximum = std::max(maximum, p.predicted);
    maximum = std::min(1.0, std::ceil(maximum * 10.0) / 10.0);
    auto* x = probabilityAxis(tr("Predicted risk"), maximum);
    auto* y = probabilityAxis(tr("Observed"), maximum);
    c->addAxis(x, Qt::AlignBottom);
    c->addAxis(y, Qt::AlignLeft);
    auto* ideal = new QLineSeries;
    ideal->setName(tr("Ideal"));
    ideal->append(0, 0);
    ideal->append(maximum, maximum);
    ideal->setPen(QPen(QColor(120, 120, 120), 1, Qt::DashLine));
    addOnAxes(c, ideal, x, y);
    // Each level in its own colour and dash pattern, so levels stay apart in grey print too.
    const Qt::PenStyle styles[] = {Qt::SolidLine, Qt::DashDotLine, Qt::DotLine, Qt::DashDotDotLine};
    for (std::size_t k = 0; k < levels.size(); ++k) {
        auto* line = new QLineSeries;
        const QString name = QString::fromStdString(levels[k].level);
        line->setName(levels[k].curve.empty() ? tr("%1 (too small or withheld)").arg(name) : name);
        for (const auto& p : levels[k].curve)
            line->append(p.predicted, std::clamp(p.observed, 0.0, maximum));
        line->setPen(QPen(modelColour(int(k)), 2, styles[k % 4]));
        addOnAxes(c, line, x, y);
    }
}

} // namespace plumbline
