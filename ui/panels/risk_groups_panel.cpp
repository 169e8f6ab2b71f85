#include "panels/risk_groups_panel.hpp"

#include "charts/calibration_chart_view.hpp"
#include "widgets/copyable_table_view.hpp"
#include "models/risk_group_table_model.hpp"

#include <QHBoxLayout>
#include <QHeaderView>
#include <QItemSelectionModel>
#include <QSortFilterProxyModel>
#include <QSplitter>

namespace plumbline {

RiskGroupsPanel::RiskGroupsPanel(QWidget* parent)
    : QWidget(parent)
    , m_model(new RiskGroupTableModel(this))
    , m_proxy(new QSortFilterProxyModel(this))
    , m_view(new CopyableTableView)
    , m_chart(new CalibrationChartView)
    , m_split(new QSplitter(Qt::Horizontal))
{
    m_proxy->setSourceModel(m_model);
    m_proxy->setSortRole(Qt::EditRole);
    m_view->setModel(m_proxy);
    m_view->setSortingEnabled(true);
    m_view->horizontalHeader()->setSectionResizeMode(QHeaderView::ResizeToContents);
    m_view->setSelectionBehavior(QAbstractItemView::SelectRows);
    m_view->setAccessibleName(tr("Risk groups"));
    m_chart->setObjectName(QStringLiteral("calibration-risk-groups"));
    m_split->addWidget(m_view);
    m_split->addWidget(m_chart);
    m_split->setChildrenCollapsible(false);
    auto* layout = new QHBoxLayout(this);
    layout->setContentsMargins(0, 0, 0, 0);
    layout->addWidget(m_split);
    connect(m_view->selectionModel(), &QItemSelectionModel::currentRowChanged, this, [this](const QModelIndex& current) {
        const auto [model, group] = current.isValid() ? m_model->groupAt(m_proxy->mapToSource(current).row()) : std::make_pair(-1, -1);
        m_chart->highlightRiskGroup(model, group);
        emit groupSelected(model, group);
    });
    connect(m_chart, &CalibrationChartView::riskGroupHovered, this, [this](int model, int group) {
        if (group >= 0)
            selectGroup(model, group);
    });
    resetLayout();
}

void RiskGroupsPanel::resetLayout()
{
    const int half = std::max(1, width() / 2);
    m_split->setSizes({half, half});
}

void RiskGroupsPanel::setSnapshot(SnapshotPointer snapshot)
{
    m_model->setSnapshot(snapshot);
    m_chart->setSnapshot(std::move(snapshot));
}

void RiskGroupsPanel::setThreshold(double threshold)
{
    m_chart->setThreshold(threshold);
}

void RiskGroupsPanel::setModelVisible(int model, bool visible)
{
    m_chart->setModelVisible(model, visible);
}

void RiskGroupsPanel::selectGroup(int model, int group)
{
    const int row = m_model->rowOf(model, group);
    if (row < 0)
        return;
    const QModelIndex index = m_proxy->mapFromSource(m_model->index(row, 0));
    m_view->selectionModel()->setCurrentIndex(index, QItemSelectionModel::ClearAndSelect | QItemSelectionModel::Rows);
    m_view->scrollTo(index);
}

} // namespace plumbline
