#include "report/report_charts.hpp"

#include "charts/calibration_chart_view.hpp"
#include "charts/decision_curve_view.hpp"
#include "charts/funnel_chart_view.hpp"
#include "charts/forest_chart_view.hpp"
#include "charts/level_calibration_view.hpp"
#include "charts/monitoring_path_view.hpp"
#include "charts/period_chart_view.hpp"
#include "panels/monitoring_panel.hpp"
#include "panels/period_panel.hpp"
#include "panels/site_pooling_panel.hpp"
#include "charts/site_forest_view.hpp"
#include "panels/subgroup_panel.hpp"
#include "charts/roc_chart_view.hpp"

#include <QComboBox>
#include <QCoreApplication>
#include <QEvent>
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
    , m_sites(std::make_unique<SitePoolingPanel>())
    , m_monitoring(std::make_unique<MonitoringPanel>())
{
    m_roc->setSnapshot(snapshot);
    m_calibration->setSnapshot(snapshot);
    m_decision->setSnapshot(snapshot);
    m_subgroups->setSnapshot(snapshot);
    m_periods->setSnapshot(snapshot);
    m_sites->setSnapshot(snapshot);
    m_monitoring->setSnapshot(snapshot);
    m_threshold = threshold.value_or(snapshot ? snapshot->request.panel.decisionThreshold : PanelSettings{}.decisionThreshold);
    m_roc->setThreshold(m_threshold);
    m_calibration->setThreshold(m_threshold);
    m_decision->setThreshold(m_threshold);
}

ExportableChartView* ReportCharts::view(const ReportChartRef& chart) const
{
    // Qt Charts deletes the old axes' drawing items later: without letting it, a chart drawn
    // again for another column keeps the previous column's labels.
    auto settled = [](ExportableChartView* v) {
        QCoreApplication::sendPostedEvents(nullptr, QEvent::DeferredDelete);
        return v;
    };
    auto subgroup = [&](auto* v) -> ExportableChartView* {
        m_subgroups->picker()->setCurrentIndex(chart.choice);
        return settled(v);
    };
    auto overTime = [&](auto* v) -> ExportableChartView* {
        m_periods->modelPicker()->setCurrentIndex(chart.choice);
        return settled(v);
    };
    auto sites = [&](auto* v) -> ExportableChartView* {
        m_sites->modelPicker()->setCurrentIndex(chart.choice);
        return settled(v);
    };
    auto monitoring = [&](auto* v) -> ExportableChartView* {
        m_monitoring->scopePicker()->setCurrentIndex(0); // the whole cohort
        m_monitoring->modelPicker()->setCurrentIndex(chart.choice);
        return settled(v);
    };
    switch (chart.kind) {
    case ReportChart::Roc: return m_roc.get();
    case ReportChart::Calibration: return m_calibration.get();
    case ReportChart::DecisionCurve: return m_decision.get();
    case ReportChart::SubgroupC: return subgroup(m_subgroups->cChart());
    case ReportChart::SubgroupOe: return subgroup(m_subgroups->oeChart());
    case ReportChart::SubgroupSlope: return subgroup(m_subgroups->slopeChart());
    case ReportChart::SubgroupCalibration: return subgroup(m_subgroups->levelCalibrationChart());
    case ReportChart::SubgroupFunnel: return subgroup(m_subgroups->funnelChart());
    case ReportChart::OverTimeC: return overTime(m_periods->cChart());
    case ReportChart::OverTimeOe: return overTime(m_periods->oeChart());
    case ReportChart::SiteC: return sites(m_sites->cChart());
    case ReportChart::SiteOe: return sites(m_sites->oeChart());
    case ReportChart::SiteSlope: return sites(m_sites->slopeChart());
    case ReportChart::MonitoringExpectedMinusObserved: return monitoring(m_monitoring->expectedMinusObservedChart());
    case ReportChart::MonitoringWorse: return monitoring(m_monitoring->worseChart());
    case ReportChart::MonitoringBetter: return monitoring(m_monitoring->betterChart());
    }
    return m_roc.get();
}

