#include "dialogs/database_dialog.hpp"

#include <QDialogButtonBox>
#include <QFontDatabase>
#include <QFormLayout>
#include <QLabel>
#include <QLineEdit>
#include <QPlainTextEdit>
#include <QPushButton>
#include <QVBoxLayout>

namespace plumbline {

DatabaseDialog::DatabaseDialog(QWidget* parent)
    : QDialog(parent)
    , m_database(new QLineEdit)
    , m_query(new QPlainTextEdit)
    , m_next(new QPushButton(tr("&Preview and map the columns…")))
{
    setWindowTitle(tr("Open a cohort from a database"));
    m_database->setObjectName(QStringLiteral("databaseAddress"));
    m_database->setPlaceholderText(tr("postgresql://analyst@warehouse/quality   ·   sqlite:/data/cohort.db   ·   odbc:DSN=Warehouse"));
    m_query->setObjectName(QStringLiteral("databaseQuery"));
    m_query->setPlaceholderText(tr("SELECT encounter_id, supplier_score, readmitted_30d, hospital, discharge_date\nFROM scored_discharges\nWHERE discharge_date >= DATE '2024-01-01'"));
    m_query->setFont(QFontDatabase::systemFont(QFontDatabase::FixedFont));
    m_query->setTabChangesFocus(true);
    auto* passwords = new QLabel(tr(
        "No password is typed here or saved with the analysis. PostgreSQL takes it from PGPASSWORD, ~/.pgpass or a "
        "service in pg_service.conf; ODBC from the data source's own settings or the PLUMBLINE_ODBC_PASSWORD "
        "environment variable. SQLite files are opened read-only. The query's text and a fingerprint of its result "
        "are recorded, so a re-run shows whether the data changed."));
    passwords->setWordWrap(true);
    auto* form = new QFormLayout;
    form->addRow(tr("&Database:"), m_database);
    form->addRow(QString(), passwords);
    form->addRow(tr("&Query:"), m_query);
    auto* buttons = new QDialogButtonBox;
    m_next->setDefault(true);
    buttons->addButton(m_next, QDialogButtonBox::AcceptRole);
    buttons->addButton(QDialogButtonBox::Cancel);
    connect(buttons, &QDialogButtonBox::accepted, this, &QDialog::accept);
    connect(buttons, &QDialogButtonBox::rejected, this, &QDialog::reject);
    connect(m_database, &QLineEdit::textChanged, this, &DatabaseDialog::updateButtons);
    connect(m_query, &QPlainTextEdit::textChanged, this, &DatabaseDialog::updateButtons);
    auto* layout = new QVBoxLayout(this);
    layout->addLayout(form, 1);
    layout->addWidget(buttons);
    resize(720, 420);
    updateButtons();
}

QString DatabaseDialog::database() const
{
    return m_database->text().trimmed();
}

QString DatabaseDialog::query() const
{
    return m_query->toPlainText().trimmed();
}

void DatabaseDialog::setDatabase(const QString& database)
{
    m_database->setText(database);
}

void DatabaseDialog::setQuery(const QString& query)
{
    m_query->setPlainText(query);
}

void DatabaseDialog::updateButtons()
{
    m_next->setEnabled(!database().isEmpty() && !query().isEmpty());
}

} // namespace plumbline
