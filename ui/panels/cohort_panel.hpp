#pragma once

#include "run/analysis_snapshot.hpp"

#include <QWidget>

class QLabel;
class QListWidget;

namespace plumbline {

class IntakeAuditModel;

// The data behind the numbers: files and fingerprints, rows read, used and excluded by reason
// with their first lines, the join, and every warning of the run.
class CohortPanel : public QWidget {
    Q_OBJECT
public:
    explicit CohortPanel(QWidget* parent = nullptr);
    void setSnapshot(const SnapshotPointer& snapshot);

private:
    QLabel* m_summary;
    IntakeAuditModel* m_audit;
    QListWidget* m_warnings;
};

} // namespace plumbline
