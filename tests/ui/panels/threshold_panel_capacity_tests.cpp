// The capacity box beside the threshold slider, driven with the keys a person uses: typing a
// capacity moves the slider to the threshold that flags at most that many; moving the slider
// changes what the box says. What it shows is compared with counts made here on the cohort the
// core read, and with the span the core's capacity analysis reports.
#include "support/fresh_settings_main.hpp"
#include "support/window_test_support.hpp"

#include "analyses/capacity_analysis.hpp"
#include "panels/settings_panel.hpp"
#include "panels/threshold_panel.hpp"
#include "reporting/cautions.hpp"

#include <QComboBox>
#include <QLabel>
#include <QLineEdit>
#include <QLocale>
#include <QPushButton>
#include <QSignalSpy>
#include <QSlider>
#include <QTabWidget>
#include <QTest>

#include <algorithm>
#include <cmath>

using namespace plumbline;
using namespace plumbline::testing;

namespace {

// Patients of model m with risk ≥ t, counted row by row.
std::size_t flaggedAt(const Cohort& cohort, std::size_t m, double t)
{
    const auto& risk = cohort.models[m].values;
    return std::size_t(std::count_if(risk.begin(), risk.end(), [&](double p) { return p >= t; }));
}

// The grid threshold one step below or above t (steps of 0.005, as the slider's).
double step(double t, int by)
{
    return double(std::lround(t * 200.0) + by) / 200.0;
}

// What the note beside the box says at threshold t for the first model.
QString flagsNote(const Cohort& cohort, double t)
{
    return QStringLiteral("flags %1 of %2")
        .arg(QLocale().toString(qulonglong(flaggedAt(cohort, 0, t))))
        .arg(QLocale().toString(qulonglong(cohort.rows())));
}

void typeCapacity(QLineEdit* box, const QString& text)
{
    box->setFocus();
    box->selectAll();
    QTest::keyClick(box, Qt::Key_Backspace);
    QTest::keyClicks(box, text);
    QTest::keyClick(box, Qt::Key_Return);
}

} // namespace

class ThresholdPanelCapacityTests : public QObject {
    Q_OBJECT
private slots:
    void aShareTypedMovesTheSliderAndTheSliderMovesTheBox()
    {
        MainWindow window;
        window.resize(1280, 720);
        window.show();
        AnalysisRequest request = sampleRequest(0);
        QVERIFY(runAndWait(window, request));
        const Cohort& cohort = *window.snapshot()->cohort;
        ThresholdPanel* panel = window.thresholdPanel();
        QLineEdit* box = panel->capacityBox();
        QVERIFY(box->isEnabled());
        QCOMPARE(panel->capacityModel()->currentText(), QStringLiteral("supplier_score"));
        // Without dates the box shows the share flagged at the slider's threshold.
        const double n = double(cohort.rows());
        const double start = panel->threshold();
        QCOMPARE(box->text(), QString::fromStdString(capacityText({CapacitySpec::Kind::Share,
                                                                   std::round(1000.0 * double(flaggedAt(cohort, 0, start)) / n) / 10.0})));
        // Typing 10% moves the slider to the lowest grid threshold flagging at most 10 %.
        const std::size_t allowed = std::size_t(std::floor(0.10 * n));
        typeCapacity(box, QStringLiteral("10%"));
        const double t = panel->threshold();
        QCOMPARE(panel->slider()->value(), int(std::lround(t * 200)));
        QVERIFY(flaggedAt(cohort, 0, t) <= allowed);
        QVERIFY(t == 0.0 || flaggedAt(cohort, 0, step(t, -1)) > allowed);
        QCOMPARE(panel->capacityNote()->text(), flagsNote(cohort, t));
        // What was typed stays in the box after Return; the note beside it says what is achieved.
        QCOMPARE(box->text(), QStringLiteral("10%"));
        // Spaces are accepted as on the command line.
        typeCapacity(box, QStringLiteral("10 %"));
        QCOMPARE(panel->threshold(), t);
        QCOMPARE(box->text(), QStringLiteral("10 %"));
        // The slider moved with the keys: the box follows, and no loop moves the slider back.
        panel->slider()->setFocus();
        QTest::keyClick(panel->slider(), Qt::Key_Right);
        const double moved = panel->threshold();
        QCOMPARE(moved, step(t, 1));
        const double share = std::round(1000.0 * double(flaggedAt(cohort, 0, moved)) / n) / 10.0;
        QCOMPARE(box->text(), QString::fromStdString(capacityText({CapacitySpec::Kind::Share, share})));
        // The caution about a threshold fitted to past volume is beside the box.
        QCOMPARE(panel->capacityNote()->toolTip(), QString::fromUtf8(capacityCaution.data(), qsizetype(capacityCaution.size())));
        // The second model: the box counts its patients.
        panel->capacityModel()->setFocus();
        QTest::keyClick(panel->capacityModel(), Qt::Key_Down);
        QCOMPARE(panel->capacityModel()->currentIndex(), 1);
        QCOMPARE(box->text(), QString::fromStdString(capacityText({CapacitySpec::Kind::Share,
                                                                   std::round(1000.0 * double(flaggedAt(cohort, 1, moved)) / n) / 10.0})));
        // Bad texts move nothing and say why; a rate without dates asks for them.
        for (const QString& bad : {QStringLiteral("1e9/day"), QStringLiteral("40/fortnight"), QStringLiteral("0%"), QStringLiteral("101%")}) {
            typeCapacity(box, bad);
            QCOMPARE(panel->threshold(), moved);
            QCOMPARE(panel->capacityNote()->text(), QStringLiteral("not a capacity"));
            QVERIFY(panel->capacityNote()->toolTip().contains(QStringLiteral("What to do")));
        }
        typeCapacity(box, QStringLiteral("40/week"));
        QCOMPARE(panel->threshold(), moved);
        QCOMPARE(panel->capacityNote()->text(), QStringLiteral("needs dates"));
    }

