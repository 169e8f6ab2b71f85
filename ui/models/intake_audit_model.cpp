#include "models/intake_audit_model.hpp"

#include <QFileInfo>
#include <QLocale>
#include <QStringList>

namespace plumbline {

IntakeAuditModel::IntakeAuditModel(QObject* parent)
    : QAbstractTableModel(parent)
{
}

void IntakeAuditModel::setAudit(IntakeAudit audit)
{
    beginResetModel();
    m_audit = std::move(audit);
    // Rows of the outcomes file that could not take part in the join are listed too: each line
    // number is read with the file named beside it.
    m_rows = m_audit.exclusions;
    if (m_audit.join)
        m_rows.insert(m_rows.end(), m_audit.join->outcomeFileExclusions.begin(), m_audit.join->outcomeFileExclusions.end());
    endResetModel();
}

int IntakeAuditModel::rowCount(const QModelIndex& parent) const
{
    return parent.isValid() ? 0 : static_cast<int>(m_rows.size());
}

int IntakeAuditModel::columnCount(const QModelIndex& parent) const
{
    return parent.isValid() ? 0 : ColumnCount;
}

QVariant IntakeAuditModel::data(const QModelIndex& index, int role) const
{
    if (!index.isValid() || index.row() >= rowCount())
        return {};
    const ExclusionTally& tally = m_rows[static_cast<std::size_t>(index.row())];
    if (role == Qt::TextAlignmentRole && index.column() == RowsColumn)
        return QVariant::fromValue(Qt::Alignment(Qt::AlignRight | Qt::AlignVCenter));
    if (role != Qt::DisplayRole)
        return {};
    switch (index.column()) {
    case ReasonColumn:
        return QString::fromStdString(exclusionReasonText(tally.reason));
    case ScoreColumn:
        return QString::fromStdString(tally.column);
    case RowsColumn:
        return QLocale().toString(static_cast<qulonglong>(tally.rows));
    case FileColumn:
        // A query's result is named with its database's address, which is not a path.
        return m_audit.lineNoun == "row of the result" && &tally - m_rows.data() < static_cast<std::ptrdiff_t>(m_audit.exclusions.size())
            ? QString::fromStdString(tally.file)
            : QFileInfo(QString::fromStdString(tally.file)).fileName();
    case LinesColumn: {
        QStringList lines;
        for (std::size_t line : tally.firstLines)
            lines << QString::number(line);
        return lines.join(QStringLiteral(", ")) + (tally.rows > tally.firstLines.size() ? QStringLiteral(", …") : QString());
    }
    default:
        return {};
    }
}

QVariant IntakeAuditModel::headerData(int section, Qt::Orientation orientation, int role) const
{
    if (orientation != Qt::Horizontal || role != Qt::DisplayRole)
        return {};
    switch (section) {
    case ReasonColumn: return tr("Reason");
    case ScoreColumn: return tr("Column");
    case RowsColumn: return tr("Rows");
    case FileColumn: return tr("File");
    case LinesColumn:
        if (m_audit.lineNoun == "row")
            return tr("First rows in that file");
        if (m_audit.lineNoun == "row of the result")
            return tr("First rows of the result");
        return tr("First lines in that file");
    default: return {};
    }
}

} // namespace plumbline
