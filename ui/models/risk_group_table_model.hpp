#pragma once

#include "run/analysis_snapshot.hpp"

#include <QAbstractTableModel>

namespace plumbline {

// Every model's risk groups in one table (model, group, n, events, expected, mean predicted,
// observed with interval, risk range); sortable through a proxy; copyable as tab-separated text.
class RiskGroupTableModel : public QAbstractTableModel {
    Q_OBJECT
public:
    enum Column { ModelColumn, GroupColumn, PatientsColumn, EventsColumn, ExpectedColumn, MeanPredictedColumn,
                  ObservedColumn, LowerColumn, UpperColumn, RiskMinColumn, RiskMaxColumn, ColumnCount };

    explicit RiskGroupTableModel(QObject* parent = nullptr);
    void setSnapshot(SnapshotPointer snapshot);

    // The table row of a model's group, and back.
    int rowOf(int model, int group) const;
    std::pair<int, int> groupAt(int row) const;

    int rowCount(const QModelIndex& parent = {}) const override;
    int columnCount(const QModelIndex& parent = {}) const override;
    QVariant data(const QModelIndex& index, int role = Qt::DisplayRole) const override;
    QVariant headerData(int section, Qt::Orientation orientation, int role = Qt::DisplayRole) const override;

private:
    SnapshotPointer m_snapshot;
    std::vector<std::pair<int, int>> m_rows; // (model, group)
};

} // namespace plumbline