    void withDatesTheBoxCountsPatientsPerWeek()
    {
        MainWindow window;
        window.resize(1280, 720);
        window.show();
        AnalysisRequest request = sampleRequest(0);
        request.intake.periodColumn = "discharge_date";
        QVERIFY(runAndWait(window, request));
        const Cohort& cohort = *window.snapshot()->cohort;
        // The span as the core's capacity analysis states it (first to last date, both counted).
        const std::vector<ScoreOrder> orders{ascendingOrder(cohort.models[0].values), ascendingOrder(cohort.models[1].values)};
        const auto analysis = analyseCapacity(cohort, *parseCapacity("40/week", "x"), orders, 0.95, CiMethod::Wilson, std::nullopt,
                                              PeriodUnit::Month);
        QVERIFY(analysis && analysis->spanDays);
        const double days = *analysis->spanDays;
        ThresholdPanel* panel = window.thresholdPanel();
        QLineEdit* box = panel->capacityBox();
        typeCapacity(box, QStringLiteral("40/week"));
        const double t = panel->threshold();
        const std::size_t allowed = analysis->overall[0].at.requested; // 40 per week over the span, rounded down
        QVERIFY(flaggedAt(cohort, 0, t) <= allowed);
        QVERIFY(t == 0.0 || flaggedAt(cohort, 0, step(t, -1)) > allowed);
        const double perWeek = std::round(double(flaggedAt(cohort, 0, t)) * 7.0 / days * 10.0) / 10.0;
        QVERIFY(perWeek <= 40.0);
        // The box keeps "40/week" as typed (not the 39.9/week achieved); the note gives the count.
        QCOMPARE(box->text(), QStringLiteral("40/week"));
        QCOMPARE(panel->capacityNote()->text(), flagsNote(cohort, t));
        panel->slider()->setFocus();
        QTest::keyClick(panel->slider(), Qt::Key_Left);
        const double lower = panel->threshold();
        QCOMPARE(lower, step(t, -1));
        const double more = std::round(double(flaggedAt(cohort, 0, lower)) * 7.0 / days * 10.0) / 10.0;
        QCOMPARE(box->text(), QString::fromStdString(capacityText({CapacitySpec::Kind::Rate, more, CapacitySpec::Unit::Week})));
        QVERIFY(more >= 40.0); // the next threshold down flags more than the capacity
    }

