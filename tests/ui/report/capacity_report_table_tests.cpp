// The report's capacity table: what it prints against the capacity result it was built from, and
// the small-cell rule (counts of 1 to minimum − 1 suppressed with what is built on them, a
// suppressed period's row hidden, the whole-cohort threshold's column hidden for a model when one
// of its periods' cells is small, since those add up over the periods).
#include "support/fresh_settings_main.hpp"

#include "report/capacity_report_table.hpp"

#include <QObject>
#include <QTest>

#include <cmath>

using namespace plumbline;

namespace {

CapacityResult row(const std::string& model, const std::string& period, std::size_t tp, std::size_t fp, std::size_t tn, std::size_t fn,
                   std::size_t tied, std::optional<std::size_t> byOverall = std::nullopt)
{
    CapacityResult r;
    r.model = model;
    r.period = period;
    r.tp = tp;
    r.fp = fp;
    r.tn = tn;
    r.fn = fn;
    r.patients = tp + fp + tn + fn;
    r.events = tp + fn;
    // A capacity one above the flagged: `tied` patients (when any) share the next risk down.
    r.at = {tp + fp, 0.3, tp + fp, 1, tp + fp - 1, std::nullopt, 0, 0};
    if (tied > 0) {
        r.at.requested = tp + fp + 1;
        r.at.nextRiskDown = 0.29;
        r.at.tiedAtNextRiskDown = tied;
        r.at.flaggedAtNextRiskDown = tp + fp + tied;
    }
    r.sensitivity.value = double(tp) / double(tp + fn);
    r.ppv.value = double(tp) / double(tp + fp);
    r.flaggedByOverallThreshold = byOverall;
    return r;
}

std::string cell(const ReportTable& t, std::size_t r, const std::string& header)
{
    for (std::size_t c = 0; c < t.headers.size(); ++c)
        if (t.headers[c] == header)
            return t.rows[r][c].text;
    return "no such column";
}

} // namespace

class CapacityReportTableTests : public QObject {
    Q_OBJECT
private slots:
    void noCapacityNoTable()
    {
        QVERIFY(!capacityTable(ValidationResult{}, DisclosurePlan{}));
    }

    void smallCountsAreSuppressedWithWhatIsBuiltOnThem()
    {
        ValidationResult v;
        CapacityAnalysis c;
        c.text = "10%";
        c.overall = {row("a", "", 120, 300, 5000, 400, 30), row("b", "", 120, 300, 5000, 400, 4)};
        c.periods = {row("a", "2025-01", 60, 150, 2500, 200, 1, 220), row("a", "2025-02", 60, 150, 2500, 200, 0, 200),
                     row("b", "2025-01", 5, 150, 2500, 200, 1, 300), row("b", "2025-02", 60, 150, 2500, 200, 1, 7)};
        v.capacity = c;
        DisclosurePlan plan;
        plan.minimumCell = 11;
        const auto table = capacityTable(v, plan);
        QVERIFY(table);
        QCOMPARE(table->rows.size(), std::size_t(6)); // each model's row, then its periods
        // Model a: everything printed, and equal to the result.
        QCOMPARE(cell(*table, 0, "TP"), std::string("120"));
        QCOMPARE(cell(*table, 0, "Flagged"), std::string("420"));
        QCOMPARE(cell(*table, 0, "Tied at the next risk down (it would flag)"), std::string("30 (450)"));
        // A tie of one patient in a month is a small cell like any other (not printed as "1").
        QCOMPARE(cell(*table, 1, "Tied at the next risk down (it would flag)"), std::string("suppressed"));
        QCOMPARE(cell(*table, 2, "Tied at the next risk down (it would flag)"), std::string("0"));
        QCOMPARE(cell(*table, 0, "Sensitivity"), std::string("0.231"));
        QCOMPARE(cell(*table, 1, "Whole-cohort threshold flags"), std::string("220"));
        // Model b: a tie of 4 below the threshold is a small cell of its own; the rest stays.
        QCOMPARE(cell(*table, 3, "Tied at the next risk down (it would flag)"), std::string("suppressed"));
        QCOMPARE(cell(*table, 3, "TP"), std::string("120"));
        // Its January has 5 true positives: the row's counts and metrics go, the threshold stays.
        QCOMPARE(cell(*table, 4, "TP"), std::string("suppressed"));
        QCOMPARE(cell(*table, 4, "FN"), std::string("suppressed"));
        QCOMPARE(cell(*table, 4, "Sensitivity"), std::string("withheld"));
        QCOMPARE(cell(*table, 4, "Capacity"), std::string("suppressed"));
        QCOMPARE(cell(*table, 4, "Threshold"), std::string("0.3000"));
        // February's 7 flagged by the whole-cohort threshold hides that column for all of b's periods.
        QCOMPARE(cell(*table, 5, "TP"), std::string("60"));
        QCOMPARE(cell(*table, 5, "Whole-cohort threshold flags"), std::string("suppressed"));
        QCOMPARE(cell(*table, 4, "Whole-cohort threshold flags"), std::string("suppressed"));
        for (const auto& r : table->rows)
            for (const auto& shown : r)
                QVERIFY2(!(shown.number && *shown.number >= 1.0 && *shown.number < 11.0 && *shown.number == std::floor(*shown.number)),
                         ("a small count was printed: " + shown.text).c_str());
    }

    void aPeriodSuppressedElsewhereIsHiddenHere()
    {
        ValidationResult v;
        PeriodAnalysis periods;
        PeriodResult p;
        p.model = "a";
        p.period = "2025-01";
        periods.results.push_back(p);
        v.periods = periods;
        CapacityAnalysis c;
        c.text = "40/week";
        c.overall = {row("a", "", 120, 300, 5000, 400, 1)};
        c.periods = {row("a", "2025-01", 60, 150, 2500, 200, 1, 220)};
        v.capacity = c;
        DisclosurePlan plan;
        plan.periods.push_back({CountShown{2960, true, false}, CountShown{460, false, false}});
        const auto table = capacityTable(v, plan);
        QCOMPARE(cell(*table, 1, "TP"), std::string("suppressed"));
        QCOMPARE(cell(*table, 1, "Capacity"), std::string("suppressed"));
        QCOMPARE(cell(*table, 0, "TP"), std::string("120"));
    }
};

PLUMBLINE_FRESH_SETTINGS_MAIN(CapacityReportTableTests)
#include "capacity_report_table_tests.moc"
