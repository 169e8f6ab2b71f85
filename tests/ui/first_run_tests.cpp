// The window as a newcomer meets it: a fresh settings store, File → Open, the import dialog's
// keys, a 1280×720 screen, a typed threshold, models hidden and shown again.
#include "files/analysis_file.hpp"
#include "charts/calibration_chart_view.hpp"
#include "widgets/copyable_table_view.hpp"
#include "charts/decision_curve_view.hpp"
#include "charts/forest_chart_view.hpp"
#include "support/fresh_settings_main.hpp"
#include "support/window_test_support.hpp"
#include "charts/funnel_chart_view.hpp"
#include "dialogs/import_dialog.hpp"
#include "charts/level_calibration_view.hpp"
#include "main_window.hpp"
#include "models/metric_table_model.hpp"
#include "panels/overview_panel.hpp"
#include "metrics/panel_keys.hpp"
#include "charts/period_chart_view.hpp"
#include "panels/period_panel.hpp"
#include "dialogs/planner_dialog.hpp"
#include "report/report_charts.hpp"
#include "charts/risk_distribution_view.hpp"
#include "models/risk_group_table_model.hpp"
#include "panels/risk_groups_panel.hpp"
#include "charts/roc_chart_view.hpp"
#include "widgets/save_location.hpp"
#include "panels/settings_panel.hpp"
#include "panels/subgroup_panel.hpp"
#include "panels/threshold_panel.hpp"
#include "models/threshold_summary_model.hpp"
#include "panels/updating_panel.hpp"
#include "run/validation_task.hpp"

#include <QAction>
#include <QCheckBox>
#include <QChart>
#include <QClipboard>
#include <QComboBox>
#include <QDoubleSpinBox>
#include <QFile>
#include <QGraphicsSimpleTextItem>
#include <QJsonArray>
#include <QJsonDocument>
#include <QJsonObject>
#include <QLabel>
#include <QLineEdit>
#include <QLineSeries>
#include <QListWidget>
#include <QMenuBar>
#include <QProcess>
#include <QPushButton>
#include <QSignalSpy>
#include <QTabWidget>
#include <QTableWidget>
#include <QTemporaryDir>
#include <QTextDocument>
#include <QTimer>

#include <functional>

using namespace plumbline;
using namespace plumbline::testing;

namespace {

void whenTheDialogOpens(const std::function<void(ImportDialog*)>& drive)
{
    whenOpen<ImportDialog>(drive);
}

QJsonObject cliResult(const IntakeSettings& mapping, const QString& json)
{
    QStringList arguments{QStringLiteral("validate"), QString::fromStdString(mapping.cohortFile), QStringLiteral("--outcome"),
                          QString::fromStdString(mapping.outcomeColumn), QStringLiteral("--json"), json};
    for (const auto& score : mapping.scoreColumns)
        arguments << QStringLiteral("--score") << QString::fromStdString(score);
    for (const auto& group : mapping.groupColumns)
        arguments << QStringLiteral("--group") << QString::fromStdString(group);
    if (mapping.periodColumn)
        arguments << QStringLiteral("--period") << QString::fromStdString(*mapping.periodColumn);
    if (mapping.idColumn)
        arguments << QStringLiteral("--id") << QString::fromStdString(*mapping.idColumn);
    QProcess cli;
    cli.start(QStringLiteral(PLUMBLINE_CLI), arguments);
    if (!cli.waitForFinished(300000) || cli.exitCode() != 0)
        return {};
    QFile file(json);
    file.open(QIODevice::ReadOnly);
    return QJsonDocument::fromJson(file.readAll()).object();
}

// What each chart's legend shows once the window has drawn it.
QList<QStringList> legendsOf(MainWindow& window)
{
    QApplication::processEvents();
    QList<QStringList> out;
    for (ExportableChartView* chart : std::initializer_list<ExportableChartView*>{
             window.rocView(), window.calibrationView(), window.distributionView(), window.decisionCurveView(),
             window.riskGroupsPanel()->chartView()})
        out << chart->legendEntries();
    return out;
}

} // namespace

