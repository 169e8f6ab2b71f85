#include "panels/threshold_panel.hpp"

#include "analyses/panel_settings.hpp"
#include "reporting/cautions.hpp"

#include <QComboBox>
#include <QDoubleSpinBox>
#include <QHBoxLayout>
#include <QLabel>
#include <QLineEdit>
#include <QLocale>
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
    , m_capacityModel(new QComboBox)
    , m_capacity(new QLineEdit)
    , m_capacityNote(new QLabel)
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
    // The capacity box: what the threshold means for a team that works to a number of patients.
    auto* capacityLabel = new QLabel(tr("Ca&pacity:"));
    capacityLabel->setBuddy(m_capacity);
    m_capacity->setAccessibleName(tr("Capacity"));
    m_capacity->setToolTip(tr("Patients flagged at the threshold. Type a capacity (10% of patients, or 40/week, 8/day, "
                              "160/month with dates) and press Return to move the threshold to the one that flags at most that many"));
    m_capacity->setPlaceholderText(tr("e.g. 10% or 40/week"));
    m_capacity->setMaximumWidth(110);
    m_capacityModel->setAccessibleName(tr("Model of the capacity box"));
    m_capacityModel->setSizeAdjustPolicy(QComboBox::AdjustToContents); // a model's name in full
    m_capacityModel->setToolTip(tr("The model whose flagged patients the capacity box counts"));
    row->addWidget(capacityLabel);
    row->addWidget(m_capacity);
    row->addWidget(m_capacityModel);
    row->addWidget(m_capacityNote);
    for (QWidget* w : std::initializer_list<QWidget*>{m_capacity, m_capacityModel, m_capacityNote})
        w->setEnabled(false); // until a result arrives
    connect(m_slider, &QSlider::valueChanged, this, [this](int value) { setThreshold(double(value) / steps); });
    connect(m_spin, &QDoubleSpinBox::valueChanged, this, [this](double value) { setThreshold(value); });
    connect(m_capacity, &QLineEdit::returnPressed, this, &ThresholdPanel::applyCapacity);
    connect(m_capacityModel, &QComboBox::currentIndexChanged, this, [this] {
        m_typed.clear();
        showCapacity();
    });
    setThreshold(PanelSettings{}.decisionThreshold);
}

void ThresholdPanel::setSnapshot(SnapshotPointer snapshot)
{
    m_snapshot = std::move(snapshot);
    const int kept = m_capacityModel->currentIndex();
    {
        const QSignalBlocker block(m_capacityModel);
        m_capacityModel->clear();
        if (m_snapshot)
            for (const auto& name : m_snapshot->capacity.models)
                m_capacityModel->addItem(QString::fromStdString(name));
        m_capacityModel->setCurrentIndex(kept >= 0 && kept < m_capacityModel->count() ? kept : 0);
    }
    const bool usable = m_snapshot && !m_snapshot->capacity.models.empty();
    m_capacity->setEnabled(usable);
    m_capacityModel->setEnabled(usable);
    m_capacityNote->setEnabled(usable);
    // A run with a capacity (Settings → Capacity): the box shows it and the slider moves to its
    // threshold, once per run.
    const void* run = m_snapshot ? static_cast<const void*>(m_snapshot->cohort.get()) : nullptr;
    if (usable && m_snapshot->validation.capacity && run != m_capacityRun) {
        m_capacityRun = run;
        {
            const QSignalBlocker block(m_capacity);
            m_capacity->setText(QString::fromStdString(m_snapshot->validation.capacity->text));
        }
        applyCapacity();
        return;
    }
    showCapacity();
}

// The box follows the threshold: a look-up in the snapshot, never a computation here.
void ThresholdPanel::showCapacity()
{
    const int model = m_capacityModel->currentIndex();
    if (!m_snapshot || model < 0 || std::size_t(model) >= m_snapshot->capacity.models.size()) {
        m_capacity->clear();
        m_capacityNote->clear();
        return;
    }
    const CapacityLookup& lookup = m_snapshot->capacity;
    const QSignalBlocker block(m_capacity);
    // What the user typed stays while the threshold is the one it set; the note beside it says
    // what that threshold achieves. A moved slider shows what the new threshold flags instead.
    if (!m_typed.isEmpty() && m_threshold == m_typedThreshold && model == m_typedModel)
        m_capacity->setText(m_typed);
    else {
        m_typed.clear();
        m_capacity->setText(QString::fromStdString(capacityText(lookup.capacityAt(std::size_t(model), m_threshold))));
    }
    m_capacityNote->setText(tr("flags %1 of %2")
                                .arg(QLocale().toString(qulonglong(lookup.flaggedAt(std::size_t(model), m_threshold))))
                                .arg(QLocale().toString(qulonglong(lookup.patients))));
    m_capacityNote->setToolTip(QString::fromUtf8(capacityCaution.data(), qsizetype(capacityCaution.size())));
}

// A typed capacity moves the threshold; a text that is not one says why and moves nothing.
void ThresholdPanel::applyCapacity()
{
    const int model = m_capacityModel->currentIndex();
    if (!m_snapshot || model < 0)
        return;
    const auto spec = parseCapacity(m_capacity->text().toStdString(), "The capacity");
    if (!spec) {
        m_capacityNote->setText(tr("not a capacity"));
        m_capacityNote->setToolTip(QString::fromStdString(spec.error().message()));
        return;
    }
    const CapacityLookup& lookup = m_snapshot->capacity;
    const auto allowed = lookup.patientsAllowed(*spec);
    if (!allowed) {
        m_capacityNote->setText(tr("needs dates"));
        m_capacityNote->setToolTip(tr("A capacity per day, week or month needs the cohort's dates: choose a period column "
                                      "in Settings, or type a share such as 10%."));
        return;
    }
    const double before = m_threshold;
    const double target = double(std::lround(std::clamp(lookup.thresholdFor(std::size_t(model), *allowed), 0.0, 1.0) * steps)) / steps;
    m_typed = m_capacity->text().trimmed();
    m_typedThreshold = target;
    m_typedModel = model;
    setThreshold(target);
    if (m_threshold == before)
        showCapacity(); // no change of threshold: still show what it flags
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
    if (changed) {
        showCapacity();
        emit thresholdChanged(snapped);
    }
}

} // namespace plumbline
