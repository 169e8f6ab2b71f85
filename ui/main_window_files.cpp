// MainWindow's file side: opening cohorts and analyses, saving analyses, exporting reports and
// tables, recent files and dropped files.
#include "main_window.hpp"

#include "widgets/elided_label.hpp"
#include "files/atomic_file.hpp"
#include "dialogs/database_dialog.hpp"
#include "intake/query_table.hpp"
#include "dialogs/import_dialog.hpp"
#include "report/report_writers.hpp"
#include "files/result_json.hpp"
#include "widgets/save_location.hpp"
#include "panels/settings_panel.hpp"
#include "panels/threshold_panel.hpp"

#include <QAction>
#include <QDesktopServices>
#include <QDragEnterEvent>
#include <QDropEvent>
#include <QFileInfo>
#include <QMenu>
#include <QMenuBar>
#include <QMessageBox>
#include <QMimeData>
#include <QPushButton>
#include <QSettings>
#include <QTabWidget>
#include <QUrl>

namespace plumbline {

void MainWindow::buildFileMenu()
{
    QMenu* file = menuBar()->addMenu(tr("&File"));
    QAction* open = file->addAction(tr("&Open cohort…"), this, [this] { openWithDialog(); });
    open->setShortcut(QKeySequence::Open);
    file->addAction(tr("Open from &database…"), this, &MainWindow::openFromDatabase);
    m_recent = file->addMenu(tr("Open &recent"));
    refreshRecentMenu();
    file->addSeparator();
    file->addAction(tr("Open &analysis…"), this, &MainWindow::askAndOpenAnalysis);
    QAction* save = file->addAction(tr("&Save analysis…"), this, &MainWindow::askAndSaveAnalysis);
    save->setShortcut(QKeySequence::Save);
    file->addSeparator();
    QAction* exportReportAction = file->addAction(tr("&Export report…"), this, &MainWindow::askAndExportReport);
    exportReportAction->setShortcut(QKeySequence(Qt::CTRL | Qt::Key_E));
    file->addAction(tr("Export &tables as CSV…"), this, &MainWindow::askAndExportTables);
    file->addSeparator();
    QAction* quit = file->addAction(tr("&Quit"), this, &QWidget::close);
    quit->setShortcut(QKeySequence::Quit);
}

void MainWindow::openWithDialog(const QString& path)
{
    ImportDialog dialog(this);
    if (!path.isEmpty())
        dialog.loadFile(path);
    if (dialog.exec() != QDialog::Accepted)
        return;
    runImported(dialog);
}

void MainWindow::openFromDatabase()
{
    DatabaseDialog ask(this);
    // The address and query of the last database asked for (never a password: one is refused).
    QSettings settings;
    ask.setDatabase(settings.value(QStringLiteral("database/address")).toString());
    ask.setQuery(settings.value(QStringLiteral("database/query")).toString());
    for (;;) {
        if (ask.exec() != QDialog::Accepted)
            return;
        settings.setValue(QStringLiteral("database/address"), QString::fromStdString(databaseDisplayName(ask.database().toStdString())));
        settings.setValue(QStringLiteral("database/query"), ask.query());
        ImportDialog dialog(this);
        // A refused address or a failing query goes back to the address and the query, as typed,
        // with the database's own message.
        if (!dialog.loadDatabase(ask.database(), ask.query())) {
            QMessageBox::warning(this, tr("The query cannot be read"), dialog.problemText());
            continue;
        }
        if (dialog.exec() != QDialog::Accepted)
            return;
        runImported(dialog);
        return;
    }
}

void MainWindow::runImported(const ImportDialog& dialog)
{
    // The analysis options stay as the Settings tab shows them (the defaults at first); a value
    // there that cannot be used stops the run where the user can see why.
    std::optional<AnalysisRequest> current = currentRequest();
    if (!current) {
        m_tabs->setCurrentWidget(m_settings);
        QMessageBox::warning(this, tr("Settings to correct"), tr("A setting cannot be used; the Settings tab says which."));
        return;
    }
    AnalysisRequest request = *current;
    request.intake = dialog.intakeSettings();
    if (!request.intake.cohortFile.empty())
        addRecentFile(QString::fromStdString(request.intake.cohortFile));
    runRequest(request);
}

// No export or saved analysis may replace the data it was computed from.
bool MainWindow::refuseInputs(const QString& output, QString* error) const
{
    if (!m_snapshot)
        return true;
    std::vector<std::string> inputs{m_snapshot->request.intake.cohortFile};
    if (m_snapshot->request.intake.outcomesFile)
        inputs.push_back(*m_snapshot->request.intake.outcomesFile);
    const auto ok = refuseInputAsOutput(output.toStdString(), inputs, {});
    if (!ok && error)
        *error = QString::fromStdString(ok.error().message());
    return ok.has_value();
}

bool MainWindow::saveAnalysis(const QString& path, QString* error)
{
    const auto request = currentRequest();
    if (!request) {
        if (error)
            *error = tr("The Settings tab holds a value that cannot be used; see the message there.");
        return false;
    }
    if (!refuseInputs(path, error))
        return false;
    AnalysisFile analysis = request->toAnalysisFile();
    // A query has no file to fingerprint: the result read by the last run stands in, when that run
    // read the same query.
    if (analysis.intake.database && m_snapshot && m_snapshot->request.intake.database == analysis.intake.database
        && m_snapshot->request.intake.query == analysis.intake.query && !m_snapshot->inputs.empty())
        analysis.queryResultSha256 = m_snapshot->inputs.front().sha256;
    const auto saved = saveAnalysisFile(path.toStdString(), analysis);
    if (!saved && error)
        *error = QString::fromStdString(saved.error().message());
    return saved.has_value();
}

bool MainWindow::openAnalysis(const QString& path, QStringList* warnings, QString* error, bool allowOutsidePaths)
{
    std::vector<std::string> found;
    const auto analysis = loadAnalysisFile(path.toStdString(), found, {allowOutsidePaths, false});
    m_outsideRefused = !analysis && analysis.error().kind == ErrorKind::OutsideFolder;
    if (!analysis) {
        if (error)
            *error = QString::fromStdString(analysis.error().message());
        return false;
    }
    if (warnings)
        for (const auto& w : found)
            warnings->append(QString::fromStdString(w));
    AnalysisRequest request = AnalysisRequest::fromAnalysisFile(*analysis);
    request.inputWarnings = found;
    runRequest(request);
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
    if (!refuseInputs(path, error))
        return false;
    const ReportDocument document = buildReport(*m_snapshot, m_snapshot->request.report, m_snapshot->request.minimumCell, utcTimestamp());
    ReportCharts charts(snapshotForReport(*m_snapshot, m_snapshot->request.minimumCell), m_threshold->threshold());
    return reportResult(writeReport(document, charts, path.toStdString()), error);
}

bool MainWindow::exportWorkbook(const QString& path, QString* error)
{
    if (!m_snapshot)
        return false;
    if (!refuseInputs(path, error))
        return false;
    const ReportDocument document = buildReport(*m_snapshot, m_snapshot->request.report, m_snapshot->request.minimumCell, utcTimestamp());
    return reportResult(writeXlsxReport(document, path.toStdString()), error);
}

bool MainWindow::exportTables(const QString& folder, QString* error)
{
    if (!m_snapshot)
        return false;
    const ReportDocument document = buildReport(*m_snapshot, m_snapshot->request.report, m_snapshot->request.minimumCell, utcTimestamp());
    for (const auto& table : csvTablePaths(document, folder.toStdString()))
        if (!refuseInputs(QString::fromStdString(table), error))
            return false;
    return reportResult(writeCsvTables(document, folder.toStdString()), error);
}

QString MainWindow::cohortStem() const
{
    if (m_snapshot && m_snapshot->request.intake.database)
        return QStringLiteral("query");
    return m_snapshot ? QFileInfo(QString::fromStdString(m_snapshot->request.intake.cohortFile)).completeBaseName() : QStringLiteral("analysis");
}

void MainWindow::announceWritten(const QString& what, const QString& path)
{
    m_status->setFullText(tr("%1 written to %2").arg(what, path));
    QMessageBox box(QMessageBox::Information, tr("Plumbline"), tr("%1 written:\n%2").arg(what, path), QMessageBox::Close, this);
    QPushButton* openIt = box.addButton(tr("&Open"), QMessageBox::ActionRole);
    box.exec();
    if (box.clickedButton() == openIt)
        QDesktopServices::openUrl(QUrl::fromLocalFile(path));
}

void MainWindow::askAndExportReport()
{
    if (!m_snapshot) {
        QMessageBox::information(this, tr("Nothing to export yet"), tr("Open a cohort and run a validation first."));
        return;
    }
    const QString path = askSaveLocation(this, tr("Export report"), cohortStem() + QStringLiteral("-validation"),
                                         {{tr("PDF report"), QStringLiteral("pdf")}, {tr("HTML report"), QStringLiteral("html")},
                                          {tr("Spreadsheet"), QStringLiteral("xlsx")}});
    if (path.isEmpty())
        return;
    QString error;
    const bool ok = path.endsWith(QStringLiteral(".xlsx"), Qt::CaseInsensitive) ? exportWorkbook(path, &error) : exportReport(path, &error);
    if (!ok)
        QMessageBox::warning(this, tr("Report not written"), error);
    else
        announceWritten(tr("Report"), path);
}

void MainWindow::askAndExportTables()
{
    if (!m_snapshot) {
        QMessageBox::information(this, tr("Nothing to export yet"), tr("Open a cohort and run a validation first."));
        return;
    }
    const QString folder = askFolder(this, tr("Folder for the tables"));
    QString error;
    if (folder.isEmpty())
        return;
    if (!exportTables(folder, &error))
        QMessageBox::warning(this, tr("Tables not written"), error);
    else
        announceWritten(tr("Tables (CSV)"), folder);
}

void MainWindow::askAndSaveAnalysis()
{
    const QString path = askSaveLocation(this, tr("Save analysis"), cohortStem(), {{tr("Plumbline analysis"), QStringLiteral("plumbline.json")}});
    if (path.isEmpty())
        return;
    QString error;
    if (!saveAnalysis(path, &error))
        QMessageBox::warning(this, tr("Analysis not saved"), error);
    else
        m_status->setFullText(tr("Analysis saved to %1").arg(path));
}

void MainWindow::askAndOpenAnalysis()
{
    const QString path = askOpenLocation(this, tr("Open analysis"), tr("Plumbline analysis (*.plumbline.json);;All files (*)"));
    if (path.isEmpty())
        return;
    QStringList warnings;
    QString error;
    bool opened = openAnalysis(path, &warnings, &error);
    if (!opened && m_outsideRefused) {
        // An analysis received from someone else must not read any file it names unasked.
        const auto answer = QMessageBox::question(this, tr("Read a file outside the analysis's folder?"),
                                                  tr("%1\n\nRead it anyway?").arg(error), QMessageBox::Yes | QMessageBox::No, QMessageBox::No);
        if (answer != QMessageBox::Yes)
            return;
        warnings.clear();
        opened = openAnalysis(path, &warnings, &error, true);
    }
    if (!opened)
        QMessageBox::warning(this, tr("Analysis not opened"), error);
    else if (!warnings.isEmpty())
        QMessageBox::warning(this, tr("The data have changed"), warnings.join(QLatin1Char('\n')));
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
