#include "widgets/metric_table_view.hpp"

#include <QHeaderView>
#include <QResizeEvent>

namespace plumbline {

MetricTableView::MetricTableView(QWidget* parent)
    : CopyableTableView(parent)
{
    setWordWrap(true);
    horizontalHeader()->setStretchLastSection(false);
    horizontalHeader()->setSectionResizeMode(QHeaderView::Interactive);
}

void MetricTableView::setModel(QAbstractItemModel* model)
{
    CopyableTableView::setModel(model);
    connect(model, &QAbstractItemModel::modelReset, this, &MetricTableView::fitColumns);
    fitColumns();
}

void MetricTableView::resizeEvent(QResizeEvent* event)
{
    CopyableTableView::resizeEvent(event);
    fitColumns();
}

void MetricTableView::fitColumns()
{
    const QAbstractItemModel* m = model();
    if (!m || m->columnCount() == 0)
        return;
    // Column 0 is the metric, then each model's estimate and reading.
    int fixed = 0;
    for (int c = 0; c < m->columnCount(); c += (c == 0 ? 1 : 2)) {
        resizeColumnToContents(c);
        fixed += columnWidth(c);
    }
    const int readings = (m->columnCount() - 1) / 2;
    if (readings > 0) {
        const int room = viewport()->width() - fixed;
        const int each = std::max(160, room / readings);
        for (int c = 2; c < m->columnCount(); c += 2)
            setColumnWidth(c, each);
    }
    resizeRowsToContents();
}

} // namespace plumbline
