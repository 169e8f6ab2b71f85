#pragma once

#include "run/analysis_snapshot.hpp"

#include <QWidget>

class QComboBox;
class QDoubleSpinBox;
class QLabel;
class QLineEdit;
class QSlider;

namespace plumbline {

// The one decision threshold that drives every chart and table: a slider and a box to type it
// in (steps of 0.005, the grid of the snapshot's operating points). A typed value takes effect
// on Return or when the box loses focus, never half-typed. Beside it a capacity box: the patients
// the threshold flags for the chosen model, as a share or, with dates, a number per week (looked
// up in the snapshot's CapacityLookup); typing a capacity there ("10%", "40/week") moves the
// threshold to the grid value that flags at most that many.
class ThresholdPanel : public QWidget {
    Q_OBJECT
public:
    explicit ThresholdPanel(QWidget* parent = nullptr);

    double threshold() const { return m_threshold; }
    void setThreshold(double threshold);
    QSlider* slider() const { return m_slider; }
    QDoubleSpinBox* spinBox() const { return m_spin; }
    QLineEdit* capacityBox() const { return m_capacity; }
    QComboBox* capacityModel() const { return m_capacityModel; }
    QLabel* capacityNote() const { return m_capacityNote; }
    void setSnapshot(SnapshotPointer snapshot);

signals:
    void thresholdChanged(double threshold);

private:
    void showCapacity();
    void applyCapacity();

    QSlider* m_slider;
    QDoubleSpinBox* m_spin;
    QComboBox* m_capacityModel;
    QLineEdit* m_capacity;
    QLabel* m_capacityNote;
    SnapshotPointer m_snapshot;
    // The capacity as the user typed it, kept in the box while the threshold is the one it set.
    QString m_typed;
    double m_typedThreshold = -1.0;
    int m_typedModel = -1;
    // The run whose capacity (Settings → Capacity) the box last took, so a refreshed snapshot of
    // the same run does not move a slider the user has moved since.
    const void* m_capacityRun = nullptr;
    double m_threshold = -1.0;
};

} // namespace plumbline
