#pragma once

#include <QString>

class QChart;
class QValueAxis;

namespace plumbline {

// Shared look of the charts: explicit fonts (so SVG exports name a real family), no animation,
// a plain background, and 0-1 axes with titles.
void styleChart(QChart* chart, const QString& title);
QValueAxis* probabilityAxis(const QString& title, double maximum = 1.0);

} // namespace plumbline
