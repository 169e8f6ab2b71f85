#include "files/analysis_file.hpp"
#include "analyses/bootstrap_engine.hpp"
#include "charts/calibration_chart_view.hpp"
#include "files/cohort_simulator.hpp"
#include "panels/comparison_panel.hpp"
#include "charts/decision_curve_view.hpp"
#include "panels/period_panel.hpp"
#include "dialogs/planner_dialog.hpp"
#include "panels/subgroup_panel.hpp"
#include "analyses/model_updating.hpp"

#include <QProgressBar>
#include "panels/updating_panel.hpp"
#include "widgets/copyable_table_view.hpp"
#include "widgets/elided_label.hpp"
#include "dialogs/import_dialog.hpp"
#include "main_window.hpp"
#include "models/metric_table_model.hpp"
#include "metrics/panel_keys.hpp"
#include "charts/risk_distribution_view.hpp"
#include "models/risk_group_table_model.hpp"
#include "analyses/sample_size.hpp"
#include "charts/roc_chart_view.hpp"
#include "panels/threshold_panel.hpp"
#include "models/threshold_summary_model.hpp"
#include "run/validation_task.hpp"
#include "support/fresh_settings_main.hpp"
#include "support/window_test_support.hpp"

#include <QDir>
#include <QElapsedTimer>
#include <QFile>
#include <QImage>
#include <QProcess>
#include <QSignalSpy>
#include <QSortFilterProxyModel>
#include <QSlider>
#include <QStatusBar>
#include <QTemporaryDir>
#include <QTabWidget>
#include <QTableWidget>
#include <QTest>
#include <QApplication>
#include <QChart>
#include <QComboBox>
#include <QLineSeries>
#include <QTimer>

using namespace plumbline;
using namespace plumbline::testing;

namespace {

// The core's own answer for a request, computed here without the window.
ValidationResult coreResult(const AnalysisRequest& request)
{
    const auto intake = runIntake(request.intake);
    ValidationResult result = runValidation(intake->cohort, request.panel);
    if (request.bootstrap.replicates > 0)
        applyBootstrap(result, *runBootstrap(intake->cohort, result, request.bootstrap, {}, {}));
    return result;
}

} // namespace

class MainWindowTests : public QObject {
    Q_OBJECT
private slots:
    void theAnalyticPanelShowsBeforeTheBootstrapEnds()
    {
        // A long bootstrap must not leave the window empty: the panel with analytic intervals
        // comes first, the bootstrap's replaces it, and the title says which is shown.
        MainWindow window;
        window.show();
        QSignalSpy analytic(window.task(), &ValidationTask::panelReady);
        QSignalSpy finished(window.task(), &ValidationTask::finished);
        window.runRequest(sampleRequest(300));
        QVERIFY(analytic.wait(60000) || analytic.count() == 1);
        QApplication::processEvents();
        if (finished.count() == 0) {
            QVERIFY(window.snapshot());
            QVERIFY(!window.snapshot()->validation.bootstrap);
            QVERIFY(window.findChild<QProgressBar*>()->isVisible());
        }
        QVERIFY(finished.count() == 1 || finished.wait(180000));
        QCOMPARE(analytic.count(), 1);
        const auto firstShown = analytic.at(0).at(0).value<SnapshotPointer>();
        QVERIFY(firstShown && !firstShown->validation.bootstrap && firstShown->cohort);
        QVERIFY(window.snapshot()->validation.bootstrap);
        QVERIFY(!window.findChild<QProgressBar*>()->isVisible());
    }

    void theCalibrationLegendNamesABandOnlyWhenTheBootstrapDrewOne()
    {
        // Analytic intervals only (no bootstrap, or while it runs): no band is drawn, and the
        // legend must not promise one.
        auto legend = [](MainWindow& window) {
            QStringList names;
            for (const auto* series : window.calibrationView()->chart()->series())
                names << series->name();
            return names.join(QLatin1Char('|'));
        };
        MainWindow analytic;
        analytic.show();
        QVERIFY(runAndWait(analytic, sampleRequest(0)));
        QVERIFY(!legend(analytic).contains(QStringLiteral("with band")));
        QVERIFY(legend(analytic).split(QLatin1Char('|')).contains(QStringLiteral("lines: smoothed")));
        MainWindow bootstrapped;
        bootstrapped.show();
        QVERIFY(runAndWait(bootstrapped, sampleRequest(50)));
        QVERIFY(legend(bootstrapped).contains(QStringLiteral("with band")));
    }

