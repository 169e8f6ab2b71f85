#include "panels/settings_panel.hpp"

#include "intake/acceptable_criteria.hpp"
#include "intake/option_lists.hpp"
#include "files/settings_check.hpp"
#include "analyses/capacity_spec.hpp"

#include <QCheckBox>
#include <QComboBox>
#include <QDoubleSpinBox>
#include <QFormLayout>
#include <QGroupBox>
#include <QHBoxLayout>
#include <QLabel>
#include <QLineEdit>
#include <QPushButton>
#include <QRegularExpressionValidator>
#include <QScrollArea>
#include <QSpinBox>
#include <QVBoxLayout>

#include <limits>

namespace plumbline {

namespace {

// A line edit about `characters` wide, not stretched across the window.
QLineEdit* textField(int characters)
{
    auto* field = new QLineEdit;
    field->setMinimumWidth(field->fontMetrics().horizontalAdvance(QLatin1Char('x')) * characters);
    field->setSizePolicy(QSizePolicy::Preferred, QSizePolicy::Fixed);
    return field;
}

QFormLayout* naturalForm(QWidget* parent)
{
    auto* form = new QFormLayout(parent);
    form->setFieldGrowthPolicy(QFormLayout::FieldsStayAtSizeHint);
    form->setLabelAlignment(Qt::AlignRight | Qt::AlignVCenter);
    return form;
}

} // namespace

SettingsPanel::SettingsPanel(QWidget* parent)
    : QWidget(parent)
    , m_replicates(new QSpinBox)
    , m_seed(textField(22))
    , m_ciMethod(new QComboBox)
    , m_confidence(new QDoubleSpinBox)
    , m_cInterval(new QComboBox)
    , m_binomialInterval(new QComboBox)
    , m_groups(new QSpinBox)
    , m_thresholds(textField(24))
    , m_nriCuts(textField(24))
    , m_decisionRange(textField(24))
    , m_stratified(new QCheckBox(tr("Resample patients with and without the event separately")))
    , m_title(textField(60))
    , m_model(textField(60))
    , m_outcome(textField(60))
    , m_population(textField(60))
    , m_period(textField(60))
    , m_notes(textField(60))
    , m_minimumCell(new QSpinBox)
    , m_periodUnit(new QComboBox)
    , m_dateFormat(new QComboBox)
    , m_capacity(textField(24))
    , m_cusumOdds(textField(24))
    , m_acceptable(textField(30))
    , m_cusumYears(new QDoubleSpinBox)
    , m_problem(new QLabel)
{
    auto* boxes = new QWidget;
    auto* boxesLayout = new QHBoxLayout(boxes);
    boxesLayout->addWidget(buildAnalysisBox(), 0, Qt::AlignTop);
    boxesLayout->addWidget(buildReportBox(), 0, Qt::AlignTop);
    boxesLayout->addStretch(1);
    // The options scroll when the tab is short; Re-run and any problem stay in view.
    auto* scroll = new QScrollArea;
    scroll->setWidget(boxes);
    scroll->setWidgetResizable(true);
    scroll->setFrameShape(QFrame::NoFrame);
    m_problem->setStyleSheet(QStringLiteral("color: #b00020"));
    m_problem->setWordWrap(true);
    auto* rerun = new QPushButton(tr("&Re-run with these settings"));
    auto* bottom = new QHBoxLayout;
    bottom->addWidget(rerun);
    bottom->addWidget(m_problem, 1);
    auto* layout = new QVBoxLayout(this);
    layout->setContentsMargins(4, 4, 4, 4);
    layout->addWidget(scroll, 1);
    layout->addLayout(bottom);
    connect(rerun, &QPushButton::clicked, this, [this] {
        if (request())
            emit rerunRequested();
    });
    setRequest(AnalysisRequest{}); // the documented defaults, shared with the command line
}

QWidget* SettingsPanel::buildAnalysisBox()
{
    m_replicates->setRange(0, 20000);
    m_replicates->setSpecialValueText(tr("0 (analytic intervals only)"));
    m_seed->setValidator(new QRegularExpressionValidator(QRegularExpression(QStringLiteral("[0-9]{1,19}")), m_seed));
    m_ciMethod->addItem(tr("BCa (bias-corrected and accelerated)"), int(BootstrapCi::Bca));
    m_ciMethod->addItem(tr("Percentile"), int(BootstrapCi::Percentile));
    m_confidence->setRange(0.5, 0.999);
    m_confidence->setDecimals(3);
    m_confidence->setSingleStep(0.01);
    m_cInterval->addItem(tr("DeLong, on the logit scale"), int(CStatisticScale::Logit));
    m_cInterval->addItem(tr("DeLong, C ± z·SE"), int(CStatisticScale::Plain));
    m_binomialInterval->addItem(tr("Wilson"), int(CiMethod::Wilson));
    m_binomialInterval->addItem(tr("Clopper–Pearson (exact)"), int(CiMethod::ClopperPearson));
    m_groups->setRange(2, 100);
    m_thresholds->setPlaceholderText(QStringLiteral("0.1, 0.2, 0.3"));
    m_nriCuts->setPlaceholderText(tr("the thresholds above"));
    m_decisionRange->setPlaceholderText(tr("from, to, step: 0.05, 0.5, 0.01"));
    m_minimumCell->setRange(1, 1000);
    m_periodUnit->addItem(tr("Month"), int(PeriodUnit::Month));
    m_periodUnit->addItem(tr("Quarter"), int(PeriodUnit::Quarter));
    // No guessing between day-first and month-first: 03/04/2025 is refused until the user says.
    m_dateFormat->addItem(tr("YYYY-MM-DD only"), -1);
    m_dateFormat->addItem(tr("DD/MM/YYYY"), int(DateFormat::DayFirst));
    m_dateFormat->addItem(tr("MM/DD/YYYY"), int(DateFormat::MonthFirst));
    m_cusumOdds->setPlaceholderText(tr("worse, better: 2, 0.5"));
    m_cusumYears->setRange(0.1, 50.0);
    m_cusumYears->setDecimals(1);
    m_cusumYears->setSuffix(tr(" years"));
    auto* box = new QGroupBox(tr("Analysis"));
    QFormLayout* form = naturalForm(box);
    form->addRow(tr("Bootstrap &replicates:"), m_replicates);
    form->addRow(tr("&Seed:"), m_seed);
    form->addRow(tr("Bootstrap &interval:"), m_ciMethod);
    form->addRow(QString(), m_stratified);
    form->addRow(tr("&Confidence level:"), m_confidence);
    form->addRow(tr("C statistic's inter&val:"), m_cInterval);
    form->addRow(tr("Proportions' interva&l:"), m_binomialInterval);
    form->addRow(tr("Risk &groups:"), m_groups);
    form->addRow(tr("&Thresholds for the tables:"), m_thresholds);
    form->addRow(tr("NRI c&ut-points:"), m_nriCuts);
    form->addRow(tr("Decision curve r&ange:"), m_decisionRange);
    form->addRow(tr("Over time, &by:"), m_periodUnit);
    form->addRow(tr("Dates &written as:"), m_dateFormat);
    // A short placeholder that fits the field at 1280x720; the rest is in the tooltip.
    m_capacity->setPlaceholderText(tr("10% or 40/week"));
    m_capacity->setToolTip(tr("The patients the team can act on: the run adds the threshold that flags at most that many, per model "
                              "and period. A share such as 10%, or a number per day, week or month such as 40/week (needs a "
                              "period column). Empty: none."));
    form->addRow(tr("Capacit&y:"), m_capacity);
    form->addRow(tr("CUSUM &odds ratios:"), m_cusumOdds);
    m_acceptable->setObjectName(QStringLiteral("acceptable"));
    m_acceptable->setPlaceholderText(tr("c=0.7, oe=0.8:1.2, slope=0.8:1.2"));
    m_acceptable->setToolTip(tr("Acceptable performance in a new site, used with a site column: C at least c, O/E and the "
                                "calibration slope within their ranges; a measure not named keeps its default"));
    form->addRow(tr("Acceptable in a new sit&e:"), m_acceptable);
    form->addRow(tr("CUSUM run length (in control):"), m_cusumYears);
    form->addRow(tr("Suppress counts &below:"), m_minimumCell);
    return box;
}

QWidget* SettingsPanel::buildReportBox()
{
    m_title->setPlaceholderText(tr("e.g. External validation of the supplier's 30-day readmission score"));
    m_outcome->setPlaceholderText(tr("e.g. unplanned readmission to any network hospital within 30 days"));
    auto* box = new QGroupBox(tr("Report"));
    QFormLayout* form = naturalForm(box);
    form->addRow(tr("Report t&itle:"), m_title);
    form->addRow(tr("&Model and version:"), m_model);
    form->addRow(tr("O&utcome and horizon:"), m_outcome);
    form->addRow(tr("&Population:"), m_population);
    form->addRow(tr("Perio&d of the data:"), m_period);
    form->addRow(tr("Reviewer's &notes:"), m_notes);
    return box;
}

void SettingsPanel::setRequest(const AnalysisRequest& request)
{
    m_base = request;
    m_replicates->setValue(int(request.bootstrap.replicates));
    m_seed->setText(QString::number(request.bootstrap.seed));
    m_ciMethod->setCurrentIndex(m_ciMethod->findData(int(request.bootstrap.method)));
    m_stratified->setChecked(request.bootstrap.stratified);
    m_confidence->setValue(request.panel.confidence);
    m_cInterval->setCurrentIndex(m_cInterval->findData(int(request.panel.cStatisticScale)));
    m_binomialInterval->setCurrentIndex(m_binomialInterval->findData(int(request.panel.binomialInterval)));
    m_groups->setValue(int(request.panel.riskGroups));
    m_thresholds->setText(QString::fromStdString(riskListText(request.panel.thresholds)));
    m_nriCuts->setText(QString::fromStdString(riskListText(request.panel.nriCutPoints)));
    m_decisionRange->setText(QString::fromStdString(
        riskListText({request.panel.decisionFrom, request.panel.decisionTo, request.panel.decisionStep})));
    m_title->setText(QString::fromStdString(request.report.title));
    m_model->setText(QString::fromStdString(request.report.model));
    m_outcome->setText(QString::fromStdString(request.report.outcome));
    m_population->setText(QString::fromStdString(request.report.population));
    m_period->setText(QString::fromStdString(request.report.period));
    m_notes->setText(QString::fromStdString(request.report.notes));
    m_minimumCell->setValue(int(request.minimumCell));
    m_periodUnit->setCurrentIndex(m_periodUnit->findData(int(request.panel.periodUnit)));
    m_dateFormat->setCurrentIndex(m_dateFormat->findData(request.panel.dateFormat ? int(*request.panel.dateFormat) : -1));
    m_capacity->setText(request.panel.capacity ? QString::fromStdString(capacityText(*request.panel.capacity)) : QString());
    m_cusumOdds->setText(QString::fromStdString(riskListText({request.panel.monitoring.worseOdds, request.panel.monitoring.betterOdds})));
    m_cusumYears->setValue(request.panel.monitoring.targetYears);
    m_acceptable->setText(QString::fromStdString(acceptableCriteriaText(request.panel.acceptable)));
    m_problem->clear();
}

std::optional<AnalysisRequest> SettingsPanel::request() const
{
    AnalysisRequest out = m_base;
    out.bootstrap.replicates = std::size_t(m_replicates->value());
    bool seedRead = false;
    out.bootstrap.seed = m_seed->text().toULongLong(&seedRead);
    out.bootstrap.method = BootstrapCi(m_ciMethod->currentData().toInt());
    out.bootstrap.stratified = m_stratified->isChecked();
    out.panel.confidence = m_confidence->value();
    out.panel.cStatisticScale = CStatisticScale(m_cInterval->currentData().toInt());
    out.panel.binomialInterval = CiMethod(m_binomialInterval->currentData().toInt());
    out.report = {m_title->text().toStdString(), m_model->text().toStdString(), m_outcome->text().toStdString(),
                  m_population->text().toStdString(), m_period->text().toStdString(), m_notes->text().toStdString()};
    out.minimumCell = std::size_t(m_minimumCell->value());
    out.panel.minimumCell = out.minimumCell;
    out.panel.simulationSeed = out.bootstrap.seed; // the draws for a new site's acceptability (--cluster)
    out.panel.periodUnit = PeriodUnit(m_periodUnit->currentData().toInt());
    const int dateFormat = m_dateFormat->currentData().toInt();
    out.panel.dateFormat = dateFormat < 0 ? std::nullopt : std::optional<DateFormat>(DateFormat(dateFormat));
    out.panel.riskGroups = std::size_t(m_groups->value());
    const auto thresholds = parseRiskList(m_thresholds->text().toStdString(), "Thresholds");
    const auto cuts = parseRiskList(m_nriCuts->text().toStdString(), "NRI cut-point");
    const auto range = parseDecisionRange(m_decisionRange->text().toStdString(), "The decision curve range");
    if (!seedRead || !thresholds || !cuts || !range) {
        m_problem->setText(!seedRead ? tr("The seed must be a whole number, e.g. 20240101.")
                                     : QString::fromStdString((!thresholds ? thresholds.error() : !cuts ? cuts.error() : range.error()).message()));
        return std::nullopt;
    }
    const auto odds = parseOddsRatioPair(m_cusumOdds->text().toStdString(), "CUSUM odds ratios");
    if (!odds) {
        m_problem->setText(QString::fromStdString(odds.error().message()));
        return std::nullopt;
    }
    // The same parser as --acceptable and the analysis file; empty keeps the defaults.
    const std::string acceptableText = m_acceptable->text().trimmed().toStdString();
    const auto acceptable = acceptableText.empty() ? std::expected<AcceptableCriteria, InputError>(AcceptableCriteria{})
                                                   : parseAcceptableCriteria(acceptableText, "Acceptable in a new site");
    if (!acceptable) {
        m_problem->setText(QString::fromStdString(acceptable.error().message()));
        return std::nullopt;
    }
    out.panel.acceptable = *acceptable;
    out.panel.monitoring.worseOdds = odds->worse;
    out.panel.monitoring.betterOdds = odds->better;
    out.panel.monitoring.targetYears = m_cusumYears->value();
    out.panel.thresholds = *thresholds;
    out.panel.nriCutPoints = *cuts;
    out.panel.decisionFrom = range->from;
    out.panel.decisionTo = range->to;
    out.panel.decisionStep = range->step;
    out.panel.capacity.reset();
    if (const QString capacity = m_capacity->text().trimmed(); !capacity.isEmpty()) {
        const auto spec = parseCapacity(capacity.toStdString(), "The capacity");
        if (!spec) {
            m_problem->setText(QString::fromStdString(spec.error().message()));
            return std::nullopt;
        }
        out.panel.capacity = *spec;
    }
    // The same bounds as the command line and analysis files (50 thresholds, 1,000 points on
    // the decision curve, …), in the Settings tab's words.
    if (const auto checked = checkAnalysisSettings(out.toAnalysisFile(), SettingsSource::Window); !checked) {
        m_problem->setText(QString::fromStdString(checked.error().message()));
        return std::nullopt;
    }
    m_problem->clear();
    return out;
}

} // namespace plumbline
