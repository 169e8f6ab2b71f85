#include "panels/threshold_panel.hpp"

#include "analyses/panel_settings.hpp"

#include <QDoubleSpinBox>
#include <QHBoxLayout>
#include <QLabel>
#include <QSignalBlocker>
#include <QSlider>

#include <algorithm>
#include <cmath>

namespace plumbline {

namespace {
constexpr int steps = 200; // 0.005 per step, the grid of the snapshot's operating points
}

ThresholdPanel::ThresholdPanel(QWidget* parent)
    : QWidget(parent)
    , m_slider(new QSlider(Qt::Horizontal))
    , m_spin(new QDoubleSpinBox)
{
    m_slider->setRange(0, steps);
    m_slider->setSingleStep(1);
    m_slider->setPageStep(10);
    m_slider->setAccessibleName(tr("Decision threshold"));
    m_spin->setRange(0.0, 1.0);
    m_spin->setDecimals(3);
    m_spin->setSingleStep(0.005);
    // Typing "0.3" passes through "0" and "0.": only a finished value may move the charts.
    m_spin->setKeyboardTracking(false);
    m_spin->setAccessibleName(tr("Decision threshold value"));
    m_spin->setToolTip(tr("Type a threshold and press Return, or use the arrows (steps of 0.005)"));
    auto* label = new QLabel(tr("&Decision threshold (flag if risk ≥):"));
    label->setBuddy(m_spin);
    auto* row = new QHBoxLayout(this);
    row->setContentsMargins(0, 0, 0, 0);
    row->addWidget(label);
    row->addWidget(m_slider, 1);
    row->addWidget(m_spin);
    connect(m_slider, &QSlider::valueChanged, this, [this](int value) { setThreshold(double(value) / steps); });
    connect(m_spin, &QDoubleSpinBox::valueChanged, this, [this](double value) { setThreshold(value); });
    setThreshold(PanelSettings{}.decisionThreshold);
}

void ThresholdPanel::setThreshold(double value)
{
    const int step = static_cast<int>(std::lround(std::clamp(value, 0.0, 1.0) * steps));
    const double snapped = double(step) / steps;
    const bool changed = snapped != m_threshold;
    {
        const QSignalBlocker blockSlider(m_slider);
        const QSignalBlocker blockSpin(m_spin);
        m_slider->setValue(step);
        m_spin->setValue(snapped);
    }
    m_threshold = snapped;
    if (changed)
        emit thresholdChanged(snapped);
}

} // namespace plumbline
