#pragma once

#include "analysis_snapshot.hpp"

#include <QWidget>

class QDoubleSpinBox;
class QSlider;
class QTableView;

namespace plumbline {

class ThresholdSummaryModel;

// The one decision threshold that drives every chart: a slider and a spin box (steps of 0.005)
// and the summary of each model at that threshold.
class ThresholdPanel : public QWidget {
    Q_OBJECT
public:
    explicit ThresholdPanel(QWidget* parent = nullptr);

    void setSnapshot(SnapshotPointer snapshot);
    double threshold() const;
    void setThreshold(double threshold);
    ThresholdSummaryModel* summaryModel() const { return m_model; }
    QSlider* slider() const { return m_slider; }

signals:
    void thresholdChanged(double threshold);

private:
    QSlider* m_slider;
    QDoubleSpinBox* m_spin;
    QTableView* m_table;
    ThresholdSummaryModel* m_model;
};

} // namespace plumbline
