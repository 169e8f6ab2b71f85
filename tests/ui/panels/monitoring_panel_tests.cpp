// The Monitoring tab shows the core's monitoring of a snapshot: the charts' points are the
// core's thinned paths and limits, the scope chooser lists the whole cohort and each site, and
// the note carries the control limits, the signals and the coding-shift question.
#include "analyses/validation.hpp"
#include "charts/case_mix_view.hpp"
#include "charts/monitoring_path_view.hpp"
#include "panels/monitoring_panel.hpp"
#include "panels/settings_panel.hpp"
#include "reporting/value_text.hpp"
#include "resampling/random_stream.hpp"
#include "support/fresh_settings_main.hpp"

#include <QAbstractAxis>
#include <QChart>
#include <QComboBox>
#include <QDoubleSpinBox>
#include <QLineEdit>
#include <QLineSeries>
#include <QScatterSeries>
#include <QTest>

#include <cmath>

using namespace plumbline;

namespace {

// Two years, two sites, 4 patients a day; in the second year the predicted logits are raised
// by 0.6 with outcomes unchanged, so the coding-shift question is asked.
SnapshotPointer simulatedSnapshot()
{
    Cohort cohort;
    cohort.models.push_back({"risk", {}});
    DateColumn dates;
    dates.name = "day";
    CategoricalColumn sites;
    sites.name = "hospital";
    sites.levels = {"East", "West"};
    RandomStream random(11, 3);
    for (int d = 0; d < 730; ++d) {
        char text[16];
        const int year = d < 366 ? 2024 : 2025;
        int day = d < 366 ? d : d - 366;
        static const int lengths[] = {31, 29, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31};
        int month = 0;
        while (day >= lengths[month] - (year == 2025 && month == 1 ? 1 : 0)) {
            day -= lengths[month] - (year == 2025 && month == 1 ? 1 : 0);
            ++month;
        }
        std::snprintf(text, sizeof text, "%04d-%02d-%02d", year, month + 1, day + 1);
        dates.levels.push_back(text);
        dates.written.push_back(readWrittenDate(text));
        for (int k = 0; k < 4; ++k) {
            const double base = -1.6 + 0.8 * random.normal();
            const double truth = 1.0 / (1.0 + std::exp(-base));
            cohort.models[0].values.push_back(1.0 / (1.0 + std::exp(-(base + (year == 2025 ? 0.6 : 0.0)))));
            cohort.outcome.push_back(random.uniform() < truth ? 1 : 0);
            dates.codes.push_back(std::uint32_t(d));
            sites.codes.push_back(std::uint32_t(k % 2));
            cohort.sourceLines.push_back(std::uint32_t(cohort.outcome.size() + 1));
        }
    }
    cohort.period = dates;
    cohort.cluster = sites;
    auto snapshot = std::make_shared<AnalysisSnapshot>();
    PanelSettings settings;
    settings.monitoring.simulatedRuns = 50;
    snapshot->validation = runValidation(cohort, settings);
    return snapshot;
}

} // namespace