    void aCapacityFromTheSettingsTabMovesTheBoxAndTheSliderOnReRun()
    {
        MainWindow window;
        window.resize(1280, 720);
        window.show();
        QVERIFY(runAndWait(window, sampleRequest(0)));
        ThresholdPanel* panel = window.thresholdPanel();
        const double before = panel->threshold();
        // Settings → Capacity, typed as a person does, then the tab's Re-run button.
        window.tabs()->setCurrentWidget(window.settingsPanel());
        QLineEdit* field = nullptr;
        for (QLineEdit* f : window.settingsPanel()->findChildren<QLineEdit*>())
            if (f->placeholderText() == QStringLiteral("10% or 40/week"))
                field = f;
        QVERIFY(field);
        // The placeholder fits the field at 1280x720 (it was clipped).
        QVERIFY2(field->fontMetrics().horizontalAdvance(field->placeholderText()) + 12 <= field->width(),
                 qPrintable(QStringLiteral("placeholder wider than the field's %1 px").arg(field->width())));
        field->setFocus();
        QTest::keyClicks(field, QStringLiteral("10%"));
        QPushButton* rerun = nullptr;
        for (QPushButton* b : window.settingsPanel()->findChildren<QPushButton*>())
            if (b->text().remove(QLatin1Char('&')).startsWith(QStringLiteral("Re-run")))
                rerun = b;
        QVERIFY(rerun);
        QSignalSpy finished(window.task(), &ValidationTask::finished);
        QTest::mouseClick(rerun, Qt::LeftButton);
        QVERIFY(finished.wait(180000));
        QTRY_VERIFY(window.snapshot()->validation.capacity.has_value());
        const Cohort& cohort = *window.snapshot()->cohort;
        // The box shows the run's capacity and the slider sits at the lowest grid threshold
        // flagging at most 10 % (counted here), not at the old value.
        QTRY_COMPARE(panel->capacityBox()->text(), QStringLiteral("10%"));
        const std::size_t allowed = std::size_t(std::floor(0.10 * double(cohort.rows())));
        const double t = panel->threshold();
        QVERIFY(t != before);
        QCOMPARE(panel->slider()->value(), int(std::lround(t * 200)));
        QVERIFY(flaggedAt(cohort, 0, t) <= allowed);
        QVERIFY(t == 0.0 || flaggedAt(cohort, 0, step(t, -1)) > allowed);
        QCOMPARE(panel->capacityNote()->text(), flagsNote(cohort, t));
    }

    void theSettingsTabTakesACapacityForTheRunAndRefusesABadOne()
    {
        SettingsPanel panel;
        panel.show();
        QLineEdit* field = nullptr;
        for (QLineEdit* f : panel.findChildren<QLineEdit*>())
            if (f->placeholderText() == QStringLiteral("10% or 40/week"))
                field = f;
        QVERIFY(field);
        QVERIFY(!panel.request()->panel.capacity); // none by default, as on the command line
        AnalysisRequest dated = *panel.request();
        dated.intake.periodColumn = "discharge_date";
        panel.setRequest(dated);
        field->setFocus();
        QTest::keyClicks(field, QStringLiteral("40/week"));
        QCOMPARE(panel.request()->panel.capacity, parseCapacity("40/week", "x").value());
        field->clear();
        QTest::keyClicks(field, QStringLiteral("40/fortnight"));
        QVERIFY(!panel.request());
        bool said = false;
        for (QLabel* label : panel.findChildren<QLabel*>())
            said = said || label->text().contains(QStringLiteral("'fortnight' is none of them"));
        QVERIFY(said);
        // A rate without a period column: the shared settings check asks for one, in the tab's words.
        panel.setRequest(AnalysisRequest{});
        field->clear();
        QTest::keyClicks(field, QStringLiteral("40/week"));
        QVERIFY(!panel.request());
        said = false;
        for (QLabel* label : panel.findChildren<QLabel*>())
            said = said || label->text().contains(QStringLiteral("Capacity: counts patients per unit of time"));
        QVERIFY(said);
    }
};

PLUMBLINE_FRESH_SETTINGS_MAIN(ThresholdPanelCapacityTests)
#include "threshold_panel_capacity_tests.moc"
