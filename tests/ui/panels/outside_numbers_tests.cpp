// One number on every results tab of the window, as a person reads it, checked against a value
// computed outside the program from the bundled sample cohort (the rows the documented intake
// rules keep: 23,874 patients, 3,506 events), with Debian 12's scikit-learn 1.2.1, statsmodels
// 0.13.5, scipy 1.10.1 and pandas 1.5 under /usr/bin/python3. The snippet that computed each is
// beside it (rows as in tests/reference/reference_rows.py; y the outcome, a the supplier score,
// b the local score, lp = log(a / (1 - a))). The other window tests compare widgets with the
// core's own results; these catch a core and a window that are wrong together.
#include "support/fresh_settings_main.hpp"
#include "support/window_test_support.hpp"

#include "panels/comparison_panel.hpp"
#include "charts/decision_curve_view.hpp"
#include "models/metric_table_model.hpp"
#include "panels/overview_panel.hpp"
#include "charts/period_chart_view.hpp"
#include "panels/period_panel.hpp"
#include "models/risk_group_table_model.hpp"
#include "panels/subgroup_panel.hpp"
#include "panels/threshold_panel.hpp"
#include "models/threshold_summary_model.hpp"
#include "panels/updating_panel.hpp"

#include <QLabel>
#include <QLineSeries>
#include <QTableWidget>
#include <QTest>

using namespace plumbline;
using namespace plumbline::testing;

namespace {

double leadingNumber(const QString& text)
{
    return text.section(QLatin1Char(' '), 0, 0).toDouble();
}

} // namespace

class OutsideNumbersTests : public QObject {
    Q_OBJECT
private slots:
    void everyTabShowsANumberAnOutsideComputationGives()
    {
        MainWindow window;
        window.resize(1280, 720);
        // The window's own defaults (a fresh settings store), with the columns a person maps and
        // analytic intervals only, to keep the test short.
        AnalysisRequest request;
        request.intake.cohortFile = sampleFile.toStdString();
        request.intake.outcomeColumn = "readmitted_30d";
        request.intake.scoreColumns = {"supplier_score", "local_score"};
        request.intake.groupColumns = {"hospital"};
        request.intake.periodColumn = "discharge_date";
        request.bootstrap.replicates = 0;
        QVERIFY(runAndWait(window, request));

        // Metrics: the supplier's C. roc_auc_score(y, a) = 0.7123673691021877.
        MetricTableModel* metrics = window.metricModel();
        QCOMPARE(leadingNumber(metrics->index(CStatistic, 1).data().toString()), 0.712);

        // Overview: sensitivity at the acting threshold 0.2 (risk >= t).
        // tp = ((a >= 0.2) & (y == 1)).sum(); tp / y.sum() = 0.661437535653166.
        window.thresholdPanel()->setThreshold(0.2);
        ThresholdSummaryModel* summary = window.summaryModel();
        QCOMPARE(summary->index(0, ThresholdSummaryModel::SensitivityColumn).data().toString(), QStringLiteral("0.661"));

        // Risk groups: the first group's Wilson interval from the counts the table shows.
        // statsmodels.stats.proportion.proportion_confint(events, n, alpha=0.05, method="wilson").
        RiskGroupTableModel* groups = window.riskGroupModel();
        const int n = groups->index(0, RiskGroupTableModel::PatientsColumn).data().toInt();
        const int events = groups->index(0, RiskGroupTableModel::EventsColumn).data().toInt();
        // numpy: the lowest tenth of risks with ties kept together, r = np.sort(a)[ceil(N/10) - 1],
        // group = a <= r: 2,393 patients, 71 events (the tie-aware rule of README "What validate
        // reports"; deciles with ties kept whole are common practice).
        QCOMPARE(n, 2393);
        QCOMPARE(events, 71);
        // proportion_confint(71, 2393, method="wilson") = (0.02358922278528324, 0.03725813041948473)
        QCOMPARE(groups->index(0, RiskGroupTableModel::LowerColumn).data().toString(), QStringLiteral("0.0236"));
        QCOMPARE(groups->index(0, RiskGroupTableModel::UpperColumn).data().toString(), QStringLiteral("0.0373"));

        // Comparison: the difference in C, local - supplier.
        // roc_auc_score(y, b) - roc_auc_score(y, a) = -0.010400634878419579.
        QTableWidget* differences = window.comparisonPanel()->differenceTable();
        QCOMPARE(differences->item(0, 1)->text(), QStringLiteral("-0.0104"));

        // Net benefit: the supplier's curve at its first threshold, 0.05.
        // tp/n - fp/n * 0.05/0.95 with flagged = a >= 0.05: 0.10387428737715108.
        auto* curve = qobject_cast<QLineSeries*>(window.decisionCurveView()->chart()->series().front());
        QVERIFY(curve);
        QCOMPARE(curve->at(0).x(), 0.05);
        QVERIFY(std::abs(curve->at(0).y() - 0.10387428737715108) < 1e-12);

        // Subgroups: Cochran's Q of the supplier's calibration-in-the-large across hospitals.
        // Per hospital: sm.GLM(y, 1, Binomial, offset=lp).fit(); w = 1/bse^2; Q = sum w (x - xw)^2
        // = 175.85087074204029 (p = scipy.stats.chi2.sf(Q, 4) = 5.8e-37).
        QVERIFY2(window.subgroupPanel()->summaryText().contains(QStringLiteral("175.85")),
                 qPrintable(window.subgroupPanel()->summaryText()));

        // Over time: the supplier's O/E in the first month, 2024-01.
        // y[m].sum() / a[m].sum() for the rows discharged in 2024-01 = 0.7915365761645655.
        QLineSeries* trend = nullptr;
        for (QAbstractSeries* series : window.periodPanel()->oeChart()->chart()->series())
            if (series->name() == QStringLiteral("by period"))
                trend = qobject_cast<QLineSeries*>(series);
        QVERIFY(trend && trend->count() > 0);
        QVERIFY2(std::abs(trend->at(0).y() - 0.7915365761645655) < 1e-9, qPrintable(QString::number(trend->at(0).y(), 'g', 17)));

        // Updating: the logistic recalibration of the supplier's score.
        // sm.Logit(y, sm.add_constant(lp)).fit() -> intercept -0.84262585, slope 0.66567355.
        QSignalSpy done(window.updatingPanel(), &UpdatingPanel::updateFinished);
        window.updatingPanel()->runUpdate();
        QVERIFY(done.wait(120000));
        const QString formula = window.updatingPanel()->formulaText();
        QVERIFY2(formula.contains(QStringLiteral("-0.8426")) && formula.contains(QStringLiteral("0.6657")), qPrintable(formula));

        // Cohort: the rows the documented rules keep (pandas: 23,874 used, 3,506 events).
        QString cohortText;
        for (QLabel* label : window.tabs()->widget(window.tabs()->count() - 2)->findChildren<QLabel*>())
            cohortText += label->text();
        QVERIFY2(cohortText.contains(QLocale().toString(23874)) && cohortText.contains(QLocale().toString(3506)), qPrintable(cohortText));
    }
};

PLUMBLINE_FRESH_SETTINGS_MAIN(OutsideNumbersTests)
#include "outside_numbers_tests.moc"
