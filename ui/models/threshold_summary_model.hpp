#pragma once

#include "run/analysis_snapshot.hpp"

#include <QAbstractTableModel>

namespace plumbline {

// One row per model: the confusion counts and what they mean at the shared threshold, looked up
// in the snapshot's operating points (positive if risk ≥ threshold); a last row for flagging
// everyone (treat all), the strategy net benefit is judged against.
class ThresholdSummaryModel : public QAbstractTableModel {
    Q_OBJECT
public:
    enum Column { ModelColumn, TpColumn, FpColumn, TnColumn, FnColumn, SensitivityColumn, SpecificityColumn,
                  PpvColumn, NpvColumn, FlagRateColumn, NetBenefitColumn, ColumnCount };

    explicit ThresholdSummaryModel(QObject* parent = nullptr);
    void setSnapshot(SnapshotPointer snapshot);
    void setThreshold(double threshold);
    double threshold() const { return m_threshold; }
    // The row of flagging everyone (after the models' rows); −1 with no snapshot.
    int treatAllRow() const;

    int rowCount(const QModelIndex& parent = {}) const override;
    int columnCount(const QModelIndex& parent = {}) const override;
    QVariant data(const QModelIndex& index, int role = Qt::DisplayRole) const override;
    QVariant headerData(int section, Qt::Orientation orientation, int role = Qt::DisplayRole) const override;

private:
    SnapshotPointer m_snapshot;
    double m_threshold = 0.2;
};

} // namespace plumbline