class FirstRunTests : public QObject {
    Q_OBJECT
private slots:
    void aFirstRunThroughFileOpenUsesTheCommandLinesDefaults()
    {
        MainWindow window;
        window.show();
        QApplication::setActiveWindow(&window);
        QVERIFY(QTest::qWaitForWindowActive(&window));
        QStringList offered;
        bool browseOpened = false;
        whenTheDialogOpens([&](ImportDialog* dialog) {
            auto* path = dialog->findChild<QLineEdit*>(QStringLiteral("cohortPath"));
            path->setFocus();
            QTest::keyClicks(path, sampleFile);
            QTest::keyClick(path, Qt::Key_Return); // reads the typed file (it used to open Browse…)
            browseOpened = QApplication::activeModalWidget() != dialog;
            offered = dialog->scoreChoices();
            QTest::keyClick(path, Qt::Key_Return); // the mapping is complete: checks the data and runs
        });
        QSignalSpy finished(window.task(), &ValidationTask::finished);
        QTest::keyClick(&window, Qt::Key_O, Qt::ControlModifier); // File → Open, as a person does it
        QVERIFY(!browseOpened);
        QCOMPARE(offered, (QStringList{QStringLiteral("supplier_score"), QStringLiteral("local_score")}));
        QVERIFY(finished.wait(300000));
        const AnalysisRequest& used = window.snapshot()->request;
        // The documented defaults (README, `plumbline-cli validate --help`).
        QCOMPARE(used.panel.confidence, 0.95);
        QCOMPARE(used.panel.riskGroups, std::size_t(10));
        QCOMPARE(used.panel.thresholds, (std::vector<double>{0.1, 0.2, 0.3}));
        QCOMPARE(used.bootstrap.replicates, std::size_t(1000));
        QCOMPARE(used.minimumCell, std::size_t(11));
        QCOMPARE(used.bootstrap.method, BootstrapCi::Bca);
        // The command line, run with the same mapping and no options, used the same settings and
        // gives the same 95 % interval of C.
        QTemporaryDir dir;
        const QJsonObject cli = cliResult(used.intake, dir.filePath(QStringLiteral("cli.json")));
        QVERIFY(!cli.isEmpty());
        const QJsonObject panel = cli[QStringLiteral("settings")][QStringLiteral("panel")].toObject();
        QCOMPARE(panel[QStringLiteral("confidence")].toDouble(), used.panel.confidence);
        QCOMPARE(std::size_t(panel[QStringLiteral("risk_groups")].toInt()), used.panel.riskGroups);
        const QJsonObject bootstrap = cli[QStringLiteral("settings")][QStringLiteral("bootstrap")].toObject();
        QCOMPARE(std::size_t(bootstrap[QStringLiteral("replicates")].toInt()), used.bootstrap.replicates);
        QCOMPARE(bootstrap[QStringLiteral("seed")].toDouble(), double(used.bootstrap.seed));
        const QJsonArray models = cli[QStringLiteral("models")].toArray();
        QCOMPARE(models.size(), qsizetype(2));
        for (int m = 0; m < 2; ++m) {
            const QJsonObject c = models[m][QStringLiteral("metrics")][QStringLiteral("c_statistic")].toObject();
            const Estimate& shown = window.snapshot()->validation.models[std::size_t(m)].metrics[CStatistic].estimate;
            QCOMPARE(*shown.lower, c[QStringLiteral("ci_lower")].toDouble());
            QCOMPARE(*shown.upper, c[QStringLiteral("ci_upper")].toDouble());
            QVERIFY(*shown.upper - *shown.lower < 0.03); // a 95 % interval, not a 50 % one... nor a point
            QVERIFY(*shown.upper - *shown.lower > 0.01);
        }
    }