    void theStatusBarCountsTheWarningsInWords()
    {
        // The sample cohort drifts in its second year: one warning per model over time.
        auto statusAfter = [](AnalysisRequest request) {
            MainWindow window;
            window.show();
            request.intake.periodColumn = "discharge_date";
            if (!runAndWait(window, request))
                return QStringLiteral("(the run did not end)");
            const std::size_t warnings = window.snapshot()->validation.warnings.size() + window.snapshot()->audit.warnings.size();
            return QString::number(warnings) + QLatin1Char(' ') + window.statusBar()->findChild<ElidedLabel*>()->fullText();
        };
        AnalysisRequest one = sampleRequest(0);
        one.intake.scoreColumns = {"supplier_score"};
        QCOMPARE(statusAfter(one), QStringLiteral("1 Done. 1 warning: see the Cohort tab."));
        QCOMPARE(statusAfter(sampleRequest(0)), QStringLiteral("2 Done. 2 warnings: see the Cohort tab."));
    }

    void theTimeTabCountsUndatedRowsInWords()
    {
        // The sample cohort with the dates of its first one or two patients blanked.
        QTemporaryDir folder;
        QFile sample(sampleFile);
        QVERIFY(sample.open(QIODevice::ReadOnly));
        const QList<QByteArray> rows = sample.readAll().split('\n');
        const int dateField = int(rows.front().split(',').indexOf("discharge_date"));
        QVERIFY(dateField >= 0);
        auto noteWith = [&](int blanked) {
            QList<QByteArray> edited = rows;
            for (int r = 1; r <= blanked; ++r) {
                QList<QByteArray> fields = edited[r].split(',');
                fields[dateField] = "";
                edited[r] = fields.join(',');
            }
            const QString path = folder.filePath(QStringLiteral("undated-%1.csv").arg(blanked));
            QFile out(path);
            if (!out.open(QIODevice::WriteOnly) || out.write(edited.join('\n')) < 0)
                return QStringLiteral("(not written)");
            out.close();
            MainWindow window;
            window.show();
            AnalysisRequest request = sampleRequest(0);
            request.intake.cohortFile = path.toStdString();
            request.intake.periodColumn = "discharge_date";
            if (!runAndWait(window, request) || !window.snapshot()->validation.periods)
                return QStringLiteral("(no view over time)");
            return window.periodPanel()->noteText();
        };
        QVERIFY(noteWith(1).contains(QStringLiteral("1 row without a usable date is left out of this view.")));
        QVERIFY(noteWith(2).contains(QStringLiteral("2 rows without a usable date are left out of this view.")));
    }

    void theDialogGuessesTheSampleAndTheTableShowsTheCoresNumbers()
    {
        ImportDialog dialog;
        QVERIFY(dialog.loadFile(sampleFile));
        const IntakeSettings guessed = dialog.intakeSettings();
        QCOMPARE(guessed.outcomeColumn, std::string("readmitted_30d"));
        QCOMPARE(guessed.scoreColumns, (std::vector<std::string>{"supplier_score", "local_score"}));
        QVERIFY(dialog.checkNow());
        QCOMPARE(dialog.checkedIntake()->audit.rowsUsed, std::size_t(23874));

        MainWindow window;
        AnalysisRequest request = sampleRequest(100);
        request.intake = guessed;
        request.intake.scale = ScoreScale::Probability;
        QVERIFY(runAndWait(window, request));
        const ValidationResult expected = coreResult(request);
        MetricTableModel* table = window.metricModel();
        QCOMPARE(table->rowCount(), int(PanelMetricCount));
        for (int m = 0; m < 2; ++m)
            for (std::size_t k = 0; k < PanelMetricCount; ++k) {
                const MetricEntry& entry = expected.models[std::size_t(m)].metrics[k];
                const QModelIndex cell = table->index(int(k), MetricTableModel::estimateColumn(m));
                QCOMPARE(cell.data().toString(), estimateText(entry.key, entry.estimate));
                QCOMPARE(table->index(int(k), MetricTableModel::estimateColumn(m) + 1).data().toString(),
                         QString::fromStdString(entry.reading));
            }
    }

