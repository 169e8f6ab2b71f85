#include "panels/updating_panel.hpp"

#include "metrics/metric_reading.hpp"
#include "charts/roc_chart_view.hpp"
#include "reporting/value_text.hpp"
#include "charts/update_calibration_view.hpp"

#include <QComboBox>
#include <QFormLayout>
#include <QHBoxLayout>
#include <QHeaderView>
#include <QLabel>
#include <QPushButton>
#include <QScrollArea>
#include <QSpinBox>
#include <QTableWidget>
#include <QVBoxLayout>
#include <QtConcurrent/QtConcurrentRun>

namespace plumbline {

UpdatingPanel::UpdatingPanel(QWidget* parent)
    : QWidget(parent)
    , m_model(new QComboBox)
    , m_method(new QComboBox)
    , m_replicates(new QSpinBox)
    , m_run(new QPushButton(tr("&Update the model")))
    , m_formula(new QLabel)
    , m_atThreshold(new QLabel)
    , m_cautions(new QLabel)
    , m_optimism(new QTableWidget)
    , m_chart(new UpdateCalibrationView)
{
    m_method->addItem(tr("Closed test (choose by likelihood-ratio tests)"), int(UpdateMethod::ClosedTest));
    m_method->addItem(tr("Recalibration in the large (new intercept)"), int(UpdateMethod::Intercept));
    m_method->addItem(tr("Logistic recalibration (intercept and slope)"), int(UpdateMethod::Logistic));
    m_replicates->setRange(10, 2000);
    m_replicates->setValue(200);
    m_formula->setTextInteractionFlags(Qt::TextSelectableByMouse);
    m_formula->setWordWrap(true);
    m_atThreshold->setWordWrap(true);
    m_cautions->setWordWrap(true);
    m_cautions->setStyleSheet(QStringLiteral("color:#5a4500; background:#fff8e1; padding:4px;"));
    m_optimism->setColumnCount(4);
    m_optimism->setHorizontalHeaderLabels({tr("Metric"), tr("Apparent"), tr("Optimism"), tr("Corrected")});
    m_optimism->verticalHeader()->hide();
    m_optimism->setEditTriggers(QAbstractItemView::NoEditTriggers);
    m_optimism->horizontalHeader()->setSectionResizeMode(QHeaderView::ResizeToContents);
    m_optimism->setAccessibleName(tr("Apparent and optimism-corrected performance"));
    auto* form = new QFormLayout;
    form->addRow(tr("&Model:"), m_model);
    form->addRow(tr("M&ethod:"), m_method);
    form->addRow(tr("Bootstrap refits for the &optimism:"), m_replicates);
    form->addRow(QString(), m_run);
    // The controls and results keep their natural height and scroll when the tab is short.
    auto* leftWidget = new QWidget;
    auto* left = new QVBoxLayout(leftWidget);
    left->addLayout(form);
    left->addWidget(m_formula);
    m_optimism->setMinimumHeight(170);
    left->addWidget(m_optimism);
    left->addWidget(m_atThreshold);
    left->addWidget(m_cautions);
    auto* scroll = new QScrollArea;
    scroll->setWidget(leftWidget);
    scroll->setWidgetResizable(true);
    scroll->setFrameShape(QFrame::NoFrame);
    auto* layout = new QHBoxLayout(this);
    layout->addWidget(scroll, 1);
    layout->addWidget(m_chart, 1);
    connect(m_run, &QPushButton::clicked, this, &UpdatingPanel::runUpdate);
    connect(&m_watcher, &QFutureWatcherBase::finished, this, [this] {
        m_run->setEnabled(true);
        m_update = m_watcher.result();
        showUpdate();
        emit updateFinished();
    });
    showUpdate();
}

UpdatingPanel::~UpdatingPanel()
{
    m_watcher.waitForFinished();
}

void UpdatingPanel::setSnapshot(SnapshotPointer snapshot)
{
    m_snapshot = std::move(snapshot);
    m_update.reset();
    m_model->clear();
    const bool risks = m_snapshot && m_snapshot->cohort && scaleIsProbabilistic(m_snapshot->cohort->scale);
    if (risks)
        for (const auto& model : m_snapshot->cohort->models)
            m_model->addItem(QString::fromStdString(model.name));
    m_run->setEnabled(risks);
    showUpdate();
}

void UpdatingPanel::setThreshold(double threshold)
{
    m_threshold = threshold;
    m_chart->setThreshold(threshold);
    showUpdate();
}

QString UpdatingPanel::formulaText() const
{
    return m_formula->text();
}

void UpdatingPanel::runUpdate()
{
    if (!m_snapshot || !m_snapshot->cohort || m_model->currentIndex() < 0 || m_watcher.isRunning())
        return;
    UpdateSettings settings;
    settings.method = UpdateMethod(m_method->currentData().toInt());
    settings.optimismReplicates = std::size_t(m_replicates->value());
    settings.seed = m_snapshot->request.bootstrap.seed;
    settings.riskGroups = m_snapshot->request.panel.riskGroups;
    settings.confidence = m_snapshot->request.panel.confidence;
    const std::shared_ptr<const Cohort> cohort = m_snapshot->cohort;
    const std::size_t model = std::size_t(m_model->currentIndex());
    m_run->setEnabled(false);
    m_formula->setText(tr("Updating…"));
    m_watcher.setFuture(QtConcurrent::run([cohort, model, settings] {
        return updateModel(cohort->outcome, cohort->models[model].values, cohort->models[model].name, settings);
    }));
}

void UpdatingPanel::showUpdate()
{
    m_optimism->setRowCount(0);
    QStringList cautions;
    if (!m_update) {
        m_formula->setText(m_snapshot ? tr("Choose a model and a method, then Update.") : tr("Open a cohort first."));
        m_atThreshold->clear();
        m_cautions->setText(tr("An updated model judged on the patients it was fitted on looks better than it will on new "
                               "patients: read the optimism-corrected column."));
        return;
    }
    const ModelUpdate& u = *m_update;
    QString text = tr("<b>%1</b>: %2<br><tt>%3</tt>")
                       .arg(QString::fromStdString(u.model).toHtmlEscaped(), QString::fromLatin1(updateChoiceName(u.fit.choice).data()),
                            QString::fromStdString(u.fit.formula()).toHtmlEscaped());
    if (u.fit.tests)
        text += tr("<br>Closed test: intercept and slope jointly %1; slope given intercept %2.")
                    .arg(QString::fromStdString(pValueText(u.fit.tests->joint->pValue)).toHtmlEscaped(),
                         QString::fromStdString(pValueText(u.fit.tests->slopeGivenIntercept->pValue)).toHtmlEscaped());
    m_formula->setText(text);
    for (const auto& row : u.optimism) {
        const int r = m_optimism->rowCount();
        m_optimism->insertRow(r);
        const QStringList cells{QString::fromStdString(metricLabel(row.key)), QString::fromStdString(fixedText(row.apparent, 4)),
                                QString::fromStdString(fixedText(row.optimism, 4)), QString::fromStdString(fixedText(row.corrected, 4))};
        for (int c = 0; c < cells.size(); ++c)
            m_optimism->setItem(r, c, new QTableWidgetItem(cells[c]));
    }
    for (const auto& caution : u.cautions)
        cautions << QString::fromStdString(caution);
    m_cautions->setText(cautions.join(QLatin1Char('\n')));
    const int modelIndex = m_model->currentIndex();
    m_chart->setGroups(u.originalGroups, u.updatedGroups, std::max(0, modelIndex));
    m_chart->setThreshold(m_threshold);
    if (m_snapshot && modelIndex >= 0 && !u.updatedOperatingPoints.empty()) {
        const auto& before = m_snapshot->validation.models[std::size_t(modelIndex)].operatingPoints;
        const std::size_t k = std::min(operatingPointIndex(m_threshold), u.updatedOperatingPoints.size() - 1);
        const OperatingPointSummary b = summarise(before[k]), a = summarise(u.updatedOperatingPoints[k]);
        m_atThreshold->setText(tr("At threshold %1: flagged %2 % before, %3 % after; net benefit %4 before, %5 after.")
                                   .arg(m_threshold, 0, 'f', 3)
                                   .arg(100.0 * b.flagRate, 0, 'f', 1)
                                   .arg(100.0 * a.flagRate, 0, 'f', 1)
                                   .arg(QString::fromStdString(fixedText(b.netBenefit, 4)))
                                   .arg(QString::fromStdString(fixedText(a.netBenefit, 4))));
    }
}

} // namespace plumbline