    void theWindowAndTheDialogFitA1280By720Screen()
    {
        // A long file name must not widen the window (the header line elides).
        QTemporaryDir dir;
        const QString longName = dir.filePath(QString(110, QLatin1Char('x')) + QStringLiteral(".csv"));
        QVERIFY(QFile::copy(sampleFile, longName));
        MainWindow window;
        window.resize(1280, 720);
        window.show();
        QVERIFY(QTest::qWaitForWindowExposed(&window));
        AnalysisRequest request = sampleRequest(0);
        request.intake.cohortFile = longName.toStdString();
        request.intake.groupColumns = {"hospital"};
        request.intake.periodColumn = "discharge_date";
        QVERIFY(runAndWait(window, request));
        QVERIFY(runAndWait(window, request));
        QApplication::processEvents();
        const QSize minimum = window.minimumSizeHint().expandedTo(window.minimumSize());
        QVERIFY2(minimum.width() <= 1024 && minimum.height() <= 700, qPrintable(QStringLiteral("%1×%2").arg(minimum.width()).arg(minimum.height())));
        QCOMPARE(window.size(), QSize(1280, 720));
        for (int t = 0; t < window.tabs()->count(); ++t) { // every tab fits too
            window.tabs()->setCurrentIndex(t);
            QApplication::processEvents();
            QCOMPARE(window.size(), QSize(1280, 720));
        }
        window.tabs()->setCurrentIndex(0);
        QApplication::processEvents();
        const QRectF calibration = window.calibrationView()->chart()->plotArea();
        const QRectF roc = window.rocView()->chart()->plotArea();
        QVERIFY2(std::abs(calibration.width() - calibration.height()) <= 0.1 * std::max(calibration.width(), calibration.height()),
                 qPrintable(QStringLiteral("%1×%2").arg(calibration.width()).arg(calibration.height())));
        QVERIFY2(std::min(calibration.width(), calibration.height()) >= 300,
                 qPrintable(QStringLiteral("%1×%2").arg(calibration.width()).arg(calibration.height())));
        QVERIFY2(std::abs(roc.height() - calibration.height()) <= 0.02 * roc.height(), // as large as the ROC curve
                 qPrintable(QStringLiteral("ROC %1×%2, calibration %3×%4").arg(roc.width()).arg(roc.height()).arg(calibration.width()).arg(calibration.height())));

        ImportDialog dialog;
        dialog.resize(1100, 680);
        dialog.show();
        QVERIFY(dialog.loadFile(sampleFile));
        QApplication::processEvents();
        const int previewHeight = dialog.findChild<QTableWidget*>()->height();
        QVERIFY(dialog.checkNow());
        QApplication::processEvents();
        const QSize dialogMinimum = dialog.minimumSizeHint().expandedTo(dialog.minimumSize());
        QVERIFY2(dialogMinimum.width() <= 1024 && dialogMinimum.height() <= 700,
                 qPrintable(QStringLiteral("%1×%2").arg(dialogMinimum.width()).arg(dialogMinimum.height())));
        QVERIFY2(previewHeight >= 100, qPrintable(QString::number(previewHeight)));
        QCOMPARE(dialog.findChild<QTableWidget*>()->height(), previewHeight); // the check does not squeeze the preview
    }

    void typingAThresholdMovesEveryViewToIt()
    {
        MainWindow window;
        window.show();
        QVERIFY(runAndWait(window, sampleRequest(0)));
        QSignalSpy moved(window.thresholdPanel(), &ThresholdPanel::thresholdChanged);
        QDoubleSpinBox* box = window.thresholdPanel()->spinBox();
        box->setFocus();
        box->selectAll();
        QTest::keyClicks(box, QStringLiteral("0.3"));
        QCOMPARE(moved.count(), 0); // nothing jumps while the value is half typed
        QTest::keyClick(box, Qt::Key_Return);
        QCOMPARE(window.thresholdPanel()->threshold(), 0.3);
        QCOMPARE(box->value(), 0.3);
        QCOMPARE(window.calibrationView()->thresholdLineX(), 0.3);
        QCOMPARE(window.distributionView()->thresholdLineX(), 0.3);
        QCOMPARE(window.decisionCurveView()->thresholdLineX(), 0.3);
        QCOMPARE(window.summaryModel()->threshold(), 0.3);
        const OperatingPointSummary at = summarise(window.snapshot()->validation.models[0].operatingPoints[60]);
        QCOMPARE(window.rocView()->markerPosition(0), QPointF(1.0 - *at.specificity, *at.sensitivity));
        // A value off the 0.005 grid snaps to it when entered.
        box->selectAll();
        QTest::keyClicks(box, QStringLiteral("0.123"));
        QTest::keyClick(box, Qt::Key_Return);
        QCOMPARE(window.thresholdPanel()->threshold(), 0.125);
    }

