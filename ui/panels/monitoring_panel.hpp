#pragma once

#include "run/analysis_snapshot.hpp"

#include <QWidget>

class QComboBox;
class QLabel;
class QSplitter;

namespace plumbline {

class CaseMixView;
class MonitoringPathView;

// Watching the model over time, for one model and one scope (the whole cohort or a site): the
// cumulative expected-minus-observed chart, predicted and observed per period, and the two
// CUSUMs with their control limits and signals; below, the limits' simulation, the signals, the
// latest year's PSI and the coding-shift question. Everything shown comes from the snapshot.
class MonitoringPanel : public QWidget {
    Q_OBJECT
public:
    explicit MonitoringPanel(QWidget* parent = nullptr);

    void setSnapshot(SnapshotPointer snapshot);
    QString noteText() const;
    QComboBox* modelPicker() const { return m_model; }
    QComboBox* scopePicker() const { return m_scope; }
    MonitoringPathView* expectedMinusObservedChart() const { return m_vlad; }
    MonitoringPathView* worseChart() const { return m_worse; }
    MonitoringPathView* betterChart() const { return m_better; }
    CaseMixView* caseMixChart() const { return m_caseMix; }
    void resetLayout();

private:
    void fillScopes();
    void showScope();

    SnapshotPointer m_snapshot;
    QComboBox* m_model;
    QComboBox* m_scope;
    MonitoringPathView* m_vlad;
    CaseMixView* m_caseMix;
    MonitoringPathView* m_worse;
    MonitoringPathView* m_better;
    QSplitter* m_rows;
    QSplitter* m_top;
    QSplitter* m_bottom;
    QLabel* m_note;
};

} // namespace plumbline
