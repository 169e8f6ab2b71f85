#pragma once

#include "run/analysis_snapshot.hpp"

#include <QAbstractTableModel>

namespace plumbline {

// The metric panel as a table: one row per metric; per model its estimate with interval and the
// plain-words reading. The tooltip gives the definition, the published source and where the
// interval came from.
class MetricTableModel : public QAbstractTableModel {
    Q_OBJECT
public:
    explicit MetricTableModel(QObject* parent = nullptr);
    void setSnapshot(SnapshotPointer snapshot);

    int rowCount(const QModelIndex& parent = {}) const override;
    int columnCount(const QModelIndex& parent = {}) const override;
    QVariant data(const QModelIndex& index, int role = Qt::DisplayRole) const override;
    QVariant headerData(int section, Qt::Orientation orientation, int role = Qt::DisplayRole) const override;

    // The column of a model's estimate (its reading is the next one).
    static int estimateColumn(int model) { return 1 + 2 * model; }

private:
    SnapshotPointer m_snapshot;
};

// "0.719 (0.709 to 0.728)", or "not computed" — the same digits as the CLI.
QString estimateText(const std::string& key, const Estimate& estimate);

} // namespace plumbline
