#pragma once

#include <QString>

class QAbstractAxis;
class QAbstractSeries;
class QChart;
class QValueAxis;

namespace plumbline {

// Shared look of the charts: explicit fonts (so SVG exports name a real family), no animation,
// a plain background, and 0-1 axes with titles.
void styleChart(QChart* chart, const QString& title);
QValueAxis* probabilityAxis(const QString& title, double maximum = 1.0);
// Removes every series and axis, before a chart is drawn again for a new snapshot.
void clearChart(QChart* chart);
// Adds a series to the chart on the given axes.
void addOnAxes(QChart* chart, QAbstractSeries* series, QAbstractAxis* x, QAbstractAxis* y);

} // namespace plumbline
