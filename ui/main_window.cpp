#include "main_window.hpp"

#include "calibration_chart_view.hpp"
#include "cautions.hpp"
#include "cohort_panel.hpp"
#include "comparison_panel.hpp"
#include "decision_curve_view.hpp"
#include "period_panel.hpp"
#include "planner_dialog.hpp"
#include "subgroup_panel.hpp"
#include "updating_panel.hpp"
#include "copyable_table_view.hpp"
#include "import_dialog.hpp"
#include "metric_table_model.hpp"
#include "model_palette.hpp"
#include "report_writers.hpp"
#include "result_json.hpp"
#include "risk_distribution_view.hpp"
#include "risk_group_table_model.hpp"
#include "roc_chart_view.hpp"
#include "settings_panel.hpp"
#include "threshold_panel.hpp"
#include "validation_task.hpp"
#include "version.hpp"

#include <QAction>
#include <QApplication>
#include <QCheckBox>
#include <QCloseEvent>
#include <QDragEnterEvent>
#include <QDropEvent>
#include <QFileDialog>
#include <QFileInfo>
#include <QHBoxLayout>
#include <QHeaderView>
#include <QItemSelectionModel>
#include <QLabel>
#include <QMenuBar>
#include <QMessageBox>
#include <QMimeData>
#include <QPixmap>
#include <QProgressBar>
#include <QPushButton>
#include <QSettings>
#include <QSortFilterProxyModel>
#include <QSplitter>
#include <QStatusBar>
#include <QTabWidget>
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
    , m_roc(new RocChartView)
    , m_calibration(new CalibrationChartView)
    , m_distribution(new RiskDistributionView)
    , m_threshold(new ThresholdPanel)
    , m_metrics(new MetricTableModel(this))
    , m_riskGroups(new RiskGroupTableModel(this))
    , m_riskGroupProxy(new QSortFilterProxyModel(this))
    , m_riskGroupView(new CopyableTableView)
    , m_cohort(new CohortPanel)
    , m_comparison(new ComparisonPanel)
    , m_updating(new UpdatingPanel)
    , m_decision(new DecisionCurveView)
    , m_subgroups(new SubgroupPanel)
    , m_periods(new PeriodPanel)
    , m_settings(new SettingsPanel)
    , m_tabs(new QTabWidget)
    , m_toggles(new QHBoxLayout)
    , m_title(new QLabel)
    , m_status(new QLabel)
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
        m_status->setText(stage);
    });
    connect(m_task, &ValidationTask::finished, this, [this](SnapshotPointer snapshot) { showSnapshot(std::move(snapshot)); });
    connect(m_task, &ValidationTask::failed, this, [this](const QString& message) {
        m_progress->setVisible(false);
        m_cancel->setVisible(false);
        m_status->setText(tr("The analysis could not run."));
        QMessageBox::warning(this, tr("Plumbline"), message);
    });
    connect(m_task, &ValidationTask::cancelled, this, [this] {
        m_progress->setVisible(false);
        m_cancel->setVisible(false);
        m_status->setText(tr("Cancelled; the previous results are still shown."));
    });
    connect(m_cancel, &QPushButton::clicked, m_task, &ValidationTask::cancel);
    connect(m_settings, &SettingsPanel::rerunRequested, this, [this] {
        if (const auto request = m_settings->request())
            runRequest(*request);
    });
    connect(m_calibration, &CalibrationChartView::riskGroupHovered, this, [this](int model, int group) {
        if (group >= 0)
            selectRiskGroup(model, group);
    });
    connect(m_riskGroupView->selectionModel(), &QItemSelectionModel::currentRowChanged, this,
            [this](const QModelIndex& current) {
                const auto [model, group] = m_riskGroups->groupAt(m_riskGroupProxy->mapToSource(current).row());
                m_calibration->highlightRiskGroup(model, group);
            });

    QSettings settings;
    restoreGeometry(settings.value(QStringLiteral("window/geometry")).toByteArray());
    restoreState(settings.value(QStringLiteral("window/state")).toByteArray());
    if (!settings.contains(QStringLiteral("window/geometry")))
        resize(1400, 950);
}

MainWindow::~MainWindow() = default;

