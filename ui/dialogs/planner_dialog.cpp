#include "dialogs/planner_dialog.hpp"

#include "intake/field_values.hpp"
#include "metrics/metric_reading.hpp"
#include "analyses/sample_size.hpp"

#include <QDialogButtonBox>
#include <QDoubleSpinBox>
#include <QFontDatabase>
#include <QFormLayout>
#include <QLabel>
#include <QLineEdit>
#include <QPlainTextEdit>
#include <QVBoxLayout>

namespace plumbline {

PlannerDialog::PlannerDialog(QWidget* parent)
    : QDialog(parent)
    , m_prevalence(new QDoubleSpinBox)
    , m_c(new QDoubleSpinBox)
    , m_thresholds(new QLineEdit(QStringLiteral("0.1")))
    , m_achieved(new QLabel(tr("No cohort is loaded: open one to see the precision it achieves.")))
    , m_plan(new QPlainTextEdit)
{
    setWindowTitle(tr("Plan a sample size"));
    m_prevalence->setRange(0.001, 0.999);
    m_prevalence->setDecimals(3);
    m_prevalence->setSingleStep(0.01);
    m_prevalence->setValue(0.15);
    m_c->setRange(0.51, 0.99);
    m_c->setDecimals(3);
    m_c->setSingleStep(0.01);
    m_c->setValue(0.70);
    m_plan->setReadOnly(true);
    m_plan->setFont(QFontDatabase::systemFont(QFontDatabase::FixedFont));
    m_plan->setMinimumSize(640, 260);
    auto* form = new QFormLayout;
    form->addRow(tr("Anticipated outcome &proportion:"), m_prevalence);
    form->addRow(tr("Anticipated &C statistic:"), m_c);
    form->addRow(tr("&Thresholds for net benefit:"), m_thresholds);
    auto* buttons = new QDialogButtonBox(QDialogButtonBox::Close);
    auto* layout = new QVBoxLayout(this);
    m_achieved->setWordWrap(true);
    m_achieved->setTextInteractionFlags(Qt::TextSelectableByMouse);
    layout->addWidget(m_achieved);
    layout->addLayout(form);
    layout->addWidget(m_plan, 1);
    layout->addWidget(buttons);
    connect(buttons, &QDialogButtonBox::rejected, this, &QDialog::reject);
    connect(m_prevalence, &QDoubleSpinBox::valueChanged, this, &PlannerDialog::recompute);
    connect(m_c, &QDoubleSpinBox::valueChanged, this, &PlannerDialog::recompute);
    connect(m_thresholds, &QLineEdit::textChanged, this, &PlannerDialog::recompute);
    recompute();
}

void PlannerDialog::setInputs(double prevalence, double cStatistic, const QString& thresholds)
{
    m_prevalence->setValue(prevalence);
    m_c->setValue(cStatistic);
    m_thresholds->setText(thresholds);
    recompute();
}

void PlannerDialog::setAchieved(const std::vector<ValidationResult::PrecisionRow>& rows)
{
    QStringList lines{tr("Precision achieved on the loaded cohort (interval width against a common target):")};
    for (const auto& r : rows)
        lines << tr("  %1, %2: %3 (target %4, %5)")
                     .arg(QString::fromStdString(r.model), QString::fromStdString(metricLabel(r.metric)))
                     .arg(r.width, 0, 'f', 3)
                     .arg(r.target, 0, 'f', 2)
                     .arg(r.width <= r.target ? tr("met") : tr("not met"));
    m_achieved->setText(lines.join(QLatin1Char('\n')));
}

QString PlannerDialog::achievedText() const
{
    return m_achieved->text();
}

QString PlannerDialog::planText() const
{
    return m_plan->toPlainText();
}

void PlannerDialog::recompute()
{
    SampleSizeTargets targets;
    targets.thresholds.clear();
    for (const QString& item : m_thresholds->text().split(QLatin1Char(','), Qt::SkipEmptyParts)) {
        const auto value = parseNumber(item.trimmed().toStdString(), false);
        if (!value || !(*value > 0.0 && *value < 1.0)) {
            m_plan->setPlainText(tr("Threshold '%1' is not a risk strictly between 0 and 1. Give thresholds as probabilities "
                                    "separated by commas, e.g. 0.1, 0.2.").arg(item.trimmed()));
            return;
        }
        targets.thresholds.push_back(*value);
    }
    const auto plan = planSampleSize(m_prevalence->value(), m_c->value(), targets);
    m_plan->setPlainText(plan ? QString::fromStdString(describePlan(*plan, m_prevalence->value(), m_c->value(), targets))
                              : tr("The outcome proportion must lie between 0 and 1 and the C statistic between 0.5 and 1."));
}

} // namespace plumbline
