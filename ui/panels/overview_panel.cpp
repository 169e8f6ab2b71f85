#include "panels/overview_panel.hpp"

#include "charts/calibration_chart_view.hpp"
#include "charts/risk_distribution_view.hpp"
#include "charts/roc_chart_view.hpp"
#include "models/threshold_summary_model.hpp"

#include <QComboBox>
#include <QFontMetrics>
#include <QHBoxLayout>
#include <QHeaderView>
#include <QLabel>
#include <QScrollBar>
#include <QSplitter>
#include <QTableView>
#include <QVBoxLayout>

namespace plumbline {

OverviewPanel::OverviewPanel(QWidget* parent)
    : QWidget(parent)
    , m_roc(new RocChartView)
    , m_calibration(new CalibrationChartView)
    , m_distribution(new RiskDistributionView)
    , m_summary(new ThresholdSummaryModel(this))
    , m_summaryTable(new QTableView)
    , m_distributionModel(new QComboBox)
    , m_rows(new QSplitter(Qt::Vertical))
    , m_top(new QSplitter(Qt::Horizontal))
    , m_bottom(new QSplitter(Qt::Horizontal))
{
    m_top->addWidget(m_roc);
    m_top->addWidget(m_calibration);
    m_bottom->addWidget(buildSummaryColumn());
    m_bottom->addWidget(m_distribution);
    m_rows->addWidget(m_top);
    m_rows->addWidget(m_bottom);
    m_rows->setStretchFactor(0, 3);
    m_rows->setStretchFactor(1, 1);
    m_rows->setChildrenCollapsible(false);
    m_top->setChildrenCollapsible(false);
    m_bottom->setChildrenCollapsible(false);
    auto* layout = new QVBoxLayout(this);
    layout->setContentsMargins(0, 0, 0, 0);
    layout->addWidget(m_rows);
    // The columns move together, so the distribution stays under the calibration plot, and its
    // plot area follows the calibration plot's: the two x axes line up.
    connect(m_top, &QSplitter::splitterMoved, this, [this] {
        m_userMoved = true;
        m_bottom->setSizes(m_top->sizes());
        fitSummaryHeight();
    });
    connect(m_bottom, &QSplitter::splitterMoved, this, [this] {
        m_userMoved = true;
        m_top->setSizes(m_bottom->sizes());
        fitSummaryHeight();
    });
    connect(m_rows, &QSplitter::splitterMoved, this, [this] { m_userMoved = true; });
    connect(m_calibration, &ExportableChartView::plotAreaFitted, this, [this](const QRectF& area) {
        const QPoint left = m_distribution->mapFromGlobal(m_calibration->mapToGlobal(area.topLeft().toPoint()));
        const QPoint right = m_distribution->mapFromGlobal(m_calibration->mapToGlobal(area.topRight().toPoint()));
        m_distribution->alignPlotEdges(left.x(), right.x());
    });
    connect(m_distributionModel, &QComboBox::currentIndexChanged, this, [this](int index) { m_distribution->setModel(index); });
    resetLayout();
}

QWidget* OverviewPanel::buildSummaryColumn()
{
    m_summaryTable->setModel(m_summary);
    m_summaryTable->verticalHeader()->hide();
    m_summaryTable->horizontalHeader()->setSectionResizeMode(QHeaderView::ResizeToContents);
    m_summaryTable->horizontalHeader()->setStretchLastSection(false);
    m_summaryTable->setSelectionMode(QAbstractItemView::NoSelection);
    m_summaryTable->setVerticalScrollBarPolicy(Qt::ScrollBarAlwaysOff);
    m_summaryTable->setAccessibleName(tr("Each model at the decision threshold"));
    m_summaryTable->installEventFilter(this); // its own width decides which columns it shows
    QFont compact = m_summaryTable->font(); // twelve columns under half the window
    compact.setPointSizeF(compact.pointSizeF() * 0.9);
    m_summaryTable->setFont(compact);
    m_distributionModel->setAccessibleName(tr("Model whose risk distribution is shown"));
    m_distributionModel->setSizeAdjustPolicy(QComboBox::AdjustToContents);
    auto* caption = new QLabel(tr("At the decision threshold (hover a heading for its meaning, a row for its counts):"));
    auto* pickerLabel = new QLabel(tr("Risk distribution &beside:"));
    pickerLabel->setBuddy(m_distributionModel);
    auto* picker = new QHBoxLayout;
    picker->addWidget(pickerLabel);
    picker->addWidget(m_distributionModel);
    picker->addStretch(1);
    auto* column = new QWidget;
    auto* layout = new QVBoxLayout(column);
    layout->setContentsMargins(4, 2, 4, 2);
    layout->addWidget(caption);
    layout->addWidget(m_summaryTable);
    layout->addLayout(picker);
    layout->addStretch(1);
    return column;
}

void OverviewPanel::resetLayout()
{
    m_userMoved = false;
    const int half = std::max(1, width() / 2);
    m_top->setSizes({half, half});
    m_bottom->setSizes({half, half});
    const int height = std::max(400, this->height());
    const int lower = std::clamp(height / 4, 140, 280);
    m_rows->setSizes({height - lower, lower});
}

void OverviewPanel::fitSummaryHeight()
{
    // In a narrow window TN and FN give way first (every cell's tooltip still has the whole 2×2
    // table), so that sensitivity, PPV, the share flagged and net benefit stay in view.
    const QFontMetrics metrics(m_summaryTable->font());
    int needed = 2 * m_summaryTable->frameWidth() + 24; // the colour swatch of the model column
    for (int c = 0; c < m_summary->columnCount(); ++c) {
        int widest = metrics.horizontalAdvance(m_summary->headerData(c, Qt::Horizontal).toString());
        for (int r = 0; r < m_summary->rowCount(); ++r)
            widest = std::max(widest, metrics.horizontalAdvance(m_summary->index(r, c).data().toString()));
        needed += widest + 14; // cell padding and grid line
    }
    const bool narrow = needed > m_summaryTable->width();
    m_summaryTable->setColumnHidden(ThresholdSummaryModel::TnColumn, narrow);
    m_summaryTable->setColumnHidden(ThresholdSummaryModel::FnColumn, narrow);
    // Tall enough for every model's row (and the scroll bar, when the columns need one), no more.
    m_summaryTable->resizeRowsToContents();
    int height = m_summaryTable->horizontalHeader()->height() + 2 * m_summaryTable->frameWidth() + 2;
    for (int r = 0; r < m_summary->rowCount(); ++r)
        height += m_summaryTable->rowHeight(r);
    if (m_summaryTable->horizontalHeader()->length() > m_summaryTable->width() - 2 * m_summaryTable->frameWidth())
        height += m_summaryTable->horizontalScrollBar()->sizeHint().height();
    m_summaryTable->setFixedHeight(height);
}

bool OverviewPanel::eventFilter(QObject* watched, QEvent* event)
{
    if (watched == m_summaryTable && event->type() == QEvent::Resize)
        fitSummaryHeight();
    return QWidget::eventFilter(watched, event);
}

void OverviewPanel::resizeEvent(QResizeEvent* event)
{
    QWidget::resizeEvent(event);
    // The default proportions follow the window until the user moves a divider.
    if (!m_userMoved)
        resetLayout();
    fitSummaryHeight();
}

void OverviewPanel::setSnapshot(SnapshotPointer snapshot)
{
    m_snapshot = snapshot;
    const std::size_t models = snapshot ? snapshot->validation.models.size() : 0;
    m_visible.assign(models, true);
    m_roc->setSnapshot(snapshot);
    m_calibration->setSnapshot(snapshot);
    m_summary->setSnapshot(snapshot);
    {
        const QSignalBlocker block(m_distributionModel);
        m_distributionModel->clear();
        for (std::size_t m = 0; m < models; ++m)
            m_distributionModel->addItem(QString::fromStdString(snapshot->validation.models[m].name));
    }
    m_distribution->setSnapshot(snapshot, models > 0 ? 0 : -1, m_calibration->axisMaximum());
    fitSummaryHeight();
}

void OverviewPanel::setThreshold(double threshold)
{
    m_roc->setThreshold(threshold);
    m_calibration->setThreshold(threshold);
    m_distribution->setThreshold(threshold);
    m_summary->setThreshold(threshold);
}

void OverviewPanel::setModelVisible(int model, bool visible)
{
    if (model < 0 || model >= static_cast<int>(m_visible.size()))
        return;
    m_visible[std::size_t(model)] = visible;
    m_summaryTable->setRowHidden(model, !visible);
    fitSummaryHeight();
    m_roc->setModelVisible(model, visible);
    m_calibration->setModelVisible(model, visible);
    // The distribution shows a model that is shown: the chosen one, else the first visible one.
    if (!visible && m_distribution->model() == model) {
        const auto first = std::find(m_visible.begin(), m_visible.end(), true);
        showDistributionOf(first == m_visible.end() ? -1 : int(first - m_visible.begin()));
    } else if (visible && m_distribution->model() < 0) {
        showDistributionOf(model);
    }
}

void OverviewPanel::showDistributionOf(int model)
{
    const QSignalBlocker block(m_distributionModel);
    m_distributionModel->setCurrentIndex(model);
    m_distribution->setModel(model);
}

} // namespace plumbline
