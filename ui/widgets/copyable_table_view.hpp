#pragma once

#include <QTableView>

namespace plumbline {

// A table whose selection (or, with nothing selected, whole content) copies to the clipboard as
// tab-separated text with the headers, ready to paste into a spreadsheet: Ctrl+C or the context menu.
class CopyableTableView : public QTableView {
    Q_OBJECT
public:
    explicit CopyableTableView(QWidget* parent = nullptr);
    QString tabSeparatedText() const;

protected:
    void keyPressEvent(QKeyEvent* event) override;
    void contextMenuEvent(QContextMenuEvent* event) override;
};

} // namespace plumbline