    void movingTheThresholdMovesEveryMarkerToTheCoresCounts()
    {
        MainWindow window;
        const AnalysisRequest request = sampleRequest(0);
        QVERIFY(runAndWait(window, request));
        const auto intake = runIntake(request.intake);
        for (int step : {20, 31, 60, 113}) {
            window.thresholdPanel()->slider()->setValue(step);
            const double t = step / 200.0; // the slider's grid: 0.005 per step
            QCOMPARE(window.calibrationView()->thresholdLineX(), t);
            QCOMPARE(window.distributionView()->thresholdLineX(), t);
            for (int m = 0; m < 2; ++m) {
                const auto& risks = intake->cohort.models[std::size_t(m)].values;
                const std::vector<double> thresholds{t};
                const ThresholdMetrics core = thresholdMetrics(intake->cohort.outcome, risks, thresholds, 0.95, CiMethod::Wilson)[0];
                ThresholdSummaryModel* model = window.summaryModel();
                QCOMPARE(model->index(m, ThresholdSummaryModel::TpColumn).data(Qt::UserRole).toULongLong(), qulonglong(core.tp));
                QCOMPARE(model->index(m, ThresholdSummaryModel::FpColumn).data(Qt::UserRole).toULongLong(), qulonglong(core.fp));
                QCOMPARE(model->index(m, ThresholdSummaryModel::TnColumn).data(Qt::UserRole).toULongLong(), qulonglong(core.tn));
                QCOMPARE(model->index(m, ThresholdSummaryModel::FnColumn).data(Qt::UserRole).toULongLong(), qulonglong(core.fn));
                QCOMPARE(model->index(m, ThresholdSummaryModel::NetBenefitColumn).data(Qt::UserRole).toDouble(), core.netBenefit);
                const QPointF marker = window.rocView()->markerPosition(m);
                QCOMPARE(marker.x(), 1.0 - *core.specificity.value);
                QCOMPARE(marker.y(), *core.sensitivity.value);
            }
        }
    }

    void selectingARiskGroupRowRingsItsPoint()
    {
        MainWindow window;
        QVERIFY(runAndWait(window, sampleRequest(0)));
        CopyableTableView* view = window.riskGroupView();
        const int row = window.riskGroupModel()->rowOf(1, 4);
        QVERIFY(row >= 0);
        view->selectionModel()->setCurrentIndex(view->model()->index(row, 0), QItemSelectionModel::ClearAndSelect);
        const RiskGroup& group = window.snapshot()->validation.models[1].riskGroups[4];
        QCOMPARE(window.calibrationView()->highlightedPoint(), QPointF(group.meanPredicted, group.observedRate));
        // Hovering a point (the chart's signal) selects its row in the table.
        emit window.calibrationView()->riskGroupHovered(0, 3);
        const QModelIndex current = view->selectionModel()->currentIndex();
        QCOMPARE(window.riskGroupModel()->groupAt(qobject_cast<QSortFilterProxyModel*>(view->model())->mapToSource(current).row()),
                 std::make_pair(0, 3));
        const RiskGroup& hovered = window.snapshot()->validation.models[0].riskGroups[3];
        QCOMPARE(window.calibrationView()->highlightedPoint(), QPointF(hovered.meanPredicted, hovered.observedRate));
        const QString text = view->tabSeparatedText();
        QVERIFY(text.startsWith(QStringLiteral("Model\tGroup\tPatients")));
        QCOMPARE(text.count(QLatin1Char('\n')), 2); // header and the selected row
    }

    void theDialogRefusesABadFileWithTheCommandLinesMessage()
    {
        QTemporaryDir dir;
        const QString bad = dir.filePath(QStringLiteral("three.csv"));
        QFile file(bad);
        QVERIFY(file.open(QIODevice::WriteOnly));
        file.write("y,p\nyes,0.2\nno,0.3\nmaybe,0.5\n");
        file.close();
        ImportDialog dialog;
        QVERIFY(dialog.loadFile(bad));
        IntakeSettings mapping;
        mapping.outcomeColumn = "y"; // three values, so no guess: the user picks it, as on the command line
        mapping.scoreColumns = {"p"};
        dialog.setMapping(mapping);
        QVERIFY(!dialog.checkNow());
        QProcess cli;
        cli.start(QStringLiteral(PLUMBLINE_CLI), {QStringLiteral("validate"), bad, QStringLiteral("--outcome"), QStringLiteral("y"),
                                                  QStringLiteral("--score"), QStringLiteral("p"), QStringLiteral("--bootstrap"), QStringLiteral("0")});
        QVERIFY(cli.waitForFinished(30000));
        QCOMPARE(cli.exitCode(), 2);
        const QString cliMessage = QString::fromUtf8(cli.readAllStandardError()).trimmed();
        QCOMPARE(QStringLiteral("plumbline-cli: error: ") + dialog.problemText(), cliMessage);
        QVERIFY(dialog.problemText().contains(QStringLiteral("'maybe'")));
        QVERIFY(!dialog.loadFile(dir.filePath(QStringLiteral("missing.csv"))));
        QVERIFY(dialog.problemText().contains(QStringLiteral("cannot be opened")));
    }

