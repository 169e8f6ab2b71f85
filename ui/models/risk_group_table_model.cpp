#include "models/risk_group_table_model.hpp"

#include "charts/model_palette.hpp"

namespace plumbline {

RiskGroupTableModel::RiskGroupTableModel(QObject* parent)
    : QAbstractTableModel(parent)
{
}

void RiskGroupTableModel::setSnapshot(SnapshotPointer snapshot)
{
    beginResetModel();
    m_snapshot = std::move(snapshot);
    m_rows.clear();
    if (m_snapshot)
        for (std::size_t m = 0; m < m_snapshot->validation.models.size(); ++m)
            for (std::size_t g = 0; g < m_snapshot->validation.models[m].riskGroups.size(); ++g)
                m_rows.emplace_back(int(m), int(g));
    endResetModel();
}

int RiskGroupTableModel::rowOf(int model, int group) const
{
    for (std::size_t r = 0; r < m_rows.size(); ++r)
        if (m_rows[r] == std::pair{model, group})
            return int(r);
    return -1;
}

std::pair<int, int> RiskGroupTableModel::groupAt(int row) const
{
    return row >= 0 && row < int(m_rows.size()) ? m_rows[std::size_t(row)] : std::pair{-1, -1};
}

int RiskGroupTableModel::rowCount(const QModelIndex& parent) const
{
    return parent.isValid() ? 0 : int(m_rows.size());
}

int RiskGroupTableModel::columnCount(const QModelIndex& parent) const
{
    return parent.isValid() ? 0 : ColumnCount;
}

QVariant RiskGroupTableModel::data(const QModelIndex& index, int role) const
{
    if (!index.isValid() || !m_snapshot)
        return {};
    const auto [model, group] = m_rows[std::size_t(index.row())];
    const ModelValidation& m = m_snapshot->validation.models[std::size_t(model)];
    const RiskGroup& g = m.riskGroups[std::size_t(group)];
    if (role == Qt::DecorationRole && index.column() == ModelColumn)
        return modelColour(model);
    if (role == Qt::TextAlignmentRole && index.column() != ModelColumn)
        return QVariant::fromValue(Qt::Alignment(Qt::AlignRight | Qt::AlignVCenter));
    // Sorting uses the numbers (EditRole); the display shows them rounded.
    const bool display = role == Qt::DisplayRole;
    if (!display && role != Qt::EditRole)
        return {};
    auto number = [display](double v, int digits) -> QVariant { return display ? QVariant(QString::number(v, 'f', digits)) : QVariant(v); };
    switch (index.column()) {
    case ModelColumn: return QString::fromStdString(m.name);
    case GroupColumn: return qulonglong(g.group);
    case PatientsColumn: return qulonglong(g.n);
    case EventsColumn: return qulonglong(g.events);
    case ExpectedColumn: return number(g.expected, 1);
    case MeanPredictedColumn: return number(g.meanPredicted, 4);
    case ObservedColumn: return number(g.observedRate, 4);
    case LowerColumn: return number(g.ciLower, 4);
    case UpperColumn: return number(g.ciUpper, 4);
    case RiskMinColumn: return number(g.riskMin, 4);
    case RiskMaxColumn: return number(g.riskMax, 4);
    default: return {};
    }
}

QVariant RiskGroupTableModel::headerData(int section, Qt::Orientation orientation, int role) const
{
    if (orientation != Qt::Horizontal || role != Qt::DisplayRole)
        return {};
    static const char* names[] = {QT_TR_NOOP("Model"), QT_TR_NOOP("Group"), QT_TR_NOOP("Patients"), QT_TR_NOOP("Events"),
                                  QT_TR_NOOP("Expected"), QT_TR_NOOP("Mean risk"), QT_TR_NOOP("Observed"),
                                  QT_TR_NOOP("CI lower"), QT_TR_NOOP("CI upper"), QT_TR_NOOP("Lowest risk"),
                                  QT_TR_NOOP("Highest risk")};
    return section >= 0 && section < ColumnCount ? tr(names[section]) : QVariant();
}

} // namespace plumbline