    void hidingAndShowingAModelLeavesEveryChartAsItWas()
    {
        MainWindow window;
        window.show();
        QVERIFY(runAndWait(window, sampleRequest(20))); // bands, so that band markers could leak
        const QList<QStringList> before = legendsOf(window);
        QVERIFY(before[0].size() == 3 && before[1].size() >= 6); // ROC: two curves and the threshold's dots
        // A ring on model 2's group 3 and its distribution shown.
        window.riskGroupsPanel()->selectGroup(1, 2);
        QVERIFY(window.calibrationView()->highlightedPoint().x() >= 0.0);
        window.overviewPanel()->distributionPicker()->setCurrentIndex(1);
        QCOMPARE(window.distributionView()->model(), 1);
        window.modelToggle(1)->setChecked(false);
        QCOMPARE(window.calibrationView()->highlightedPoint(), QPointF(-1, -1)); // no ring on a hidden model
        QCOMPARE(window.distributionView()->model(), 0); // the distribution shows a model that is shown
        QVERIFY(!window.rocView()->legendEntries().join(QString()).contains(QStringLiteral("local_score")));
        window.modelToggle(1)->setChecked(true);
        QCOMPARE(legendsOf(window), before);
        // Exports draw what the window shows: the legend of a saved SVG has the same entries.
        const QByteArray svg = window.calibrationView()->svg(QSize(700, 560));
        for (const QString& entry : before[1])
            QVERIFY2(svg.contains(entry.toHtmlEscaped().toUtf8()), qPrintable(entry));
    }

    void theImportDialogOffersOnlyUsableColumns()
    {
        QTemporaryDir dir;
        const QString three = dir.filePath(QStringLiteral("three.csv"));
        QFile file(three);
        QVERIFY(file.open(QIODevice::WriteOnly));
        file.write("encounter,readmitted,p,ward\nE1,yes,0.2,A\nE2,no,0.3,B\nE3,maybe,0.5,A\nE4,no,0.1,B\n");
        file.close();
        ImportDialog dialog;
        QVERIFY(dialog.loadFile(three));
        QCOMPARE(dialog.intakeSettings().groupColumns, std::vector<std::string>{"ward"}); // not the outcome
        QCOMPARE(dialog.scoreChoices(), QStringList{QStringLiteral("p")});
        QVERIFY(!dialog.runButton()->isEnabled()); // no outcome yet: Return cannot run
        QVERIFY(dialog.runButton()->isDefault());
        QVERIFY(dialog.loadFile(sampleFile));
        QVERIFY(dialog.runButton()->isEnabled());
        QVERIFY(!dialog.scoreChoices().contains(QStringLiteral("encounter_id")));
        QVERIFY(!dialog.scoreChoices().contains(QStringLiteral("readmitted_30d")));
        QVERIFY(!dialog.scoreChoices().contains(QStringLiteral("hospital")));
        // Subgroups are categories: never the outcome, a score, the id or a date.
        QCOMPARE(dialog.groupChoices(), (QStringList{QStringLiteral("hospital"), QStringLiteral("age_band"), QStringLiteral("sex"),
                                                     QStringLiteral("payer")}));
        for (QPushButton* button : dialog.findChildren<QPushButton*>())
            QVERIFY2(button == dialog.runButton() || !button->autoDefault(), qPrintable(button->text()));
    }