    void cancelStopsARunAndKeepsTheShownResults()
    {
        MainWindow window;
        QVERIFY(runAndWait(window, sampleRequest(0)));
        const SnapshotPointer before = window.snapshot();
        QSignalSpy cancelled(window.task(), &ValidationTask::cancelled);
        window.runRequest(sampleRequest(20000));
        QTest::qWait(500);
        window.task()->cancel();
        QVERIFY(cancelled.wait(5000) || cancelled.count() == 1);
        // Cancelled before the new panel: the previous results stay. After it: the new run's
        // analytic panel stays (its bootstrap never applied), and the status says so.
        const SnapshotPointer shown = window.snapshot();
        if (shown != before) {
            QVERIFY(!shown->validation.bootstrap);
            QCOMPARE(shown->request.bootstrap.replicates, std::size_t(20000));
        }
    }

    void aLargeRunNeverBlocksTheEventLoopWhileTheThresholdMoves()
    {
        QTemporaryDir dir;
        const QString path = dir.filePath(QStringLiteral("large.csv"));
        QFile file(path);
        QVERIFY(file.open(QIODevice::WriteOnly));
        file.write(QByteArray::fromStdString(simulateCohort({200000, 5}, false).cohort));
        file.close();
        MainWindow window;
        window.show();
        AnalysisRequest request = sampleRequest(300);
        request.intake.cohortFile = path.toStdString();
        QSignalSpy finished(window.task(), &ValidationTask::finished);
        QElapsedTimer clock;
        qint64 last = 0, longestGap = 0;
        int ticks = 0;
        QTimer timer;
        connect(&timer, &QTimer::timeout, this, [&] {
            const qint64 now = clock.elapsed();
            longestGap = std::max(longestGap, now - last);
            last = now;
            window.thresholdPanel()->slider()->setValue(20 + (++ticks % 100)); // a user dragging
        });
        clock.start();
        timer.start(10);
        window.runRequest(request);
        QVERIFY(finished.wait(180000));
        timer.stop();
        qInfo() << "longest gap between timer ticks:" << longestGap << "ms over" << ticks << "ticks";
        QVERIFY(ticks > 10);
        QVERIFY2(longestGap < 200, qPrintable(QStringLiteral("longest gap %1 ms").arg(longestGap)));
    }

    void theComparisonAndUpdatingTabsShowTheCoresResults()
    {
        MainWindow window;
        window.resize(1500, 1000);
        AnalysisRequest request = sampleRequest(0);
        QVERIFY(runAndWait(window, request));
        // Comparison: the table holds the core's ΔC for local_score − supplier_score.
        const ModelComparison& comparison = window.snapshot()->validation.comparisons.at(0);
        QTableWidget* table = window.comparisonPanel()->differenceTable();
        QCOMPARE(table->item(0, 1)->text(), QString::number(*comparison.difference("c_statistic_difference")->estimate.value, 'f', 4));
        window.thresholdPanel()->setThreshold(0.3);
        const OperatingPointSummary atA = summarise(window.snapshot()->validation.models[0].operatingPoints[60]);
        QVERIFY(window.comparisonPanel()->thresholdText().contains(QString::number(atA.netBenefit, 'f', 4)));
        // Updating: the panel runs the core's update and shows its formula.
        QSignalSpy done(window.updatingPanel(), &UpdatingPanel::updateFinished);
        window.updatingPanel()->runUpdate();
        QVERIFY(done.wait(60000));
        UpdateSettings settings;
        settings.seed = request.bootstrap.seed;
        const auto intake = runIntake(request.intake);
        const auto expected = updateModel(intake->cohort.outcome, intake->cohort.models[0].values, "supplier_score", settings);
        QVERIFY(window.updatingPanel()->formulaText().contains(QString::fromStdString(expected->fit.formula())));
        QCOMPARE(window.updatingPanel()->optimismTable()->rowCount(), int(expected->optimism.size()));
        QCOMPARE(window.updatingPanel()->optimismTable()->item(2, 3)->text(), QString::number(expected->optimism[2].corrected, 'f', 4));
        if (qEnvironmentVariableIsSet("PLUMBLINE_TEST_SCREENSHOTS")) {
            auto* tabs = window.findChild<QTabWidget*>();
            for (int t = 0; t < tabs->count(); ++t) {
                tabs->setCurrentIndex(t);
                QApplication::processEvents();
                window.grab().save(QStringLiteral("%1/tab-%2.png").arg(qEnvironmentVariable("PLUMBLINE_TEST_SCREENSHOTS")).arg(t));
            }
        }
    }

