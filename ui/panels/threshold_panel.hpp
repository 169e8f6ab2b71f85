#pragma once

#include <QWidget>

class QDoubleSpinBox;
class QSlider;

namespace plumbline {

// The one decision threshold that drives every chart and table: a slider and a box to type it
// in (steps of 0.005, the grid of the snapshot's operating points). A typed value takes effect
// on Return or when the box loses focus, never half-typed.
class ThresholdPanel : public QWidget {
    Q_OBJECT
public:
    explicit ThresholdPanel(QWidget* parent = nullptr);

    double threshold() const { return m_threshold; }
    void setThreshold(double threshold);
    QSlider* slider() const { return m_slider; }
    QDoubleSpinBox* spinBox() const { return m_spin; }

signals:
    void thresholdChanged(double threshold);

private:
    QSlider* m_slider;
    QDoubleSpinBox* m_spin;
    double m_threshold = -1.0;
};

} // namespace plumbline
