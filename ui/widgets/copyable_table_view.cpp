#include "widgets/copyable_table_view.hpp"

#include <QApplication>
#include <QClipboard>
#include <QContextMenuEvent>
#include <QHeaderView>
#include <QKeyEvent>
#include <QMenu>

#include <set>

namespace plumbline {

CopyableTableView::CopyableTableView(QWidget* parent)
    : QTableView(parent)
{
    setSelectionBehavior(QAbstractItemView::SelectRows);
    setAlternatingRowColors(true);
    verticalHeader()->hide();
    horizontalHeader()->setStretchLastSection(true);
    setWordWrap(false);
}

QString CopyableTableView::tabSeparatedText() const
{
    const QAbstractItemModel* m = model();
    if (!m)
        return {};
    std::set<int> rows;
    for (const QModelIndex& index : selectionModel() ? selectionModel()->selectedIndexes() : QModelIndexList())
        rows.insert(index.row());
    if (rows.empty())
        for (int r = 0; r < m->rowCount(); ++r)
            rows.insert(r);
    QStringList lines;
    QStringList header;
    for (int c = 0; c < m->columnCount(); ++c)
        header << m->headerData(c, Qt::Horizontal).toString();
    lines << header.join(QLatin1Char('\t'));
    for (int r : rows) {
        QStringList cells;
        for (int c = 0; c < m->columnCount(); ++c)
            cells << m->index(r, c).data().toString().replace(QLatin1Char('\t'), QLatin1Char(' '));
        lines << cells.join(QLatin1Char('\t'));
    }
    return lines.join(QLatin1Char('\n')) + QLatin1Char('\n');
}

void CopyableTableView::keyPressEvent(QKeyEvent* event)
{
    if (event->matches(QKeySequence::Copy)) {
        QApplication::clipboard()->setText(tabSeparatedText());
        return;
    }
    QTableView::keyPressEvent(event);
}

void CopyableTableView::contextMenuEvent(QContextMenuEvent* event)
{
    QMenu menu(this);
    QAction* copy = menu.addAction(tr("Copy as tab-separated text"));
    copy->setShortcut(QKeySequence::Copy);
    if (menu.exec(event->globalPos()) == copy)
        QApplication::clipboard()->setText(tabSeparatedText());
}

} // namespace plumbline
