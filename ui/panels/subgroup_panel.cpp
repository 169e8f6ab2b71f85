#include "panels/subgroup_panel.hpp"

#include "charts/level_calibration_view.hpp"

#include "charts/forest_chart_view.hpp"
#include "charts/funnel_chart_view.hpp"
#include "metrics/metric_reading.hpp"
#include "reporting/value_text.hpp"

#include <QComboBox>
#include <QHBoxLayout>
#include <QLabel>
#include <QScrollArea>
#include <QSplitter>
#include <QVBoxLayout>

namespace plumbline {

SubgroupPanel::SubgroupPanel(QWidget* parent)
    : QWidget(parent)
    , m_picker(new QComboBox)
    , m_c(new ForestChartView(tr("C statistic by level"), tr("C statistic")))
    , m_oe(new ForestChartView(tr("Observed / expected by level"), tr("O/E")))
    , m_slope(new ForestChartView(tr("Calibration slope by level"), tr("Calibration slope")))
    , m_levels(new LevelCalibrationView)
    , m_funnel(new FunnelChartView)
    , m_rows(new QSplitter(Qt::Vertical))
    , m_top(new QSplitter(Qt::Horizontal))
    , m_bottom(new QSplitter(Qt::Horizontal))
    , m_summary(new QLabel)
{
    m_picker->setAccessibleName(tr("Subgroup column and model"));
    m_picker->setSizeAdjustPolicy(QComboBox::AdjustToContents);
    m_summary->setWordWrap(true);
    m_summary->setTextInteractionFlags(Qt::TextSelectableByMouse);
    m_summary->setAlignment(Qt::AlignTop | Qt::AlignLeft);
    auto* top = new QHBoxLayout;
    auto* pickerLabel = new QLabel(tr("Sub&group column and model:"));
    pickerLabel->setBuddy(m_picker);
    top->addWidget(pickerLabel);
    top->addWidget(m_picker);
    top->addStretch(1);
    // The three forests (narrow charts) above; the curves by level and the funnel, which need
    // room for their legends and labels, below.
    m_top->addWidget(m_c);
    m_top->addWidget(m_oe);
    m_top->addWidget(m_slope);
    m_bottom->addWidget(m_levels);
    m_bottom->addWidget(m_funnel);
    m_rows->addWidget(m_top);
    m_rows->addWidget(m_bottom);
    // The summary scrolls when the tab is short, so the charts keep their room.
    auto* summaryArea = new QScrollArea;
    summaryArea->setWidget(m_summary);
    summaryArea->setWidgetResizable(true);
    summaryArea->setFrameShape(QFrame::NoFrame);
    summaryArea->setMinimumHeight(40);
    summaryArea->setMaximumHeight(110);
    auto* layout = new QVBoxLayout(this);
    layout->setContentsMargins(4, 4, 4, 4);
    layout->addLayout(top);
    layout->addWidget(m_rows, 1);
    layout->addWidget(summaryArea);
    connect(m_picker, &QComboBox::currentIndexChanged, this, &SubgroupPanel::showChoice);
    setSnapshot(nullptr);
}

void SubgroupPanel::setSnapshot(SnapshotPointer snapshot)
{
    m_snapshot = std::move(snapshot);
    const QSignalBlocker block(m_picker);
    m_picker->clear();
    if (m_snapshot && m_snapshot->validation.subgroups)
        for (const auto& column : m_snapshot->cohort ? m_snapshot->cohort->groups : std::vector<CategoricalColumn>{})
            for (std::size_t m = 0; m < m_snapshot->validation.models.size(); ++m)
                m_picker->addItem(QStringLiteral("%1 — %2").arg(QString::fromStdString(column.name),
                                                               QString::fromStdString(m_snapshot->validation.models[m].name)),
                                  QStringList{QString::fromStdString(column.name), QString::number(m)});
    m_picker->setEnabled(m_picker->count() > 0);
    showChoice(m_picker->currentIndex());
}

void SubgroupPanel::resetLayout()
{
    const int half = std::max(1, m_rows->height() / 2), across = std::max(1, m_top->width() / 2);
    const int third = std::max(1, m_top->width() / 3);
    m_rows->setSizes({half, half});
    m_top->setSizes({third, third, third});
    m_bottom->setSizes({across, across});
}

QString SubgroupPanel::summaryText() const
{
    return m_summary->text();
}

void SubgroupPanel::showChoice(int index)
{
    if (index < 0 || !m_snapshot || !m_snapshot->validation.subgroups) {
        for (ForestChartView* chart : {m_c, m_oe, m_slope})
            chart->setRows({}, Estimate::undefined(), std::nullopt, 0);
        m_levels->setCurves({});
        m_funnel->setFunnel({}, nullptr, 0);
        m_summary->setText(tr("No subgroup column was chosen. Choose one or more in File → Open (Subgroup columns), "
                              "or give --group on the command line."));
        return;
    }
    const QStringList choice = m_picker->itemData(index).toStringList();
    const std::string column = choice.at(0).toStdString();
    const int modelIndex = choice.at(1).toInt();
    const ModelValidation& model = m_snapshot->validation.models[std::size_t(modelIndex)];
    const SubgroupAnalysis& analysis = *m_snapshot->validation.subgroups;
    std::vector<ForestRow> c, oe, slope;
    std::vector<LevelCurve> curves;
    QStringList small;
    for (const auto& r : analysis.results) {
        if (r.column != column || r.model != model.name)
            continue;
        const std::string mark = r.tooSmall ? "too small" : "";
        c.push_back({r.level, r.panel.metrics[CStatistic].estimate, r.tooSmall, mark});
        oe.push_back({r.level, r.panel.metrics[OeRatio].estimate, r.tooSmall, mark});
        slope.push_back({r.level, r.panel.metrics[CalibrationSlope].estimate, r.tooSmall, mark});
        curves.push_back({r.level, r.tooSmall ? std::vector<CalibrationCurvePoint>{} : r.panel.calibrationCurve});
        if (r.tooSmall)
            small << QString::fromStdString(r.level);
    }
    m_c->setRows(c, model.metrics[CStatistic].estimate, std::nullopt, modelIndex);
    m_oe->setRows(oe, model.metrics[OeRatio].estimate, 1.0, modelIndex);
    m_slope->setRows(slope, model.metrics[CalibrationSlope].estimate, 1.0, modelIndex);
    m_levels->setCurves(curves);
    // Each title names the column and model, so a chart copied or printed alone says what it is.
    const QString which = QStringLiteral(" (%1, %2)").arg(QString::fromStdString(column), QString::fromStdString(model.name));
    m_c->chart()->setTitle(tr("C statistic by level") + which);
    m_oe->chart()->setTitle(tr("Observed / expected by level") + which);
    m_slope->chart()->setTitle(tr("Calibration slope by level") + which);
    m_levels->chart()->setTitle(tr("Calibration by level") + which);
    std::vector<FunnelPoint> points;
    for (const auto& p : analysis.funnel)
        if (p.column == column && p.model == model.name)
            points.push_back(p);
    const FunnelLimits* limits = nullptr;
    for (const auto& l : analysis.funnelLimits)
        if (l.column == column)
            limits = &l;
    m_funnel->setFunnel(points, limits, modelIndex);
    QStringList lines;
    for (const auto& h : analysis.heterogeneity)
        if (h.column == column && h.model == model.name && h.df > 0)
            lines << tr("Do levels differ in %1? Cochran's Q %2 on %3 df, %4.")
                         .arg(QString::fromStdString(metricLabel(h.metric)))
                         .arg(h.q, 0, 'f', 2)
                         .arg(h.df)
                         .arg(QString::fromStdString(pValueText(h.pValue)));
    if (!small.isEmpty())
        lines << tr("Too small to estimate well (fewer than %1 patients, events or non-events; hollow, and left out of the "
                    "tests and the funnel): %2.")
                     .arg(m_snapshot->request.minimumCell)
                     .arg(small.join(QStringLiteral(", ")));
    lines << tr("The funnel's limits are around O/E = 1: a model miscalibrated overall puts every level outside them, so "
                "read it after calibration.");
    m_summary->setText(lines.join(QLatin1Char('\n')));
}

} // namespace plumbline
