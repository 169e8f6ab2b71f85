#pragma once

#include <QPen>
#include <QString>

#include <string>
#include <vector>

class QAbstractAxis;
class QAbstractSeries;
class QCategoryAxis;
class QChart;
class QValueAxis;

namespace plumbline {

// Shared look of the charts: explicit fonts (so SVG exports name a real family), no animation,
// a plain background, and 0-1 axes with titles.
void styleChart(QChart* chart, const QString& title);
QValueAxis* probabilityAxis(const QString& title, double maximum = 1.0);
// A value axis over [low, high] widened to round numbers, with ticks at a 1-2-5 step anchored
// at zero, so that no tick reads 0.175 as "0.2".
QValueAxis* roundAxis(const QString& title, double low, double high, int wantedTicks = 5);
// The periods ("2025-03", "2025-Q1") left to right at 0, 1, 2…, labelled every 1, 2, 3, 6 or
// 12 periods so that none is elided.
QCategoryAxis* periodAxis(const std::vector<std::string>& periods);
// Removes every series and axis, before a chart is drawn again for a new snapshot.
void clearChart(QChart* chart);
// Adds a series to the chart on the given axes.
void addOnAxes(QChart* chart, QAbstractSeries* series, QAbstractAxis* x, QAbstractAxis* y);
// The shared decision threshold's line: one style on every chart.
QPen thresholdPen();
// The legend's name of that line.
QString thresholdName(double threshold);

} // namespace plumbline
