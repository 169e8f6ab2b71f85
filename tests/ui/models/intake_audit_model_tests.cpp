#include "models/intake_audit_model.hpp"

#include <QSignalSpy>
#include <QTest>

using namespace plumbline;

class IntakeAuditModelTests : public QObject {
    Q_OBJECT
private slots:
    void showsOneRowPerExclusionTally()
    {
        IntakeAudit audit;
        audit.rowsRead = 120;
        audit.rowsUsed = 100;
        audit.exclusions.push_back({ExclusionReason::MissingOutcome, "c.csv", "readmitted", 8, {4, 9, 10, 22, 31}});
        audit.exclusions.push_back({ExclusionReason::ScoreOutOfRange, "c.csv", "score", 12, {7}});
        IntakeAuditModel model;
        QSignalSpy resets(&model, &QAbstractItemModel::modelReset);
        model.setAudit(audit);
        QCOMPARE(resets.count(), 1);
        QCOMPARE(model.rowCount(), 2);
        QCOMPARE(model.columnCount(), int(IntakeAuditModel::ColumnCount));
        QCOMPARE(model.index(0, IntakeAuditModel::ReasonColumn).data().toString(), QStringLiteral("missing outcome"));
        QCOMPARE(model.index(0, IntakeAuditModel::ScoreColumn).data().toString(), QStringLiteral("readmitted"));
        QCOMPARE(model.index(0, IntakeAuditModel::LinesColumn).data().toString(), QStringLiteral("4, 9, 10, 22, 31, …"));
        QCOMPARE(model.index(1, IntakeAuditModel::LinesColumn).data().toString(), QStringLiteral("7, …"));
        QCOMPARE(model.headerData(IntakeAuditModel::RowsColumn, Qt::Horizontal).toString(), QStringLiteral("Rows"));
        QCOMPARE(model.index(0, IntakeAuditModel::FileColumn).data().toString(), QStringLiteral("c.csv"));
        QVERIFY(!model.index(5, 0).data().isValid());
    }

    void aJoinNamesTheFileOfEveryLineNumber()
    {
        IntakeAudit audit;
        audit.exclusions.push_back({ExclusionReason::MissingOutcome, "/data/scores.csv", "supplier_score", 2, {5, 8}});
        JoinSummary join;
        join.outcomeFileExclusions.push_back({ExclusionReason::DuplicateId, "/data/outcomes.csv", "encounter_id", 1, {12}});
        audit.join = join;
        IntakeAuditModel model;
        model.setAudit(audit);
        QCOMPARE(model.rowCount(), 2);
        QCOMPARE(model.index(0, IntakeAuditModel::FileColumn).data().toString(), QStringLiteral("scores.csv"));
        QCOMPARE(model.index(1, IntakeAuditModel::FileColumn).data().toString(), QStringLiteral("outcomes.csv"));
        QCOMPARE(model.index(1, IntakeAuditModel::LinesColumn).data().toString(), QStringLiteral("12"));
    }
};

QTEST_MAIN(IntakeAuditModelTests)
#include "intake_audit_model_tests.moc"