    void theSiteColumnIsPrefilledAndOffersNoOutcomeOrScore()
    {
        ImportDialog dialog;
        QVERIFY(dialog.loadFile(sampleFile));
        auto* site = dialog.findChild<QComboBox*>(QStringLiteral("siteColumn"));
        QVERIFY(site);
        QCOMPARE(site->currentText(), QStringLiteral("hospital")); // a site-like name, guessed in core
        QStringList offered;
        for (int i = 0; i < site->count(); ++i)
            offered << site->itemText(i);
        for (const char* taken : {"readmitted_30d", "supplier_score", "local_score", "encounter_id"})
            QVERIFY2(!offered.contains(QLatin1String(taken)), taken);
        QVERIFY(offered.contains(QStringLiteral("payer")));
        QCOMPARE(dialog.intakeSettings().clusterColumn, std::optional<std::string>("hospital"));
        // Unticking a score offers it again; the site choice stays.
        auto* scores = dialog.findChild<QListWidget*>(QStringLiteral("scoreColumns"));
        QVERIFY(scores);
        for (int i = 0; i < scores->count(); ++i)
            if (scores->item(i)->text() == QStringLiteral("local_score"))
                scores->item(i)->setCheckState(Qt::Unchecked);
        QVERIFY(site->findText(QStringLiteral("local_score")) >= 0);
        QCOMPARE(site->currentText(), QStringLiteral("hospital"));
    }

    void aTypedOutcomesPathIsReadLikeTheCohortPath()
    {
        ImportDialog dialog;
        dialog.show();
        QVERIFY(dialog.loadFile(QStringLiteral(PLUMBLINE_SAMPLE_DATA "/readmission-scores.csv")));
        dialog.findChild<QCheckBox*>(QStringLiteral("twoFiles"))->setChecked(true);
        auto* outcomes = dialog.findChild<QLineEdit*>(QStringLiteral("outcomesPath"));
        outcomes->setFocus();
        QTest::keyClicks(outcomes, QStringLiteral(PLUMBLINE_SAMPLE_DATA "/readmission-outcomes.csv"));
        QTest::keyClick(outcomes, Qt::Key_Return);
        const IntakeSettings mapping = dialog.intakeSettings();
        QCOMPARE(mapping.outcomeColumn, std::string("readmitted_30d"));
        QCOMPARE(mapping.outcomesIdColumn, std::optional<std::string>("encounter_id"));
        QVERIFY(dialog.checkNow());
        QCOMPARE(dialog.checkedIntake()->audit.join->matched, std::size_t(23934));
    }

    void clickingARiskGroupOpensItAndAHiddenModelLeavesTheTable()
    {
        MainWindow window;
        window.show();
        QVERIFY(runAndWait(window, sampleRequest(0)));
        emit window.calibrationView()->riskGroupClicked(1, 9);
        QCOMPARE(window.tabs()->currentWidget(), static_cast<QWidget*>(window.riskGroupsPanel()));
        const QModelIndex current = window.riskGroupView()->selectionModel()->currentIndex();
        QVERIFY(current.isValid());
        QCOMPARE(current.siblingAtColumn(RiskGroupTableModel::GroupColumn).data(Qt::EditRole).toInt(), 10);
        window.modelToggle(0)->setChecked(false);
        QTableView* table = nullptr;
        for (QTableView* view : window.overviewPanel()->findChildren<QTableView*>())
            if (view->model() == window.summaryModel())
                table = view;
        QVERIFY(table && table->isRowHidden(0) && !table->isRowHidden(1));
    }

    void theUpdatingTabShowsTheClosedTestsPValuesInFull()
    {
        MainWindow window;
        QVERIFY(runAndWait(window, sampleRequest(0)));
        QSignalSpy done(window.updatingPanel(), &UpdatingPanel::updateFinished);
        window.updatingPanel()->runUpdate();
        QVERIFY(done.wait(60000));
        QTextDocument shown;
        shown.setHtml(window.updatingPanel()->formulaText()); // as the label renders it
        QVERIFY2(shown.toPlainText().contains(QStringLiteral("slope given intercept p < 0.001")), qPrintable(shown.toPlainText()));
    }

    void thePlannerStartsFromTheLoadedCohort()
    {
        MainWindow window;
        QVERIFY(runAndWait(window, sampleRequest(0)));
        QTimer::singleShot(0, &window, [&] {
            auto* planner = qobject_cast<PlannerDialog*>(QApplication::activeModalWidget());
            QVERIFY(planner);
            // Event rate 3,506 / 23,874 and the first model's C, as the cohort gives them.
            QVERIFY(planner->planText().contains(QStringLiteral("anticipated outcome proportion 0.147")));
            QVERIFY(planner->planText().contains(QStringLiteral("C statistic 0.712")));
            planner->reject();
        });
        for (QAction* action : window.menuBar()->findChildren<QAction*>())
            if (action->text() == QStringLiteral("&Plan a sample size…"))
                action->trigger();
    }