void MainWindow::buildMenus()
{
    QMenu* file = menuBar()->addMenu(tr("&File"));
    QAction* open = file->addAction(tr("&Open cohort…"), this, [this] { openWithDialog(); });
    open->setShortcut(QKeySequence::Open);
    m_recent = file->addMenu(tr("Open &recent"));
    refreshRecentMenu();
    file->addSeparator();
    file->addAction(tr("Open &analysis…"), this, [this] {
        const QString path = QFileDialog::getOpenFileName(this, tr("Open analysis"), QString(), tr("Plumbline analysis (*.plumbline.json)"));
        if (path.isEmpty())
            return;
        QStringList warnings;
        QString error;
        if (!openAnalysis(path, &warnings, &error))
            QMessageBox::warning(this, tr("Analysis not opened"), error);
        else if (!warnings.isEmpty())
            QMessageBox::warning(this, tr("The data have changed"), warnings.join(QLatin1Char('\n')));
    });
    QAction* save = file->addAction(tr("&Save analysis…"), this, [this] {
        const QString path = QFileDialog::getSaveFileName(this, tr("Save analysis"), QString(), tr("Plumbline analysis (*.plumbline.json)"));
        QString error;
        if (!path.isEmpty() && !saveAnalysis(path.endsWith(QStringLiteral(".plumbline.json")) ? path : path + QStringLiteral(".plumbline.json"), &error))
            QMessageBox::warning(this, tr("Analysis not saved"), error);
    });
    save->setShortcut(QKeySequence::Save);
    file->addSeparator();
    QAction* exportReportAction = file->addAction(tr("&Export report…"), this, [this] {
        QString filter;
        const QString path = QFileDialog::getSaveFileName(this, tr("Export report"), QString(),
                                                          tr("PDF report (*.pdf);;HTML report (*.html);;Spreadsheet (*.xlsx)"), &filter);
        if (path.isEmpty())
            return;
        QString error;
        const bool ok = path.endsWith(QStringLiteral(".xlsx")) ? exportWorkbook(path, &error) : exportReport(path, &error);
        if (!ok)
            QMessageBox::warning(this, tr("Report not written"), error);
        else
            m_status->setText(tr("Report written to %1").arg(path));
    });
    exportReportAction->setShortcut(QKeySequence(Qt::CTRL | Qt::Key_E));
    file->addAction(tr("Export &tables as CSV…"), this, [this] {
        const QString folder = QFileDialog::getExistingDirectory(this, tr("Folder for the tables"));
        QString error;
        if (!folder.isEmpty() && !exportTables(folder, &error))
            QMessageBox::warning(this, tr("Tables not written"), error);
    });
    file->addSeparator();
    QAction* quit = file->addAction(tr("&Quit"), this, &QWidget::close);
    quit->setShortcut(QKeySequence::Quit);
    QMenu* analysis = menuBar()->addMenu(tr("&Analysis"));
    QAction* rerun = analysis->addAction(tr("&Re-run"), this, [this] {
        if (const auto request = m_settings->request())
            runRequest(*request);
    });
    rerun->setShortcut(QKeySequence::Refresh);
    QAction* cancel = analysis->addAction(tr("&Cancel run"), m_task, &ValidationTask::cancel);
    cancel->setShortcut(QKeySequence(Qt::Key_Escape));
    analysis->addSeparator();
    analysis->addAction(tr("&Plan a sample size…"), this, [this] {
        PlannerDialog dialog(this);
        if (m_snapshot)
            dialog.setAchieved(m_snapshot->validation.precision);
        dialog.exec();
    });
    QMenu* help = menuBar()->addMenu(tr("&Help"));
    help->addAction(tr("&Cautions"), this, [this] { QMessageBox::information(this, tr("Cautions"), cautionText()); });
    help->addAction(tr("&About Plumbline"), this, &MainWindow::showAbout);
}

