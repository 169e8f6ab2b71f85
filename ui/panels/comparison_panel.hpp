#pragma once

#include "run/analysis_snapshot.hpp"

#include <QWidget>

class QComboBox;
class QLabel;
class QTableWidget;

namespace plumbline {

// Two models on the same patients: the differences (model_b − model_a) with intervals and
// tests, net benefit of both at the shared threshold, the reclassification table at the NRI
// cut-points, and the cautions on these comparisons. The overlaid curves are the main charts.
class ComparisonPanel : public QWidget {
    Q_OBJECT
public:
    explicit ComparisonPanel(QWidget* parent = nullptr);

    void setSnapshot(SnapshotPointer snapshot);
    void setThreshold(double threshold);
    QTableWidget* differenceTable() const { return m_differences; }
    QString thresholdText() const;

private:
    void showPair(int index);

    SnapshotPointer m_snapshot;
    QComboBox* m_pair;
    QTableWidget* m_differences;
    QTableWidget* m_reclassification;
    QLabel* m_atThreshold;
    QLabel* m_cautions;
    double m_threshold = 0.2;
};

} // namespace plumbline