    void theSettingsTabStartsAtTheDefaultsAndCoversTheCommandLinesOptions()
    {
        SettingsPanel panel;
        panel.resize(1280, 500);
        panel.show();
        const auto request = panel.request();
        QVERIFY(request);
        const AnalysisFile defaults;
        QCOMPARE(request->panel.confidence, defaults.panel.confidence);
        QCOMPARE(request->panel.thresholds, defaults.panel.thresholds);
        QCOMPARE(request->bootstrap.replicates, defaults.bootstrap.replicates);
        QCOMPARE(request->bootstrap.seed, defaults.bootstrap.seed);
        QCOMPARE(request->minimumCell, defaults.minimumCell);
        QCOMPARE(request->panel.decisionStep, defaults.panel.decisionStep);
        // Fields at a natural width, not stretched across the window.
        for (QLineEdit* field : panel.findChildren<QLineEdit*>())
            QVERIFY2(field->width() < 700, qPrintable(QString::number(field->width())));
        // The decision range and the NRI cut-points can be set here, with the command line's checks.
        AnalysisRequest changed = *request;
        changed.panel.decisionFrom = 0.02;
        changed.panel.nriCutPoints = {0.15};
        changed.bootstrap.seed = 18446744073709551557ull; // a 64-bit seed survives the round trip
        panel.setRequest(changed);
        QCOMPARE(panel.request()->panel.decisionFrom, 0.02);
        QCOMPARE(panel.request()->panel.nriCutPoints, std::vector<double>{0.15});
        QCOMPARE(panel.request()->bootstrap.seed, 18446744073709551557ull);
        // The shared bounds: a decision step that would draw a million points is refused here too.
        changed.panel.decisionStep = 1e-6;
        panel.setRequest(changed);
        QVERIFY(!panel.request());
        bool shown = false;
        for (QLabel* label : panel.findChildren<QLabel*>())
            shown = shown || label->text().contains(QStringLiteral("Decision curve range: would give"));
        QVERIFY(shown);
    }

    void theAnalysisFileAndTheReportKeepTheWindowsThreshold()
    {
        MainWindow window;
        QVERIFY(runAndWait(window, sampleRequest(0)));
        window.thresholdPanel()->setThreshold(0.35);
        QTemporaryDir dir;
        const QString file = dir.filePath(QStringLiteral("a.plumbline.json"));
        QVERIFY(window.saveAnalysis(file));
        std::vector<std::string> warnings;
        const auto saved = loadAnalysisFile(file.toStdString(), warnings, {true, false}); // the sample lies outside dir
        QVERIFY(saved);
        QCOMPARE(saved->panel.decisionThreshold, 0.35);
        ReportCharts charts(window.snapshot(), window.thresholdPanel()->threshold());
        QCOMPARE(charts.markedThreshold(), 0.35);
        MainWindow reopened;
        QSignalSpy finished(reopened.task(), &ValidationTask::finished);
        QVERIFY(reopened.openAnalysis(file, nullptr, nullptr, true));
        QVERIFY(finished.wait(120000));
        QCOMPARE(reopened.thresholdPanel()->threshold(), 0.35);
        // A name typed without its suffix gets the chosen kind's.
        const QList<FileKind> kinds{{QStringLiteral("PDF report"), QStringLiteral("pdf")}, {QStringLiteral("HTML report"), QStringLiteral("html")}};
        QCOMPARE(withSuffix(QStringLiteral("/tmp/r"), kinds, QStringLiteral("HTML report (*.html)")), QStringLiteral("/tmp/r.html"));
        QCOMPARE(withSuffix(QStringLiteral("/tmp/r.PDF"), kinds, QStringLiteral("HTML report (*.html)")), QStringLiteral("/tmp/r.PDF"));
    }

