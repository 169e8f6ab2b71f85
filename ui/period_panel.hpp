#pragma once

#include "analysis_snapshot.hpp"

#include <QWidget>

class QComboBox;
class QLabel;

namespace plumbline {

class ForestChartView;

// Performance over time for one model: C and O/E per month or quarter with intervals, in time
// order from the top, periods marked when their interval misses the first year's, the drift
// warnings and the usual causes of drift.
class PeriodPanel : public QWidget {
    Q_OBJECT
public:
    explicit PeriodPanel(QWidget* parent = nullptr);

    void setSnapshot(SnapshotPointer snapshot);
    QString noteText() const;

private:
    void showModel(int index);

    SnapshotPointer m_snapshot;
    QComboBox* m_model;
    ForestChartView* m_c;
    ForestChartView* m_oe;
    QLabel* m_note;
};

} // namespace plumbline
