#include "report_charts.hpp"

#include "calibration_chart_view.hpp"
#include "decision_curve_view.hpp"
#include "funnel_chart_view.hpp"
#include "forest_chart_view.hpp"
#include "period_chart_view.hpp"
#include "period_panel.hpp"
#include "subgroup_panel.hpp"
#include "roc_chart_view.hpp"

#include <QComboBox>
#include <QDir>

#include <utility>

namespace plumbline {

ReportCharts::ReportCharts(const SnapshotPointer& snapshot, std::optional<double> threshold)
    : m_snapshot(snapshot)
    , m_roc(std::make_unique<RocChartView>())
    , m_calibration(std::make_unique<CalibrationChartView>())
    , m_decision(std::make_unique<DecisionCurveView>())
    , m_subgroups(std::make_unique<SubgroupPanel>())
    , m_periods(std::make_unique<PeriodPanel>())
{
    m_roc->setSnapshot(snapshot);
    m_calibration->setSnapshot(snapshot);
    m_decision->setSnapshot(snapshot);
    m_subgroups->setSnapshot(snapshot);
    m_periods->setSnapshot(snapshot);
    m_threshold = threshold.value_or(snapshot ? snapshot->request.panel.decisionThreshold : PanelSettings{}.decisionThreshold);
    m_roc->setThreshold(m_threshold);
    m_calibration->setThreshold(m_threshold);
    m_decision->setThreshold(m_threshold);
}

ExportableChartView* ReportCharts::view(ReportChart chart) const
{
    switch (chart) {
    case ReportChart::Roc: return m_roc.get();
    case ReportChart::Calibration: return m_calibration.get();
    case ReportChart::DecisionCurve: return m_decision.get();
    case ReportChart::SubgroupSlope: return m_subgroups->slopeChart();
    case ReportChart::SubgroupFunnel: return m_subgroups->funnelChart();
    case ReportChart::OverTime: return m_periods->oeChart();
    }
    return m_roc.get();
}

QString ReportCharts::caption(ReportChart chart) const
{
    const QString t = QString::number(m_threshold, 'f', 2);
    const QString subgroup = m_subgroups->picker()->count() > 0 ? m_subgroups->picker()->itemText(0) : QString();
    const QString model = m_snapshot && !m_snapshot->validation.models.empty()
        ? QString::fromStdString(m_snapshot->validation.models.front().name) : QString();
    switch (chart) {
    case ReportChart::Roc: return QStringLiteral("ROC curve of each model; the dots mark the decision threshold %1.").arg(t);
    case ReportChart::Calibration:
        return QStringLiteral("Observed against predicted risk: smoothed curve, risk groups with intervals and the risk "
                              "distribution beneath; the line marks the decision threshold %1.").arg(t);
    case ReportChart::DecisionCurve:
        return QStringLiteral("Net benefit by threshold against treating everyone and no one; the line marks the decision "
                              "threshold %1.").arg(t);
    case ReportChart::SubgroupSlope:
        return QStringLiteral("Calibration slope per level (%1) with intervals; 1 is ideal, the band is the whole cohort's.").arg(subgroup);
    case ReportChart::SubgroupFunnel:
        return QStringLiteral("O/E per level (%1) against expected events, with 95 % and 99.8 % control limits.").arg(subgroup);
    case ReportChart::OverTime:
        return QStringLiteral("O/E by period for %1, oldest first; the band is the first year's interval.").arg(model);
    }
    return {};
}

ReportCharts::~ReportCharts() = default;

double ReportCharts::markedThreshold() const
{
    return m_calibration->thresholdLineX();
}

void ReportCharts::draw(ReportChart chart, QPainter* painter, const QRectF& target)
{
    view(chart)->renderInto(painter, target, logicalSize());
}

QByteArray ReportCharts::svg(ReportChart chart)
{
    return view(chart)->svg(logicalSize());
}

bool ReportCharts::exportAll(const QString& folder, QString* error)
{
    if (!QDir().mkpath(folder)) {
        if (error)
            *error = QStringLiteral("the folder %1 cannot be created").arg(folder);
        return false;
    }
    const QSize size(900, 700);
    for (const auto& [view, name] : {std::pair<ExportableChartView*, QString>{m_roc.get(), QStringLiteral("roc")},
                                     std::pair<ExportableChartView*, QString>{m_calibration.get(), QStringLiteral("calibration")}})
        for (const QString& suffix : {QStringLiteral(".png"), QStringLiteral(".svg")})
            if (!view->exportTo(QDir(folder).filePath(name + suffix), size, error))
                return false;
    return true;
}

} // namespace plumbline
