#include "panels/cohort_panel.hpp"

#include "widgets/copyable_table_view.hpp"
#include "models/intake_audit_model.hpp"

#include <QFileInfo>
#include <QHeaderView>
#include <QLabel>
#include <QListWidget>
#include <QLocale>
#include <QVBoxLayout>

namespace plumbline {

CohortPanel::CohortPanel(QWidget* parent)
    : QWidget(parent)
    , m_summary(new QLabel)
    , m_audit(new IntakeAuditModel(this))
    , m_warnings(new QListWidget)
{
    m_summary->setTextInteractionFlags(Qt::TextSelectableByMouse);
    m_summary->setWordWrap(true);
    auto* table = new CopyableTableView;
    table->setModel(m_audit);
    table->horizontalHeader()->setSectionResizeMode(QHeaderView::ResizeToContents);
    table->setAccessibleName(tr("Excluded rows by reason"));
    m_warnings->setWordWrap(true);
    m_warnings->setAccessibleName(tr("Warnings"));
    auto* layout = new QVBoxLayout(this);
    layout->addWidget(m_summary);
    layout->addWidget(new QLabel(tr("Excluded rows, by reason (where the first of each are)")));
    layout->addWidget(table, 1);
    layout->addWidget(new QLabel(tr("Warnings")));
    layout->addWidget(m_warnings, 1);
}

void CohortPanel::setSnapshot(const SnapshotPointer& snapshot)
{
    m_warnings->clear();
    if (!snapshot) {
        m_summary->clear();
        m_audit->setAudit({});
        return;
    }
    const IntakeAudit& a = snapshot->audit;
    const QLocale locale;
    QString text;
    for (const auto& input : snapshot->inputs)
        text += tr("<b>%1</b>: %2 — %3 rows, SHA-256 <tt>%4…</tt><br>")
                    .arg(QString::fromStdString(input.role), QFileInfo(QString::fromStdString(input.path)).fileName(),
                         locale.toString(qulonglong(input.rows)), QString::fromStdString(input.sha256.substr(0, 16)));
    text += tr("Rows read %1; used %2 (%3 events, %4 without the event); excluded %5.")
                .arg(locale.toString(qulonglong(a.rowsRead)), locale.toString(qulonglong(a.rowsUsed)),
                     locale.toString(qulonglong(a.events)), locale.toString(qulonglong(a.nonEvents)),
                     locale.toString(qulonglong(a.rowsExcluded())));
    if (a.join)
        text += tr("<br>Join on the id: %1 matched; %2 score rows without an outcome; %3 outcome rows without a score row.")
                    .arg(locale.toString(qulonglong(a.join->matched)), locale.toString(qulonglong(a.join->scoresWithoutOutcome)),
                         locale.toString(qulonglong(a.join->outcomesWithoutScore)));
    m_summary->setText(text);
    m_audit->setAudit(a);
    for (const auto& warning : a.warnings)
        m_warnings->addItem(QString::fromStdString(warning));
    for (const auto& warning : snapshot->validation.warnings)
        m_warnings->addItem(QString::fromStdString(warning));
    if (m_warnings->count() == 0)
        m_warnings->addItem(tr("No warnings."));
}

} // namespace plumbline
