#pragma once

#include <QDialog>

class QLineEdit;
class QPlainTextEdit;

namespace plumbline {

// File → Open from database: which database and which query give the cohort. The columns, the
// preview and the audit then follow in the import dialog, as for a file. No password is typed or
// kept here: the note under the address says where each kind of database takes one from.
class DatabaseDialog : public QDialog {
    Q_OBJECT
public:
    explicit DatabaseDialog(QWidget* parent = nullptr);

    QString database() const;
    QString query() const;
    void setDatabase(const QString& database);
    void setQuery(const QString& query);

private:
    void updateButtons();

    QLineEdit* m_database;
    QPlainTextEdit* m_query;
    class QPushButton* m_next;
};

} // namespace plumbline