    void chartsSpeakWordsAndKeepTheirOwnColours()
    {
        MainWindow window;
        window.resize(1400, 900);
        window.show();
        AnalysisRequest request = sampleRequest(0);
        request.intake.groupColumns = {"hospital"};
        request.intake.periodColumn = "discharge_date";
        QVERIFY(runAndWait(window, request));
        // The calibration slope per hospital shows the supplier score too extreme at one site.
        SubgroupPanel* subgroups = window.subgroupPanel();
        window.tabs()->setCurrentWidget(subgroups);
        QApplication::processEvents();
        QVERIFY(subgroups->slopeChart()->chart()->series().size() > 3);
        // Calibration curves by level: the ideal line and one named curve per hospital, each
        // name shown whole in the legend.
        const QStringList levelLegend = subgroups->levelCalibrationChart()->legendEntries();
        QCOMPARE(levelLegend, (QStringList{QStringLiteral("Ideal"), QStringLiteral("Ashford Regional"), QStringLiteral("Harbour General"),
                                           QStringLiteral("Linnet Hill Memorial"), QStringLiteral("Millbrook Community"),
                                           QStringLiteral("Saltmarsh District")}));
        for (QAbstractSeries* s : subgroups->levelCalibrationChart()->chart()->series())
            QVERIFY(qobject_cast<QLineSeries*>(s)->count() >= 2);
        // Funnel: both pairs of limits in the legend, every level named, no two names overlapping.
        const QStringList funnelLegend = subgroups->funnelChart()->legendEntries();
        QVERIFY(funnelLegend.contains(QStringLiteral("95 % limits")) && funnelLegend.contains(QStringLiteral("99.8 % limits")));
        const auto& labels = subgroups->funnelChart()->labels();
        QCOMPARE(labels.size(), std::size_t(5));
        for (std::size_t a = 0; a < labels.size(); ++a)
            for (std::size_t b = a + 1; b < labels.size(); ++b)
                QVERIFY(!labels[a]->sceneBoundingRect().intersects(labels[b]->sceneBoundingRect()));
        // Over time runs left to right: one point per period, in time order.
        const auto periods = window.snapshot()->validation.periods->results;
        QLineSeries* trend = nullptr;
        for (QAbstractSeries* s : window.periodPanel()->oeChart()->chart()->series())
            if (s->name() == QStringLiteral("by period"))
                trend = qobject_cast<QLineSeries*>(s);
        QVERIFY(trend);
        QVERIFY(trend->count() >= 12);
        for (int k = 1; k < trend->count(); ++k)
            QVERIFY(trend->at(k).x() > trend->at(k - 1).x());
        // Labels a person reads are words: no JSON key or method key in the metric table.
        QStringList keys;
        for (const auto key : panelKeys)
            keys << QString::fromLatin1(key.data(), qsizetype(key.size()));
        for (CiMethod m : {CiMethod::DeLongLogit, CiMethod::Wald, CiMethod::LogNormal, CiMethod::ExactPoisson, CiMethod::BootstrapBca,
                           CiMethod::BootstrapPercentile})
            keys << QString::fromStdString(ciMethodName(m));
        for (int row = 0; row < window.metricModel()->rowCount(); ++row)
            for (int column = 0; column < window.metricModel()->columnCount(); ++column)
                for (const int role : {int(Qt::DisplayRole), int(Qt::ToolTipRole)}) {
                    const QString text = window.metricModel()->index(row, column).data(role).toString();
                    for (const QString& key : keys)
                        QVERIFY2(!text.contains(key), qPrintable(key + QStringLiteral(" in ") + text));
                }
        // Edit → Copy chart puts the chart last clicked on the clipboard.
        window.tabs()->setCurrentIndex(0);
        QApplication::processEvents();
        QTest::mouseClick(window.calibrationView()->viewport(), Qt::LeftButton, {}, QPoint(5, 5));
        QCOMPARE(window.currentChart(), static_cast<ExportableChartView*>(window.calibrationView()));
        QApplication::clipboard()->clear();
        for (QAction* action : window.menuBar()->findChildren<QAction*>())
            if (action->text() == QStringLiteral("Copy &chart"))
                action->trigger();
        QVERIFY(!QApplication::clipboard()->image().isNull());
    }
};

PLUMBLINE_FRESH_SETTINGS_MAIN(FirstRunTests)
#include "first_run_tests.moc"