QWidget* MainWindow::buildCentralArea()
{
    auto* caution = new QLabel(tr("<b>Caution:</b> %1").arg(cautionText()));
    caution->setWordWrap(true);
    caution->setStyleSheet(QStringLiteral("background:#fff4d6; border:1px solid #e6c46a; padding:6px;"));
    caution->setAccessibleName(tr("Caution"));
    m_title->setStyleSheet(QStringLiteral("font-weight:bold; font-size:13pt;"));
    m_title->setText(tr("Open a cohort (File → Open, or drop a file here) to validate a risk model."));
    auto* togglesRow = new QHBoxLayout;
    togglesRow->addWidget(m_title, 1);
    togglesRow->addLayout(m_toggles);

    auto* right = new QSplitter(Qt::Vertical);
    right->addWidget(m_calibration);
    right->addWidget(m_distribution);
    right->setStretchFactor(0, 2);
    right->setStretchFactor(1, 1);
    auto* charts = new QSplitter(Qt::Horizontal);
    charts->addWidget(m_roc);
    charts->addWidget(right);
    charts->setStretchFactor(0, 1);
    charts->setStretchFactor(1, 1);

    auto* metricView = new CopyableTableView;
    metricView->setModel(m_metrics);
    metricView->horizontalHeader()->setSectionResizeMode(QHeaderView::ResizeToContents);
    metricView->setAccessibleName(tr("Metrics"));
    m_riskGroupProxy->setSourceModel(m_riskGroups);
    m_riskGroupProxy->setSortRole(Qt::EditRole);
    m_riskGroupView->setModel(m_riskGroupProxy);
    m_riskGroupView->setSortingEnabled(true);
    m_riskGroupView->horizontalHeader()->setSectionResizeMode(QHeaderView::ResizeToContents);
    m_riskGroupView->setAccessibleName(tr("Risk groups"));
    m_tabs->addTab(metricView, tr("&Metrics"));
    m_tabs->addTab(m_riskGroupView, tr("Risk &groups"));
    m_tabs->addTab(m_comparison, tr("Co&mparison"));
    m_tabs->addTab(m_decision, tr("&Net benefit"));
    m_tabs->addTab(m_subgroups, tr("Su&bgroups"));
    m_tabs->addTab(m_periods, tr("Over &time"));
    m_tabs->addTab(m_updating, tr("&Updating"));
    m_tabs->addTab(m_cohort, tr("C&ohort"));
    m_tabs->addTab(m_settings, tr("&Settings"));

    auto* lower = new QWidget;
    auto* lowerLayout = new QVBoxLayout(lower);
    lowerLayout->setContentsMargins(0, 0, 0, 0);
    lowerLayout->addWidget(m_threshold);
    lowerLayout->addWidget(m_tabs, 1);
    auto* vertical = new QSplitter(Qt::Vertical);
    vertical->addWidget(charts);
    vertical->addWidget(lower);
    vertical->setStretchFactor(0, 1);
    vertical->setStretchFactor(1, 1);
    vertical->setSizes({540, 460});

    auto* central = new QWidget;
    auto* layout = new QVBoxLayout(central);
    layout->addWidget(caution);
    layout->addLayout(togglesRow);
    layout->addWidget(vertical, 1);
    return central;
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

void MainWindow::openWithDialog(const QString& path)
{
    ImportDialog dialog(this);
    if (!path.isEmpty())
        dialog.loadFile(path);
    if (dialog.exec() != QDialog::Accepted)
        return;
    AnalysisRequest request = m_settings->request().value_or(AnalysisRequest{});
    request.intake = dialog.intakeSettings();
    addRecentFile(QString::fromStdString(request.intake.cohortFile));
    runRequest(request);
}

void MainWindow::runRequest(const AnalysisRequest& request)
{
    m_settings->setRequest(request);
    m_progress->setValue(0);
    m_progress->setVisible(true);
    m_cancel->setVisible(true);
    m_status->setText(tr("Starting…"));
    m_task->start(request);
}

bool MainWindow::saveAnalysis(const QString& path, QString* error)
{
    const auto request = m_settings->request();
    if (!request)
        return false;
    const auto saved = saveAnalysisFile(path.toStdString(), request->toAnalysisFile());
    if (!saved && error)
        *error = QString::fromStdString(saved.error().message());
    return saved.has_value();
}

bool MainWindow::openAnalysis(const QString& path, QStringList* warnings, QString* error)
{
    std::vector<std::string> found;
    const auto analysis = loadAnalysisFile(path.toStdString(), found);
    if (!analysis) {
        if (error)
            *error = QString::fromStdString(analysis.error().message());
        return false;
    }
    if (warnings)
        for (const auto& w : found)
            warnings->append(QString::fromStdString(w));
    runRequest(AnalysisRequest::fromAnalysisFile(*analysis));
    return true;
}

namespace {
bool reportResult(const std::expected<void, InputError>& written, QString* error)
{
    if (!written && error)
        *error = QString::fromStdString(written.error().message());
    return written.has_value();
}
} // namespace

bool MainWindow::exportReport(const QString& path, QString* error)
{
    if (!m_snapshot)
        return false;
    const ReportDocument document = buildReport(*m_snapshot, m_snapshot->request.report, m_snapshot->request.minimumCell, utcTimestamp());
    ReportCharts charts(m_snapshot);
    return reportResult(writeReport(document, charts, path.toStdString()), error);
}

bool MainWindow::exportWorkbook(const QString& path, QString* error)
{
    if (!m_snapshot)
        return false;
    const ReportDocument document = buildReport(*m_snapshot, m_snapshot->request.report, m_snapshot->request.minimumCell, utcTimestamp());
    return reportResult(writeXlsxReport(document, path.toStdString()), error);
}

bool MainWindow::exportTables(const QString& folder, QString* error)
{
    if (!m_snapshot)
        return false;
    const ReportDocument document = buildReport(*m_snapshot, m_snapshot->request.report, m_snapshot->request.minimumCell, utcTimestamp());
    return reportResult(writeCsvTables(document, folder.toStdString()), error);
}

void MainWindow::showSnapshot(SnapshotPointer snapshot)
{
    m_snapshot = std::move(snapshot);
    m_progress->setVisible(false);
    m_cancel->setVisible(false);
    const AnalysisRequest& request = m_snapshot->request;
    const IntakeAudit& audit = m_snapshot->audit;
    QString intervals = m_snapshot->validation.bootstrap
        ? tr("bootstrap %1 intervals, %2 replicates, seed %3")
              .arg(m_snapshot->validation.bootstrap->ciMethod == "bca" ? tr("BCa") : tr("percentile"))
              .arg(m_snapshot->validation.bootstrap->replicates)
              .arg(m_snapshot->validation.bootstrap->seed)
        : tr("analytic intervals");
    m_title->setText(tr("%1 — %2 patients, %3 with the event (%4 %); %5")
                         .arg(QFileInfo(QString::fromStdString(request.intake.cohortFile)).fileName())
                         .arg(QLocale().toString(qulonglong(audit.rowsUsed)))
                         .arg(QLocale().toString(qulonglong(audit.events)))
                         .arg(100.0 * double(audit.events) / double(std::max<std::size_t>(audit.rowsUsed, 1)), 0, 'f', 1)
                         .arg(intervals));
    m_roc->setSnapshot(m_snapshot);
    m_calibration->setSnapshot(m_snapshot);
    m_distribution->setSnapshot(m_snapshot, 0, m_calibration->axisMaximum());
    m_threshold->setSnapshot(m_snapshot);
    m_metrics->setSnapshot(m_snapshot);
    m_riskGroups->setSnapshot(m_snapshot);
    m_cohort->setSnapshot(m_snapshot);
    m_comparison->setSnapshot(m_snapshot);
    m_updating->setSnapshot(m_snapshot);
    m_decision->setSnapshot(m_snapshot);
    m_subgroups->setSnapshot(m_snapshot);
    m_periods->setSnapshot(m_snapshot);
    rebuildModelToggles();
    setThreshold(m_threshold->threshold());
    const std::size_t warnings = m_snapshot->validation.warnings.size() + audit.warnings.size();
    m_status->setText(warnings > 0 ? tr("Done. %1 warnings: see the Cohort tab.").arg(warnings) : tr("Done."));
}

void MainWindow::setThreshold(double threshold)
{
    m_roc->setThreshold(threshold);
    m_calibration->setThreshold(threshold);
    m_distribution->setThreshold(threshold);
    m_comparison->setThreshold(threshold);
    m_updating->setThreshold(threshold);
    m_decision->setThreshold(threshold);
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
        toggle->setToolTip(tr("Show or hide this model in the charts"));
        connect(toggle, &QCheckBox::toggled, this, [this, m](bool visible) {
            m_roc->setModelVisible(int(m), visible);
            m_calibration->setModelVisible(int(m), visible);
        });
        m_toggles->addWidget(toggle);
    }
}