    void theNetBenefitSubgroupAndTimeTabsShowTheCoresResults()
    {
        MainWindow window;
        window.resize(1500, 1000);
        AnalysisRequest request = sampleRequest(0);
        request.intake.groupColumns = {"hospital", "age_band"};
        request.intake.periodColumn = "discharge_date";
        QVERIFY(runAndWait(window, request));
        const ValidationResult& result = window.snapshot()->validation;
        QVERIFY(result.subgroups && result.periods);
        // Net benefit: one curve per model, treat all, treat none and the threshold line, which
        // follows the shared threshold.
        QChart* chart = window.decisionCurveView()->chart();
        QCOMPARE(chart->series().size(), qsizetype(5));
        window.thresholdPanel()->setThreshold(0.3);
        auto* line = qobject_cast<QLineSeries*>(chart->series().back());
        QVERIFY(line && line->count() == 2);
        QCOMPARE(line->at(0).x(), 0.3);
        auto* first = qobject_cast<QLineSeries*>(chart->series().front());
        QCOMPARE(first->at(0).y(), result.models[0].decisionCurve[0].netBenefit);
        // Subgroups: a choice per column and model; the summary carries the core's Q.
        QCOMPARE(window.subgroupPanel()->picker()->count(), 4);
        const HeterogeneityTest* test = nullptr;
        for (const auto& h : result.subgroups->heterogeneity)
            if (h.column == "hospital" && h.model == "supplier_score" && h.metric == "calibration_intercept")
                test = &h;
        QVERIFY(test);
        QVERIFY(window.subgroupPanel()->summaryText().contains(QString::number(test->q, 'f', 2)));
        // Over time: the core's drift warning and the usual causes of drift.
        QVERIFY(!result.periods->warnings.empty());
        QVERIFY(window.periodPanel()->noteText().contains(QString::fromStdString(result.periods->warnings.front())));
        QVERIFY(window.periodPanel()->noteText().contains(QStringLiteral("coding")));
        if (qEnvironmentVariableIsSet("PLUMBLINE_TEST_SCREENSHOTS")) {
            auto* tabs = window.findChild<QTabWidget*>();
            for (int t = 3; t < 6; ++t) {
                tabs->setCurrentIndex(t);
                QApplication::processEvents();
                window.grab().save(QStringLiteral("%1/usefulness-%2.png").arg(qEnvironmentVariable("PLUMBLINE_TEST_SCREENSHOTS")).arg(t));
            }
        }
    }

    void thePlannerShowsTheCoresPlanAndRefusesABadThreshold()
    {
        // docs/methods.md §22 worked example (Riley et al. 2021 criteria, formulas from memory;
        // computed with numpy and scipy 1.10): φ 0.15, C 0.70 →
        // 2185 patients for O/E, and the calibration slope drives the minimum.
        PlannerDialog dialog;
        dialog.setInputs(0.15, 0.70, QStringLiteral("0.15"));
        SampleSizeTargets targets;
        targets.thresholds = {0.15};
        const auto plan = planSampleSize(0.15, 0.70, targets);
        QVERIFY(plan);
        QCOMPARE(dialog.planText(), QString::fromStdString(describePlan(*plan, 0.15, 0.70, targets)));
        QVERIFY(dialog.planText().contains(QStringLiteral("2185")));
        QVERIFY(dialog.planText().contains(QStringLiteral("driven by the calibration slope")));
        dialog.setInputs(0.15, 0.70, QStringLiteral("0.1, 1.5"));
        QVERIFY(dialog.planText().contains(QStringLiteral("'1.5' is not a risk")));
        // The loaded cohort's achieved precision, as the core computed it.
        dialog.setAchieved({{"supplier_score", "c_statistic", 0.0179, 0.1}, {"supplier_score", "calibration_slope", 0.25, 0.2}});
        QVERIFY(dialog.achievedText().contains(QStringLiteral("supplier_score, C statistic: 0.018 (target 0.10, met)")));
        QVERIFY(dialog.achievedText().contains(QStringLiteral("Calibration slope: 0.250 (target 0.20, not met)")));
        if (qEnvironmentVariableIsSet("PLUMBLINE_TEST_SCREENSHOTS"))
            dialog.grab().save(QStringLiteral("%1/planner.png").arg(qEnvironmentVariable("PLUMBLINE_TEST_SCREENSHOTS")));
    }

