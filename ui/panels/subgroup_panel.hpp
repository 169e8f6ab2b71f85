#pragma once

#include "run/analysis_snapshot.hpp"

#include <QWidget>

class QComboBox;
class QLabel;
class QSplitter;

namespace plumbline {

class ForestChartView;
class FunnelChartView;
class LevelCalibrationView;

// Performance within subgroups: pick a column and a model; forest charts of C, O/E and the
// calibration slope per level beside the overall value, calibration curves by level, the funnel
// of O/E against expected events, and the heterogeneity tests. Levels too small to estimate well are drawn hollow and named, not hidden.
class SubgroupPanel : public QWidget {
    Q_OBJECT
public:
    explicit SubgroupPanel(QWidget* parent = nullptr);

    void setSnapshot(SnapshotPointer snapshot);
    QComboBox* picker() const { return m_picker; }
    QString summaryText() const;
    ForestChartView* cChart() const { return m_c; }
    ForestChartView* oeChart() const { return m_oe; }
    ForestChartView* slopeChart() const { return m_slope; }
    LevelCalibrationView* levelCalibrationChart() const { return m_levels; }
    FunnelChartView* funnelChart() const { return m_funnel; }
    void resetLayout();

private:
    void showChoice(int index);

    SnapshotPointer m_snapshot;
    QComboBox* m_picker;
    ForestChartView* m_c;
    ForestChartView* m_oe;
    ForestChartView* m_slope;
    LevelCalibrationView* m_levels;
    FunnelChartView* m_funnel;
    QSplitter* m_rows;
    QSplitter* m_top;
    QSplitter* m_bottom;
    QLabel* m_summary;
};

} // namespace plumbline