void MainWindow::selectRiskGroup(int model, int group)
{
    const int row = m_riskGroups->rowOf(model, group);
    if (row < 0)
        return;
    const QModelIndex index = m_riskGroupProxy->mapFromSource(m_riskGroups->index(row, 0));
    m_riskGroupView->selectionModel()->setCurrentIndex(index, QItemSelectionModel::ClearAndSelect | QItemSelectionModel::Rows);
    m_riskGroupView->scrollTo(index);
}

void MainWindow::addRecentFile(const QString& path)
{
    QSettings settings;
    QStringList files = settings.value(QStringLiteral("recentFiles")).toStringList();
    files.removeAll(path);
    files.prepend(path);
    while (files.size() > 8)
        files.removeLast();
    settings.setValue(QStringLiteral("recentFiles"), files);
    refreshRecentMenu();
}

void MainWindow::refreshRecentMenu()
{
    m_recent->clear();
    const QStringList files = QSettings().value(QStringLiteral("recentFiles")).toStringList();
    for (const QString& path : files)
        m_recent->addAction(QFileInfo(path).fileName(), this, [this, path] { openWithDialog(path); })->setToolTip(path);
    m_recent->setEnabled(!files.isEmpty());
}

void MainWindow::showAbout()
{
    QMessageBox::about(this, tr("About Plumbline"),
                       tr("<h3>Plumbline %1</h3><p>A workbench for validating binary-outcome clinical risk models "
                          "on local data.</p><p>Built with Qt %2 (running %3), Eigen, Boost.Math, nlohmann-json, "
                          "CLI11 and OpenSSL's libcrypto.</p><p><b>Caution:</b> %4</p>")
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

void MainWindow::dragEnterEvent(QDragEnterEvent* event)
{
    if (event->mimeData()->hasUrls())
        event->acceptProposedAction();
}

void MainWindow::dropEvent(QDropEvent* event)
{
    const QList<QUrl> urls = event->mimeData()->urls();
    if (!urls.isEmpty() && urls.first().isLocalFile())
        openWithDialog(urls.first().toLocalFile());
}

} // namespace plumbline
