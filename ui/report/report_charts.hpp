#pragma once

#include "run/analysis_snapshot.hpp"
#include "report/report_document.hpp"

#include <QByteArray>
#include <QRectF>
#include <QString>
#include <QSize>

#include <memory>
#include <optional>

class QPainter;

namespace plumbline {

class CalibrationChartView;
class DecisionCurveView;
class ExportableChartView;
class PeriodPanel;
class SitePoolingPanel;
class MonitoringPanel;
class RocChartView;
class SubgroupPanel;

// The report's charts, built from the snapshot with the window's own chart classes so that a
// report and the window draw the same thing. Needs a QApplication (Qt Charts are widgets).
class ReportCharts {
public:
    // The charts mark `threshold` (the window's current one); without it, the analysis's
    // decision threshold.
    explicit ReportCharts(const SnapshotPointer& snapshot, std::optional<double> threshold = std::nullopt);
    ~ReportCharts();

    // The threshold the charts mark (read back from the calibration plot's line).
    double markedThreshold() const;
    // Drawn at this size and scaled to the page's text width (about 170 mm), Qt's default chart
    // fonts print at about 8 pt.
    static QSize logicalSize() { return {620, 380}; }
    void draw(const ReportChartRef& chart, QPainter* painter, const QRectF& target);
    QByteArray svg(const ReportChartRef& chart);
    // What the chart shows (which column and model) and the threshold it marks, printed under it.
    QString caption(const ReportChartRef& chart) const;
    // roc.png, roc.svg, calibration.png, calibration.svg into a folder (created if needed).
    bool exportAll(const QString& folder, QString* error);

private:
    // The view showing the chart, switched to its column and model.
    ExportableChartView* view(const ReportChartRef& chart) const;

    SnapshotPointer m_snapshot;
    double m_threshold = 0.2;
    std::unique_ptr<RocChartView> m_roc;
    std::unique_ptr<CalibrationChartView> m_calibration;
    std::unique_ptr<DecisionCurveView> m_decision;
    std::unique_ptr<SubgroupPanel> m_subgroups;
    std::unique_ptr<PeriodPanel> m_periods;
    std::unique_ptr<SitePoolingPanel> m_sites;
    std::unique_ptr<MonitoringPanel> m_monitoring;
};

} // namespace plumbline
