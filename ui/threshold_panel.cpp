#include "threshold_panel.hpp"

#include "threshold_summary_model.hpp"

#include <QDoubleSpinBox>
#include <QHBoxLayout>
#include <QHeaderView>
#include <QLabel>
#include <QSignalBlocker>
#include <QSlider>
#include <QTableView>
#include <QVBoxLayout>

#include <cmath>

namespace plumbline {

namespace {
constexpr int steps = 200; // 0.005 per step, the grid of the snapshot's operating points
}

ThresholdPanel::ThresholdPanel(QWidget* parent)
    : QWidget(parent)
    , m_slider(new QSlider(Qt::Horizontal))
    , m_spin(new QDoubleSpinBox)
    , m_table(new QTableView)
    , m_model(new ThresholdSummaryModel(this))
{
    m_slider->setRange(0, steps);
    m_slider->setSingleStep(1);
    m_slider->setPageStep(10);
    m_slider->setAccessibleName(tr("Decision threshold"));
    m_spin->setRange(0.0, 1.0);
    m_spin->setDecimals(3);
    m_spin->setSingleStep(0.005);
    m_spin->setAccessibleName(tr("Decision threshold value"));
    auto* label = new QLabel(tr("&Decision threshold (flag if risk ≥):"));
    label->setBuddy(m_slider);
    auto* row = new QHBoxLayout;
    row->addWidget(label);
    row->addWidget(m_slider, 1);
    row->addWidget(m_spin);
    m_table->setModel(m_model);
    m_table->verticalHeader()->hide();
    m_table->horizontalHeader()->setSectionResizeMode(QHeaderView::ResizeToContents);
    m_table->horizontalHeader()->setStretchLastSection(false);
    m_table->setSelectionMode(QAbstractItemView::NoSelection);
    m_table->setVerticalScrollBarPolicy(Qt::ScrollBarAlwaysOff);
    auto* layout = new QVBoxLayout(this);
    layout->setContentsMargins(0, 0, 0, 0);
    layout->addLayout(row);
    layout->addWidget(m_table);
    connect(m_slider, &QSlider::valueChanged, this, [this](int value) { setThreshold(double(value) / steps); });
    connect(m_spin, &QDoubleSpinBox::valueChanged, this, [this](double value) { setThreshold(value); });
    setThreshold(0.2);
}

void ThresholdPanel::setSnapshot(SnapshotPointer snapshot)
{
    m_model->setSnapshot(std::move(snapshot));
    m_model->setThreshold(threshold());
    // Tall enough for every model's row, no more.
    m_table->resizeRowsToContents();
    int height = m_table->horizontalHeader()->height() + 2 * m_table->frameWidth() + 2;
    for (int r = 0; r < m_model->rowCount(); ++r)
        height += m_table->rowHeight(r);
    m_table->setFixedHeight(height);
}

double ThresholdPanel::threshold() const
{
    return m_model->threshold();
}

void ThresholdPanel::setThreshold(double value)
{
    const int step = static_cast<int>(std::lround(std::clamp(value, 0.0, 1.0) * steps));
    const double snapped = double(step) / steps;
    const bool changed = snapped != m_model->threshold();
    {
        const QSignalBlocker blockSlider(m_slider);
        const QSignalBlocker blockSpin(m_spin);
        m_slider->setValue(step);
        m_spin->setValue(snapped);
    }
    m_model->setThreshold(snapped);
    if (changed)
        emit thresholdChanged(snapped);
}

} // namespace plumbline
