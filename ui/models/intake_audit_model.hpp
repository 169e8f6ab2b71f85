#pragma once

#include "intake/intake_audit.hpp"

#include <QAbstractTableModel>

namespace plumbline {

// The exclusions of an intake audit as a table (reason, column, rows, first lines) for the
// cohort panel and the import dialog. Holds an immutable copy; setAudit swaps it with one reset.
class IntakeAuditModel : public QAbstractTableModel {
    Q_OBJECT
public:
    enum Column { ReasonColumn, ScoreColumn, RowsColumn, FileColumn, LinesColumn, ColumnCount };

    explicit IntakeAuditModel(QObject* parent = nullptr);

    void setAudit(IntakeAudit audit);
    const IntakeAudit& audit() const { return m_audit; }

    int rowCount(const QModelIndex& parent = {}) const override;
    int columnCount(const QModelIndex& parent = {}) const override;
    QVariant data(const QModelIndex& index, int role = Qt::DisplayRole) const override;
    QVariant headerData(int section, Qt::Orientation orientation, int role = Qt::DisplayRole) const override;

private:
    IntakeAudit m_audit;
    std::vector<ExclusionTally> m_rows; // the cohort file's exclusions, then the outcomes file's
};

} // namespace plumbline
