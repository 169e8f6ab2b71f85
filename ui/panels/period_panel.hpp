#pragma once

#include "run/analysis_snapshot.hpp"

#include <QWidget>

class QComboBox;
class QLabel;
class QSplitter;

namespace plumbline {

class PeriodChartView;

// Performance over time for one model: C, O/E and calibration-in-the-large per month or
// quarter with intervals, left to right against the first year's band, periods marked when
// their interval misses the first year's, the drift warnings and the usual causes of drift.
class PeriodPanel : public QWidget {
    Q_OBJECT
public:
    explicit PeriodPanel(QWidget* parent = nullptr);

    void setSnapshot(SnapshotPointer snapshot);
    QString noteText() const;
    PeriodChartView* cChart() const { return m_c; }
    PeriodChartView* oeChart() const { return m_oe; }
    QComboBox* modelPicker() const { return m_model; }
    void resetLayout();

private:
    void showModel(int index);

    SnapshotPointer m_snapshot;
    QComboBox* m_model;
    PeriodChartView* m_c;
    PeriodChartView* m_oe;
    PeriodChartView* m_citl;
    QSplitter* m_charts;
    QLabel* m_note;
};

} // namespace plumbline
