#include "main_window.hpp"

#include "intake/query_table.hpp"

#include "charts/calibration_chart_view.hpp"
#include "reporting/cautions.hpp"
#include "panels/cohort_panel.hpp"
#include "panels/comparison_panel.hpp"
#include "widgets/copyable_table_view.hpp"
#include "charts/decision_curve_view.hpp"
#include "widgets/elided_label.hpp"
#include "charts/exportable_chart_view.hpp"
#include "dialogs/guide_dialog.hpp"
#include "models/metric_table_model.hpp"
#include "widgets/metric_table_view.hpp"
#include "charts/model_palette.hpp"
#include "intake/option_lists.hpp"
#include "panels/overview_panel.hpp"
#include "panels/period_panel.hpp"
#include "panels/site_pooling_panel.hpp"
#include "panels/monitoring_panel.hpp"
#include "dialogs/planner_dialog.hpp"
#include "charts/roc_chart_view.hpp"
#include "panels/risk_groups_panel.hpp"
#include "panels/settings_panel.hpp"
#include "panels/subgroup_panel.hpp"
#include "panels/threshold_panel.hpp"
#include "panels/updating_panel.hpp"
#include "run/validation_task.hpp"
#include "reporting/value_text.hpp"
#include "files/version.hpp"

#include <QAction>
#include <QApplication>
#include <QCheckBox>
#include <QCloseEvent>
#include <QFileInfo>
#include <QHBoxLayout>
#include <QHeaderView>
#include <QLabel>
#include <QMenuBar>
#include <QMessageBox>
#include <QPixmap>
#include <QProgressBar>
#include <QPushButton>
#include <QScreen>
#include <QSettings>
#include <QStackedWidget>
#include <QStatusBar>
#include <QTabWidget>
#include <QTimer>
#include <QToolTip>
#include <QVBoxLayout>