class MonitoringPanelTests : public QObject {
    Q_OBJECT
private slots:
    void showsTheCoresMonitoringPerScope()
    {
        const SnapshotPointer snapshot = simulatedSnapshot();
        QVERIFY(snapshot->validation.monitoring);
        const MonitoringAnalysis& m = *snapshot->validation.monitoring;
        QCOMPARE(m.scopes.size(), std::size_t(3));
        MonitoringPanel panel;
        panel.resize(1200, 800);
        panel.show();
        panel.setSnapshot(snapshot);
        QCOMPARE(panel.scopePicker()->count(), 3);
        QCOMPARE(panel.scopePicker()->itemText(0), QStringLiteral("All patients"));
        QCOMPARE(panel.scopePicker()->itemText(2), QStringLiteral("West"));
        // The whole cohort: the worse CUSUM's line is the core's thinned path, its h the core's.
        auto lineOf = [](MonitoringPathView* view, const QString& name) -> QLineSeries* {
            for (QAbstractSeries* s : view->chart()->series())
                if (s->name().startsWith(name))
                    return qobject_cast<QLineSeries*>(s);
            return nullptr;
        };
        const MonitoringScope& all = m.scopes[0];
        QLineSeries* cusum = lineOf(panel.worseChart(), QStringLiteral("CUSUM"));
        QVERIFY(cusum);
        QCOMPARE(std::size_t(cusum->count()), all.charts[0].path.size());
        QCOMPARE(cusum->at(cusum->count() - 1).y(), all.charts[0].path.back().value);
        QLineSeries* limit = lineOf(panel.worseChart(), QStringLiteral("control limit"));
        QVERIFY(limit);
        QCOMPARE(limit->at(0).y(), all.charts[0].limit.limit);
        QLineSeries* vlad = lineOf(panel.expectedMinusObservedChart(), QStringLiteral("expected"));
        QVERIFY(vlad);
        QCOMPARE(vlad->at(vlad->count() - 1).y(), all.finalExpectedMinusObserved);
        QVERIFY(panel.noteText().contains(QStringLiteral("has coding or documentation changed?")));
        // The question carries its numbers and says what PSI measures.
        QVERIFY(all.codingShift);
        QVERIFY(panel.noteText().contains(QStringLiteral("PSI measures the spread of the scores, not their level")));
        QVERIFY2(panel.noteText().contains(QStringLiteral("Mean predicted risk %1 in the first year, %2 in the latest; observed rate %3 then, %4 now.")
                                               .arg(QString::fromStdString(fixedText(all.codingShift->firstYear.meanPredicted, 3)),
                                                    QString::fromStdString(fixedText(all.codingShift->latestYear.meanPredicted, 3)),
                                                    QString::fromStdString(fixedText(all.codingShift->firstYear.observedRate, 3)),
                                                    QString::fromStdString(fixedText(all.codingShift->latestYear.observedRate, 3)))),
                 qPrintable(panel.noteText()));
        // The whole cohort's signals name no site, and a long list ends in a count, not "….".
        QVERIFY(all.charts[0].signalList.size() + all.charts[1].signalList.size() > 0);
        QVERIFY2(!panel.noteText().contains(QStringLiteral(" at East")) && !panel.noteText().contains(QStringLiteral(" at West")),
                 qPrintable(panel.noteText()));
        QVERIFY(!panel.noteText().contains(QStringLiteral("….")));
        for (const auto& chart : all.charts)
            if (chart.signalList.size() > 8)
                QVERIFY(panel.noteText().contains(QStringLiteral("; and %1 more.").arg(chart.signalList.size() - 8)));
        // The cumulative chart's y-axis title is short enough for a 1280×720 window.
        const auto vertical = panel.expectedMinusObservedChart()->chart()->axes(Qt::Vertical);
        QVERIFY(!vertical.isEmpty());
        QCOMPARE(vertical.first()->titleText(), QStringLiteral("Expected − observed"));
        QVERIFY(panel.noteText().contains(QStringLiteral("in-control run length")));
        // A person picks the second site with the keyboard: the charts follow its scope.
        panel.scopePicker()->setFocus();
        QTest::keyClick(panel.scopePicker(), Qt::Key_Down);
        QTest::keyClick(panel.scopePicker(), Qt::Key_Down);
        QCOMPARE(panel.scopePicker()->currentText(), QStringLiteral("West"));
        const MonitoringScope& west = m.scopes[2];
        QCOMPARE(west.site, std::string("West"));
        vlad = lineOf(panel.expectedMinusObservedChart(), QStringLiteral("expected"));
        QCOMPARE(vlad->at(vlad->count() - 1).y(), west.finalExpectedMinusObserved);
        QVERIFY(panel.noteText().contains(QString::number(west.patients)));
        // No snapshot: empty charts and a note saying what is needed.
        panel.setSnapshot(nullptr);
        QVERIFY(panel.noteText().contains(QStringLiteral("needs a date column")));
        QVERIFY(panel.worseChart()->chart()->series().isEmpty());
    }

    void theSettingsTabTakesTheCusumOptionsAndRefusesBadOnes()
    {
        SettingsPanel settings;
        settings.setRequest(AnalysisRequest{});
        settings.show();
        QLineEdit* odds = nullptr;
        for (QLineEdit* edit : settings.findChildren<QLineEdit*>())
            if (edit->placeholderText().startsWith(QStringLiteral("worse, better")))
                odds = edit;
        QVERIFY(odds);
        QCOMPARE(odds->text(), QStringLiteral("2, 0.5"));
        odds->setFocus();
        odds->selectAll();
        QTest::keyClicks(odds, QStringLiteral("1.5, 0.4"));
        auto request = settings.request();
        QVERIFY(request);
        QCOMPARE(request->panel.monitoring.worseOdds, 1.5);
        QCOMPARE(request->panel.monitoring.betterOdds, 0.4);
        QCOMPARE(request->panel.monitoring.targetYears, 5.0);
        odds->selectAll();
        QTest::keyClicks(odds, QStringLiteral("0.5, 2"));
        QVERIFY(!settings.request());
        odds->selectAll();
        QTest::keyClicks(odds, QStringLiteral("two"));
        QVERIFY(!settings.request());
    }
};

PLUMBLINE_FRESH_SETTINGS_MAIN(MonitoringPanelTests)
#include "monitoring_panel_tests.moc"