QString ReportCharts::caption(const ReportChartRef& chart) const
{
    const QString t = QString::number(m_threshold, 'f', 2);
    // "hospital - supplier_score": the column and model the subgroup chart shows.
    const QString subgroup = chart.choice < m_subgroups->picker()->count()
        ? m_subgroups->picker()->itemText(chart.choice).replace(QStringLiteral(" — "), QStringLiteral(", model "))
        : QString();
    const QString model = m_snapshot && chart.choice < int(m_snapshot->validation.models.size())
        ? QString::fromStdString(m_snapshot->validation.models[std::size_t(chart.choice)].name) : QString();
    const QString withheld = QStringLiteral(" A level without a value is too small to estimate or withheld by the small-cell rule "
                                            "(section 8).");
    switch (chart.kind) {
    case ReportChart::Roc: return QStringLiteral("ROC curve of each model; the dots mark the decision threshold %1.").arg(t);
    case ReportChart::Calibration:
        return QStringLiteral("Observed against predicted risk: smoothed curve and risk groups with intervals; the line marks "
                              "the decision threshold %1. Risk groups whose counts are suppressed are not drawn.").arg(t);
    case ReportChart::DecisionCurve:
        return QStringLiteral("Net benefit by threshold against treating everyone and no one; the line marks the decision "
                              "threshold %1. Thresholds where a count behind the net benefit is suppressed are left out.").arg(t);
    case ReportChart::SubgroupC:
        return QStringLiteral("C statistic per level (%1) with intervals; the dashed line is the whole cohort's.").arg(subgroup) + withheld;
    case ReportChart::SubgroupOe:
        return QStringLiteral("Observed / expected per level (%1) with intervals; 1 is ideal, the dashed line is the whole "
                              "cohort's.").arg(subgroup) + withheld;
    case ReportChart::SubgroupSlope:
        return QStringLiteral("Calibration slope per level (%1) with intervals; 1 is ideal, the dashed line is the whole "
                              "cohort's.").arg(subgroup) + withheld;
    case ReportChart::SubgroupCalibration:
        return QStringLiteral("Smoothed calibration curve of each level (%1); the dashed diagonal is perfect calibration.").arg(subgroup)
            + withheld;
    case ReportChart::SubgroupFunnel:
        return QStringLiteral("O/E per level (%1) against expected events, with 95 % and 99.8 % control limits around O/E = 1: "
                              "a model miscalibrated overall puts every level outside them, so read it after calibration.").arg(subgroup);
    case ReportChart::OverTimeC:
        return QStringLiteral("C statistic by period for %1, oldest first; the band is the first year's interval.").arg(model);
    case ReportChart::OverTimeOe:
        return QStringLiteral("O/E by period for %1, oldest first; the band is the first year's interval. Periods whose counts "
                              "are suppressed are drawn without a value.").arg(model);
    case ReportChart::SiteC:
    case ReportChart::SiteOe:
    case ReportChart::SiteSlope: {
        const QString measure = chart.kind == ReportChart::SiteC ? QStringLiteral("C statistic")
            : chart.kind == ReportChart::SiteOe                  ? QStringLiteral("Observed / expected (1 is ideal)")
                                                                 : QStringLiteral("Calibration slope (1 is ideal)");
        const QString siteModel = m_snapshot && m_snapshot->validation.sites && chart.choice < int(m_snapshot->validation.sites->models.size())
            ? QString::fromStdString(m_snapshot->validation.sites->models[std::size_t(chart.choice)].model) : QString();
        return QStringLiteral("%1 per site for %2 with intervals; the diamond spans the pooled value's HKSJ interval and the bar "
                              "beneath it the prediction interval for a new site. Sites below the small-cell rule are not drawn.")
            .arg(measure, siteModel);
    }
    case ReportChart::MonitoringExpectedMinusObserved:
        return QStringLiteral("Cumulative expected minus observed events for %1, all patients in date order; above zero, fewer "
                              "events than predicted.").arg(model);
    case ReportChart::MonitoringWorse:
        return QStringLiteral("CUSUM watching for worse outcomes than %1 predicts (odds ratio above 1), all patients; the dashed "
                              "line is the control limit h, squares mark signals, after which the chart restarts.").arg(model);
    case ReportChart::MonitoringBetter:
        return QStringLiteral("CUSUM watching for better outcomes than %1 predicts (odds ratio below 1), all patients; the dashed "
                              "line is the control limit h, squares mark signals, after which the chart restarts.").arg(model);
    }
    return {};
}

ReportCharts::~ReportCharts() = default;

double ReportCharts::markedThreshold() const
{
    return m_calibration->thresholdLineX();
}

void ReportCharts::draw(const ReportChartRef& chart, QPainter* painter, const QRectF& target)
{
    view(chart)->renderInto(painter, target, logicalSize());
}

QByteArray ReportCharts::svg(const ReportChartRef& chart)
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