    void theWindowAndTheCommandLineWriteTheSameTablesFromOneAnalysisFile()
    {
        QTemporaryDir dir;
        AnalysisFile analysis;
        analysis.intake = sampleRequest(30).intake;
        analysis.bootstrap.replicates = 30;
        analysis.bootstrap.seed = 5;
        analysis.report.title = QStringLiteral("Same numbers everywhere").toStdString();
        const QString file = dir.filePath(QStringLiteral("a.plumbline.json"));
        QVERIFY(saveAnalysisFile(file.toStdString(), analysis).has_value());
        QProcess cli;
        cli.start(QStringLiteral(PLUMBLINE_CLI), {QStringLiteral("validate"), QStringLiteral("--settings"), file, QStringLiteral("--allow-outside-paths"),
                                                  QStringLiteral("--csv-dir"), dir.filePath(QStringLiteral("cli"))});
        QVERIFY(cli.waitForFinished(120000));
        QCOMPARE(cli.exitCode(), 0);
        MainWindow window;
        QSignalSpy finished(window.task(), &ValidationTask::finished);
        QVERIFY(window.openAnalysis(file, nullptr, nullptr, true)); // the sample lies outside the analysis's folder
        QVERIFY(finished.wait(120000));
        QVERIFY(window.exportTables(dir.filePath(QStringLiteral("gui"))));
        const QStringList tables = QDir(dir.filePath(QStringLiteral("cli"))).entryList({QStringLiteral("*.csv")});
        QVERIFY(tables.size() >= 10);
        for (const QString& table : tables) {
            QFile a(dir.filePath(QStringLiteral("cli/") + table)), b(dir.filePath(QStringLiteral("gui/") + table));
            QVERIFY(a.open(QIODevice::ReadOnly) && b.open(QIODevice::ReadOnly));
            QVERIFY2(a.readAll() == b.readAll(), qPrintable(table));
        }
    }

    void anAnalysisNamingAFileOutsideItsFolderIsNotReadUnasked()
    {
        QTemporaryDir dir;
        AnalysisFile analysis;
        analysis.intake = sampleRequest(0).intake; // the sample lies outside dir
        const QString file = dir.filePath(QStringLiteral("a.plumbline.json"));
        QVERIFY(saveAnalysisFile(file.toStdString(), analysis).has_value());
        MainWindow window;
        QString error;
        QVERIFY(!window.openAnalysis(file, nullptr, &error));
        QVERIFY(error.contains(QStringLiteral("outside the analysis file's folder")));
        QVERIFY(!window.task()->isRunning());
        // The window's exports never replace an input either.
        QVERIFY(runAndWait(window, sampleRequest(0)));
        QVERIFY(!window.exportReport(sampleFile, &error));
        QVERIFY(error.contains(QStringLiteral("names an input")));
        QVERIFY(!window.saveAnalysis(sampleFile, &error));
    }

    void chartsExportAsPngAndSvg()
    {
        MainWindow window;
        QVERIFY(runAndWait(window, sampleRequest(0)));
        QTemporaryDir dir;
        const QString png = dir.filePath(QStringLiteral("roc.png"));
        const QString svg = dir.filePath(QStringLiteral("calibration.svg"));
        QVERIFY(window.rocView()->exportTo(png, QSize(800, 600)));
        QVERIFY(window.calibrationView()->exportTo(svg, QSize(800, 600)));
        const QImage image(png);
        QCOMPARE(image.size(), QSize(1600, 1200)); // drawn at twice the size for high-DPI use
        QFile file(svg);
        QVERIFY(file.open(QIODevice::ReadOnly));
        const QByteArray content = file.readAll();
        QVERIFY(content.contains("<svg"));
        QVERIFY(content.contains("Predicted risk"));
        QVERIFY(!window.rocView()->exportTo(dir.filePath(QStringLiteral("no/such/dir/x.png")), QSize(100, 100)));
    }
};

PLUMBLINE_FRESH_SETTINGS_MAIN(MainWindowTests)
#include "main_window_tests.moc"