namespace plumbline {

QString cautionText()
{
    QStringList parts;
    for (const auto caution : standardCautions)
        parts << QString::fromUtf8(caution.data(), int(caution.size()));
    return parts.join(QLatin1Char(' '));
}

MainWindow::MainWindow(QWidget* parent)
    : QMainWindow(parent)
    , m_task(new ValidationTask(this))
    , m_overviewPages(new QStackedWidget)
    , m_overview(new OverviewPanel)
    , m_threshold(new ThresholdPanel)
    , m_metrics(new MetricTableModel(this))
    , m_riskGroups(new RiskGroupsPanel)
    , m_cohort(new CohortPanel)
    , m_comparison(new ComparisonPanel)
    , m_updating(new UpdatingPanel)
    , m_decision(new DecisionCurveView)
    , m_subgroups(new SubgroupPanel)
    , m_periods(new PeriodPanel)
    , m_sites(new SitePoolingPanel)
    , m_monitoring(new MonitoringPanel)
    , m_settings(new SettingsPanel)
    , m_tabs(new QTabWidget)
    , m_toggles(new QHBoxLayout)
    , m_title(new ElidedLabel)
    , m_status(new ElidedLabel)
    , m_progress(new QProgressBar)
    , m_cancel(new QPushButton(tr("Cancel")))
    , m_recent(nullptr)
{
    setWindowTitle(tr("Plumbline"));
    setWindowIcon(QIcon(QStringLiteral(":/plumbline/icons/plumbline.svg")));
    setAcceptDrops(true);
    buildMenus();
    setCentralWidget(buildCentralArea());
    buildStatusBar();

    connect(m_threshold, &ThresholdPanel::thresholdChanged, this, &MainWindow::setThreshold);
    connect(m_task, &ValidationTask::progressed, this, [this](int percent, const QString& stage) {
        m_progress->setVisible(true);
        m_cancel->setVisible(true);
        m_progress->setValue(percent);
        m_status->setFullText(stage);
    });
    connect(m_task, &ValidationTask::panelReady, this, [this](SnapshotPointer snapshot) { showSnapshot(std::move(snapshot), false); });
    connect(m_task, &ValidationTask::finished, this, [this](SnapshotPointer snapshot) { showSnapshot(std::move(snapshot)); });
    connect(m_task, &ValidationTask::failed, this, [this](const QString& message) {
        m_progress->setVisible(false);
        m_cancel->setVisible(false);
        m_status->setFullText(tr("The analysis could not run."));
        QMessageBox::warning(this, tr("Plumbline"), message);
    });
    connect(m_task, &ValidationTask::cancelled, this, [this] {
        m_progress->setVisible(false);
        m_cancel->setVisible(false);
        // After the analytic panel arrived, cancelling the bootstrap leaves that panel.
        const bool analyticShown = m_snapshot && !m_snapshot->validation.bootstrap && m_snapshot->request.bootstrap.replicates > 0;
        m_status->setFullText(analyticShown ? tr("Bootstrap cancelled; the analytic intervals are shown.")
                                            : tr("Cancelled; the previous results are still shown."));
    });
    connect(m_cancel, &QPushButton::clicked, m_task, &ValidationTask::cancel);
    connect(m_settings, &SettingsPanel::rerunRequested, this, [this] {
        if (const auto request = currentRequest())
            runRequest(*request);
    });
    // One risk group, ringed in every calibration plot: from the table's selection, or from a
    // point hovered in the Overview; a click on a point opens it in the Risk groups tab.
    connect(m_riskGroups, &RiskGroupsPanel::groupSelected, calibrationView(), &CalibrationChartView::highlightRiskGroup);
    connect(calibrationView(), &CalibrationChartView::riskGroupHovered, this, [this](int model, int group) {
        if (group >= 0)
            m_riskGroups->selectGroup(model, group);
    });
    connect(calibrationView(), &CalibrationChartView::riskGroupClicked, this, [this](int model, int group) {
        m_riskGroups->selectGroup(model, group);
        m_tabs->setCurrentWidget(m_riskGroups);
    });

    // Charts copied or saved from their own menus say so where Edit → Copy chart does.
    for (ExportableChartView* chart : findChildren<ExportableChartView*>())
        connect(chart, &ExportableChartView::exported, m_status, &ElidedLabel::setFullText);

    QSettings settings;
    const bool restored = restoreGeometry(settings.value(QStringLiteral("window/geometry")).toByteArray());
    restoreState(settings.value(QStringLiteral("window/state")).toByteArray());
    fitToScreen(!restored);
}

MainWindow::~MainWindow() = default;

RocChartView* MainWindow::rocView() const { return m_overview->rocView(); }
CalibrationChartView* MainWindow::calibrationView() const { return m_overview->calibrationView(); }
RiskDistributionView* MainWindow::distributionView() const { return m_overview->distributionView(); }
ThresholdSummaryModel* MainWindow::summaryModel() const { return m_overview->summaryModel(); }
CopyableTableView* MainWindow::riskGroupView() const { return m_riskGroups->tableView(); }
RiskGroupTableModel* MainWindow::riskGroupModel() const { return m_riskGroups->tableModel(); }

QCheckBox* MainWindow::modelToggle(int model) const
{
    QLayoutItem* item = model >= 0 && model < m_toggles->count() ? m_toggles->itemAt(model) : nullptr;
    return item ? qobject_cast<QCheckBox*>(item->widget()) : nullptr;
}

// The window fits the screen it opens on: a first start fills up to 1600×1000 of it, and a size
// remembered from a larger screen is reduced.
void MainWindow::fitToScreen(bool always)
{
    const QScreen* screen = QGuiApplication::primaryScreen();
    if (!screen)
        return;
    const QRect available = screen->availableGeometry();
    if (always || width() > available.width() || height() > available.height()) {
        // A laptop screen is used whole; a large one mostly, leaving a margin around the window.
        const bool small = available.width() <= 1400 || available.height() <= 800;
        const QSize size = small ? available.size() : QSize(available.width() * 92 / 100, available.height() * 92 / 100);
        resize(size);
        move(available.topLeft() + QPoint((available.width() - size.width()) / 2, (available.height() - size.height()) / 2));
    }
}

void MainWindow::buildMenus()
{
    buildFileMenu();
    QMenu* edit = menuBar()->addMenu(tr("&Edit"));
    QAction* copyChart = edit->addAction(tr("Copy &chart"), this, [this] {
        if (ExportableChartView* chart = currentChart()) {
            chart->copyToClipboard();
            m_status->setFullText(tr("Chart copied: %1").arg(chart->chart()->title()));
        }
    });
    copyChart->setShortcut(QKeySequence(Qt::CTRL | Qt::SHIFT | Qt::Key_C));
    QMenu* view = menuBar()->addMenu(tr("&View"));
    view->addAction(tr("&Reset layout"), this, &MainWindow::resetLayout);
    QMenu* analysis = menuBar()->addMenu(tr("&Analysis"));
    QAction* rerun = analysis->addAction(tr("&Re-run"), this, [this] {
        if (const auto request = currentRequest())
            runRequest(*request);
        else
            m_tabs->setCurrentWidget(m_settings); // where the problem is shown
    });
    rerun->setShortcut(QKeySequence::Refresh);
    QAction* cancel = analysis->addAction(tr("&Cancel run"), m_task, &ValidationTask::cancel);
    cancel->setShortcut(QKeySequence(Qt::Key_Escape));
    analysis->addSeparator();
    analysis->addAction(tr("&Plan a sample size…"), this, &MainWindow::showPlanner);
    QMenu* help = menuBar()->addMenu(tr("&Help"));
    QAction* guide = help->addAction(tr("&Guide to the window"), this, [this] { GuideDialog(this).exec(); });
    guide->setShortcut(QKeySequence::HelpContents);
    help->addAction(tr("&Cautions"), this, [this] { QMessageBox::information(this, tr("Cautions"), cautionText()); });
    help->addAction(tr("&About Plumbline"), this, &MainWindow::showAbout);
}

QWidget* MainWindow::buildCentralArea()
{
    auto* caution = new QLabel(tr("<b>Caution:</b> %1").arg(cautionText()));
    caution->setWordWrap(true);
    caution->setStyleSheet(QStringLiteral("background:#fff4d6; border:1px solid #e6c46a; padding:2px 6px;"));
    caution->setAccessibleName(tr("Caution"));
    QFont titleFont = m_title->font();
    titleFont.setBold(true);
    m_title->setFont(titleFont);
    m_title->setFullText(tr("Open a cohort (File → Open, or drop a file here) to validate a risk model."));
    auto* togglesRow = new QHBoxLayout;
    togglesRow->addWidget(m_title, 1);
    togglesRow->addLayout(m_toggles);

    auto* metricView = new MetricTableView;
    metricView->setModel(m_metrics);
    metricView->setAccessibleName(tr("Metrics"));
    m_tabs->addTab(buildOverviewPage(), tr("O&verview"));
    m_tabs->addTab(metricView, tr("&Metrics"));
    m_tabs->addTab(m_riskGroups, tr("Risk &groups"));
    m_tabs->addTab(m_comparison, tr("Co&mparison"));
    m_tabs->addTab(m_decision, tr("&Net benefit"));
    m_tabs->addTab(m_subgroups, tr("Su&bgroups"));
    m_tabs->addTab(m_periods, tr("Over &time"));
    m_tabs->addTab(m_sites, tr("S&ites"));
    m_tabs->addTab(m_monitoring, tr("Mon&itoring"));
    m_tabs->addTab(m_updating, tr("&Updating"));
    m_tabs->addTab(m_cohort, tr("C&ohort"));
    m_tabs->addTab(m_settings, tr("&Settings"));
    m_tabs->setUsesScrollButtons(true);
    connect(m_tabs, &QTabWidget::currentChanged, this, [] { QToolTip::hideText(); }); // no tip left from another page
    for (int t = 0; t < std::min(9, m_tabs->count()); ++t) {
        auto* go = new QAction(this);
        go->setShortcut(QKeySequence(Qt::CTRL | Qt::Key(Qt::Key_1 + t)));
        connect(go, &QAction::triggered, this, [this, t] { m_tabs->setCurrentIndex(t); });
        addAction(go);
    }

    auto* central = new QWidget;
    auto* layout = new QVBoxLayout(central);
    layout->setContentsMargins(6, 4, 6, 2);
    layout->setSpacing(4);
    layout->addWidget(caution);
    layout->addLayout(togglesRow);
    layout->addWidget(m_threshold);
    layout->addWidget(m_tabs, 1);
    return central;
}

// Before the first run the Overview says how to begin, instead of showing empty charts.
QWidget* MainWindow::buildOverviewPage()
{
    auto* welcome = new QLabel(tr("<h2>Validate a risk model on your own patients</h2>"
                                  "<p>Open a file of scored patients — delimited text, a workbook (.xlsx), or a SAS, Stata or "
                                  "SPSS file — or a database query's result: one row per patient, the outcome (0/1 or yes/no), one "
                                  "column of predicted risk per model, and optionally an id, sites or other subgroups and a "
                                  "date.</p><p>Plumbline shows the rows it reads, guesses what each column is, accounts for "
                                  "every row, then computes discrimination, calibration, overall accuracy and usefulness at "
                                  "the thresholds your care team will act on, with honest intervals.</p>"
                                  "<p>File → Open cohort (Ctrl+O), File → Open from database, or drop a file on this window. Help → Guide to the window "
                                  "(F1) explains every part.</p>"));
    welcome->setWordWrap(true);
    welcome->setAlignment(Qt::AlignTop | Qt::AlignLeft);
    welcome->setMaximumWidth(760);
    auto* open = new QPushButton(tr("Open a cohort…"));
    connect(open, &QPushButton::clicked, this, [this] { openWithDialog(); });
    auto* page = new QWidget;
    auto* layout = new QVBoxLayout(page);
    layout->setContentsMargins(24, 24, 24, 24);
    layout->addWidget(welcome);
    layout->addWidget(open, 0, Qt::AlignLeft);
    layout->addStretch(1);
    m_overviewPages->addWidget(page);
    m_overviewPages->addWidget(m_overview);
    return m_overviewPages;
}

void MainWindow::buildStatusBar()
{
    m_progress->setRange(0, 100);
    m_progress->setMaximumWidth(220);
    m_progress->setVisible(false);
    m_cancel->setVisible(false);
    statusBar()->addWidget(m_status, 1);
    statusBar()->addPermanentWidget(m_progress);
    statusBar()->addPermanentWidget(m_cancel);
}

void MainWindow::resetLayout()
{
    fitToScreen(true);
    m_overview->resetLayout();
    m_riskGroups->resetLayout();
    m_subgroups->resetLayout();
    m_periods->resetLayout();
    m_sites->resetLayout();
    m_monitoring->resetLayout();
    m_tabs->setCurrentIndex(0);
}

std::optional<AnalysisRequest> MainWindow::currentRequest() const
{
    auto request = m_settings->request();
    if (request)
        request->panel.decisionThreshold = m_threshold->threshold();
    return request;
}

void MainWindow::runRequest(const AnalysisRequest& request)
{
    m_settings->setRequest(request);
    m_threshold->setThreshold(request.panel.decisionThreshold);
    m_progress->setValue(0);
    m_progress->setVisible(true);
    m_cancel->setVisible(true);
    m_status->setFullText(tr("Starting…"));
    m_task->start(request);
}

void MainWindow::showSnapshot(SnapshotPointer snapshot, bool complete)
{
    m_snapshot = std::move(snapshot);
    // The analytic panel arrives while the bootstrap runs: its progress and Cancel stay.
    m_progress->setVisible(!complete);
    m_cancel->setVisible(!complete);
    const AnalysisRequest& request = m_snapshot->request;
    const IntakeAudit& audit = m_snapshot->audit;
    const QString intervals = m_snapshot->validation.bootstrap
        ? tr("%1, B = %2, seed %3")
              .arg(QString::fromStdString(bootstrapCiLabel(request.bootstrap.method)))
              .arg(QLocale().toString(qulonglong(m_snapshot->validation.bootstrap->replicates)))
              .arg(m_snapshot->validation.bootstrap->seed)
        : complete ? tr("analytic") : tr("analytic (bootstrap running)");
    m_title->setFullText(tr("%1 · %2 patients, %3 events (%4 %) · %5 % intervals: %6")
                             .arg(request.intake.database ? QString::fromStdString(databaseDisplayName(*request.intake.database))
                                                          : QFileInfo(QString::fromStdString(request.intake.cohortFile)).fileName()
                                      + (request.intake.sheet ? tr(", sheet %1").arg(QString::fromStdString(*request.intake.sheet)) : QString()))
                             .arg(QLocale().toString(qulonglong(audit.rowsUsed)))
                             .arg(QLocale().toString(qulonglong(audit.events)))
                             .arg(100.0 * double(audit.events) / double(std::max<std::size_t>(audit.rowsUsed, 1)), 0, 'f', 1)
                             .arg(request.panel.confidence * 100.0)
                             .arg(intervals));
    // Each stage fills one part of the window. The analytic panel arrives mid-run: its stages run one
    // per event-loop turn, so a user dragging the threshold meanwhile never waits for the whole
    // window to refill. The final result fills everything at once (tests and exports read it at once).
    const SnapshotPointer shown = m_snapshot;
    std::vector<std::function<void()>> stages{
        [this] { m_overview->setSnapshot(m_snapshot); },
        [this] { m_overviewPages->setCurrentWidget(m_overview); },
        [this] { m_metrics->setSnapshot(m_snapshot); },
        [this] { m_riskGroups->setSnapshot(m_snapshot); },
        [this] { m_cohort->setSnapshot(m_snapshot); },
        [this] { m_comparison->setSnapshot(m_snapshot); },
        [this] { m_updating->setSnapshot(m_snapshot); },
        [this] { m_decision->setSnapshot(m_snapshot); },
        [this] { m_subgroups->setSnapshot(m_snapshot); },
        [this] { m_periods->setSnapshot(m_snapshot); },
        [this] { m_sites->setSnapshot(m_snapshot); },
        [this] { m_monitoring->setSnapshot(m_snapshot); },
        [this] {
            rebuildModelToggles();
            m_threshold->setSnapshot(m_snapshot);
            setThreshold(m_threshold->threshold());
        },
    };
    const std::size_t warnings = m_snapshot->validation.warnings.size() + audit.warnings.size();
    if (!complete) {
        m_status->setFullText(tr("Analytic intervals shown; the bootstrap's replace them when it ends."));
        runStagesInTurns(shown, std::move(stages), 0);
        return;
    }
    for (auto& stage : stages)
        stage();
    m_status->setFullText(warnings == 0   ? tr("Done.")
                          : warnings == 1 ? tr("Done. 1 warning: see the Cohort tab.")
                                          : tr("Done. %1 warnings: see the Cohort tab.").arg(warnings));
}

void MainWindow::runStagesInTurns(SnapshotPointer shown, std::vector<std::function<void()>> stages, std::size_t next)
{
    // A newer snapshot (the final one, or a new run) supersedes the remaining stages.
    if (next >= stages.size() || m_snapshot != shown)
        return;
    stages[next]();
    QTimer::singleShot(0, this, [this, shown = std::move(shown), stages = std::move(stages), next]() mutable {
        runStagesInTurns(std::move(shown), std::move(stages), next + 1);
    });
}

void MainWindow::setThreshold(double threshold)
{
    m_overview->setThreshold(threshold);
    m_riskGroups->setThreshold(threshold);
    m_comparison->setThreshold(threshold);
    m_updating->setThreshold(threshold);
    m_decision->setThreshold(threshold);
}

void MainWindow::setModelVisible(int model, bool visible)
{
    m_overview->setModelVisible(model, visible);
    m_riskGroups->setModelVisible(model, visible);
    m_decision->setModelVisible(model, visible);
}

void MainWindow::rebuildModelToggles()
{
    while (QLayoutItem* item = m_toggles->takeAt(0)) {
        delete item->widget();
        delete item;
    }
    if (!m_snapshot)
        return;
    const auto& models = m_snapshot->validation.models;
    for (std::size_t m = 0; m < models.size(); ++m) {
        auto* toggle = new QCheckBox(QString::fromStdString(models[m].name));
        QPixmap swatch(14, 14);
        swatch.fill(modelColour(int(m)));
        toggle->setIcon(QIcon(swatch));
        toggle->setChecked(true);
        toggle->setToolTip(tr("Show or hide this model in the Overview, Risk groups and Net benefit charts and the table "
                              "at the threshold (Subgroups, Over time and Updating show the model chosen there)"));
        connect(toggle, &QCheckBox::toggled, this, [this, m](bool visible) { setModelVisible(int(m), visible); });
        m_toggles->addWidget(toggle);
    }
}

ExportableChartView* MainWindow::currentChart() const
{
    if (auto* focused = qobject_cast<ExportableChartView*>(QApplication::focusWidget()); focused && focused->isVisible())
        return focused;
    QWidget* page = m_tabs->currentWidget();
    if (auto* chart = qobject_cast<ExportableChartView*>(page))
        return chart;
    for (auto* chart : page->findChildren<ExportableChartView*>())
        if (chart->isVisible())
            return chart;
    return rocView();
}

void MainWindow::showPlanner()
{
    PlannerDialog dialog(this);
    if (m_snapshot) {
        // Prefilled from the loaded cohort: its event rate and the first model's C.
        const IntakeAudit& audit = m_snapshot->audit;
        const double prevalence = audit.rowsUsed > 0 ? double(audit.events) / double(audit.rowsUsed) : 0.15;
        const auto& c = m_snapshot->validation.models.front().metrics[CStatistic].estimate.value;
        dialog.setInputs(prevalence, c.value_or(0.7), QString::fromStdString(riskListText(m_snapshot->request.panel.thresholds)));
        dialog.setAchieved(m_snapshot->validation.precision);
    }
    dialog.exec();
}

void MainWindow::showAbout()
{
    QMessageBox::about(this, tr("About Plumbline"),
                       tr("<h3>Plumbline %1</h3><p>A workbench for validating binary-outcome clinical risk models "
                          "on local data.</p><p>Built with Qt %2 (running %3), Eigen, Boost.Math, nlohmann-json, "
                          "CLI11, libxlsxwriter and OpenSSL's libcrypto.</p><p><b>Caution:</b> %4</p>")
                           .arg(QString::fromLatin1(versionString), QStringLiteral(QT_VERSION_STR),
                                QString::fromLatin1(qVersion()), cautionText()));
}

void MainWindow::closeEvent(QCloseEvent* event)
{
    m_task->cancel();
    QSettings settings;
    settings.setValue(QStringLiteral("window/geometry"), saveGeometry());
    settings.setValue(QStringLiteral("window/state"), saveState());
    event->accept();
}

} // namespace plumbline
