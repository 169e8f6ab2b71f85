#include "settings_panel.hpp"

#include "field_values.hpp"

#include <QCheckBox>
#include <QComboBox>
#include <QDoubleSpinBox>
#include <QFormLayout>
#include <QLabel>
#include <QLineEdit>
#include <QPushButton>
#include <QSpinBox>
#include <QStringList>

#include <limits>

namespace plumbline {

SettingsPanel::SettingsPanel(QWidget* parent)
    : QWidget(parent)
    , m_replicates(new QSpinBox)
    , m_seed(new QSpinBox)
    , m_ciMethod(new QComboBox)
    , m_confidence(new QDoubleSpinBox)
    , m_groups(new QSpinBox)
    , m_thresholds(new QLineEdit)
    , m_stratified(new QCheckBox(tr("Resample patients with and without the event separately")))
    , m_title(new QLineEdit)
    , m_model(new QLineEdit)
    , m_outcome(new QLineEdit)
    , m_population(new QLineEdit)
    , m_period(new QLineEdit)
    , m_notes(new QLineEdit)
    , m_minimumCell(new QSpinBox)
    , m_periodUnit(new QComboBox)
    , m_dateFormat(new QComboBox)
    , m_problem(new QLabel)
{
    m_minimumCell->setRange(1, 1000);
    m_periodUnit->addItem(tr("Month"), int(PeriodUnit::Month));
    m_periodUnit->addItem(tr("Quarter"), int(PeriodUnit::Quarter));
    // No guessing between day-first and month-first: 03/04/2025 is refused until the user says.
    m_dateFormat->addItem(tr("YYYY-MM-DD only"), -1);
    m_dateFormat->addItem(tr("DD/MM/YYYY"), int(DateFormat::DayFirst));
    m_dateFormat->addItem(tr("MM/DD/YYYY"), int(DateFormat::MonthFirst));
    m_title->setPlaceholderText(tr("e.g. External validation of the supplier's 30-day readmission score"));
    m_outcome->setPlaceholderText(tr("e.g. unplanned readmission to any network hospital within 30 days"));
    m_replicates->setRange(0, 20000);
    m_replicates->setSpecialValueText(tr("0 (analytic intervals only)"));
    m_seed->setRange(0, std::numeric_limits<int>::max());
    m_ciMethod->addItem(tr("BCa (bias-corrected and accelerated)"), QStringLiteral("bca"));
    m_ciMethod->addItem(tr("Percentile"), QStringLiteral("percentile"));
    m_confidence->setRange(0.5, 0.999);
    m_confidence->setDecimals(3);
    m_confidence->setSingleStep(0.01);
    m_groups->setRange(2, 100);
    m_thresholds->setPlaceholderText(QStringLiteral("0.1, 0.2, 0.3"));
    m_problem->setStyleSheet(QStringLiteral("color: #b00020"));
    m_problem->setWordWrap(true);
    auto* rerun = new QPushButton(tr("&Re-run"));
    auto* form = new QFormLayout(this);
    form->addRow(tr("Bootstrap &replicates:"), m_replicates);
    form->addRow(tr("&Seed:"), m_seed);
    form->addRow(tr("Bootstrap &interval:"), m_ciMethod);
    form->addRow(tr("&Confidence level:"), m_confidence);
    form->addRow(tr("Risk &groups:"), m_groups);
    form->addRow(tr("&Thresholds for the table:"), m_thresholds);
    form->addRow(QString(), m_stratified);
    form->addRow(tr("Report t&itle:"), m_title);
    form->addRow(tr("Model and &version:"), m_model);
    form->addRow(tr("O&utcome and horizon:"), m_outcome);
    form->addRow(tr("&Population:"), m_population);
    form->addRow(tr("Perio&d:"), m_period);
    form->addRow(tr("Reviewer's &notes:"), m_notes);
    form->addRow(tr("Suppress counts &below:"), m_minimumCell);
    form->addRow(tr("Over time, by:"), m_periodUnit);
    form->addRow(tr("Dates &written as:"), m_dateFormat);
    form->addRow(QString(), rerun);
    form->addRow(QString(), m_problem);
    connect(rerun, &QPushButton::clicked, this, [this] {
        if (request())
            emit rerunRequested();
    });
}

void SettingsPanel::setRequest(const AnalysisRequest& request)
{
    m_base = request;
    m_replicates->setValue(int(request.bootstrap.replicates));
    m_seed->setValue(int(request.bootstrap.seed % std::uint64_t(std::numeric_limits<int>::max())));
    m_ciMethod->setCurrentIndex(request.bootstrap.method == BootstrapCi::Bca ? 0 : 1);
    m_confidence->setValue(request.panel.confidence);
    m_groups->setValue(int(request.panel.riskGroups));
    QStringList thresholds;
    for (double t : request.panel.thresholds)
        thresholds << QString::number(t);
    m_thresholds->setText(thresholds.join(QStringLiteral(", ")));
    m_stratified->setChecked(request.bootstrap.stratified);
    m_title->setText(QString::fromStdString(request.report.title));
    m_model->setText(QString::fromStdString(request.report.model));
    m_outcome->setText(QString::fromStdString(request.report.outcome));
    m_population->setText(QString::fromStdString(request.report.population));
    m_period->setText(QString::fromStdString(request.report.period));
    m_notes->setText(QString::fromStdString(request.report.notes));
    m_minimumCell->setValue(int(request.minimumCell));
    m_periodUnit->setCurrentIndex(m_periodUnit->findData(int(request.panel.periodUnit)));
    m_dateFormat->setCurrentIndex(m_dateFormat->findData(request.panel.dateFormat ? int(*request.panel.dateFormat) : -1));
    m_problem->clear();
}

std::optional<AnalysisRequest> SettingsPanel::request() const
{
    AnalysisRequest out = m_base;
    out.bootstrap.replicates = std::size_t(m_replicates->value());
    out.bootstrap.seed = std::uint64_t(m_seed->value());
    out.bootstrap.method = m_ciMethod->currentData().toString() == QStringLiteral("bca") ? BootstrapCi::Bca : BootstrapCi::Percentile;
    out.bootstrap.stratified = m_stratified->isChecked();
    out.panel.confidence = m_confidence->value();
    out.report = {m_title->text().toStdString(), m_model->text().toStdString(), m_outcome->text().toStdString(),
                  m_population->text().toStdString(), m_period->text().toStdString(), m_notes->text().toStdString()};
    out.minimumCell = std::size_t(m_minimumCell->value());
    out.panel.periodUnit = PeriodUnit(m_periodUnit->currentData().toInt());
    const int dateFormat = m_dateFormat->currentData().toInt();
    out.panel.dateFormat = dateFormat < 0 ? std::nullopt : std::optional<DateFormat>(DateFormat(dateFormat));
    out.panel.riskGroups = std::size_t(m_groups->value());
    out.panel.thresholds.clear();
    for (const QString& item : m_thresholds->text().split(QLatin1Char(','), Qt::SkipEmptyParts)) {
        const auto value = parseNumber(item.trimmed().toStdString(), false);
        if (!value || !(*value > 0.0 && *value < 1.0)) {
            m_problem->setText(tr("Threshold '%1' is not a risk strictly between 0 and 1. Give thresholds as "
                                  "probabilities separated by commas, e.g. 0.1, 0.2, 0.3.").arg(item.trimmed()));
            return std::nullopt;
        }
        out.panel.thresholds.push_back(*value);
    }
    m_problem->clear();
    return out;
}

} // namespace plumbline
