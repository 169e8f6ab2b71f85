#pragma once

#include "run/analysis_snapshot.hpp"

#include <QWidget>

class QComboBox;
class QSplitter;
class QTableView;

namespace plumbline {

class CalibrationChartView;
class RiskDistributionView;
class RocChartView;
class ThresholdSummaryModel;

// The first page: the ROC curves and the calibration plot side by side, both square and the
// same size; beneath the ROC curves each model's counts at the shared threshold, beneath the
// calibration plot the distribution of predicted risk of a chosen model on the same x axis.
class OverviewPanel : public QWidget {
    Q_OBJECT
public:
    explicit OverviewPanel(QWidget* parent = nullptr);

    void setSnapshot(SnapshotPointer snapshot);
    void setThreshold(double threshold);
    void setModelVisible(int model, bool visible);
    void resetLayout();

    RocChartView* rocView() const { return m_roc; }
    CalibrationChartView* calibrationView() const { return m_calibration; }
    RiskDistributionView* distributionView() const { return m_distribution; }
    ThresholdSummaryModel* summaryModel() const { return m_summary; }
    QComboBox* distributionPicker() const { return m_distributionModel; }

protected:
    void resizeEvent(QResizeEvent* event) override;
    bool eventFilter(QObject* watched, QEvent* event) override;

private:
    QWidget* buildSummaryColumn();
    void fitSummaryHeight();
    void showDistributionOf(int model);

    SnapshotPointer m_snapshot;
    RocChartView* m_roc;
    CalibrationChartView* m_calibration;
    RiskDistributionView* m_distribution;
    ThresholdSummaryModel* m_summary;
    QTableView* m_summaryTable;
    QComboBox* m_distributionModel;
    QSplitter* m_rows;
    QSplitter* m_top;
    QSplitter* m_bottom;
    std::vector<bool> m_visible;
    bool m_userMoved = false;
};

} // namespace plumbline
