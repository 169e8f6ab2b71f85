#pragma once

#include "analysis_snapshot.hpp"

#include <QMainWindow>

class QCheckBox;
class QHBoxLayout;
class QLabel;
class QMenu;
class QProgressBar;
class QPushButton;
class QSortFilterProxyModel;
class QTabWidget;

namespace plumbline {

class CalibrationChartView;
class CohortPanel;
class ComparisonPanel;
class DecisionCurveView;
class PeriodPanel;
class SubgroupPanel;
class UpdatingPanel;
class CopyableTableView;
class MetricTableModel;
class RiskDistributionView;
class RiskGroupTableModel;
class RocChartView;
class SettingsPanel;
class ThresholdPanel;
class ValidationTask;

// The workbench: discrimination and calibration side by side, every chart linked to one decision
// threshold, the metric table, risk groups, the cohort audit and the settings. It composes the
// panels and wires signals; it computes nothing.
class MainWindow : public QMainWindow {
    Q_OBJECT
public:
    explicit MainWindow(QWidget* parent = nullptr);
    ~MainWindow() override;

    // Opens the import dialog on a file (or empty); runs the analysis when the user confirms.
    void openWithDialog(const QString& path = {});
    // Runs an analysis directly (command line, snapshot mode, re-run, tests).
    void runRequest(const AnalysisRequest& request);
    // Saves the current analysis; opens a saved one and runs it (input changes are warned about).
    bool saveAnalysis(const QString& path, QString* error = nullptr);
    bool openAnalysis(const QString& path, QStringList* warnings = nullptr, QString* error = nullptr);
    // Exports the report of the shown results: PDF or HTML (by suffix), XLSX, or CSV tables.
    bool exportReport(const QString& path, QString* error = nullptr);
    bool exportWorkbook(const QString& path, QString* error = nullptr);
    bool exportTables(const QString& folder, QString* error = nullptr);

    SnapshotPointer snapshot() const { return m_snapshot; }
    ValidationTask* task() const { return m_task; }
    RocChartView* rocView() const { return m_roc; }
    CalibrationChartView* calibrationView() const { return m_calibration; }
    RiskDistributionView* distributionView() const { return m_distribution; }
    ThresholdPanel* thresholdPanel() const { return m_threshold; }
    MetricTableModel* metricModel() const { return m_metrics; }
    CopyableTableView* riskGroupView() const { return m_riskGroupView; }
    RiskGroupTableModel* riskGroupModel() const { return m_riskGroups; }
    ComparisonPanel* comparisonPanel() const { return m_comparison; }
    DecisionCurveView* decisionCurveView() const { return m_decision; }
    SubgroupPanel* subgroupPanel() const { return m_subgroups; }
    PeriodPanel* periodPanel() const { return m_periods; }
    UpdatingPanel* updatingPanel() const { return m_updating; }

protected:
    void closeEvent(QCloseEvent* event) override;
    void dragEnterEvent(QDragEnterEvent* event) override;
    void dropEvent(QDropEvent* event) override;

private:
    void buildMenus();
    QWidget* buildCentralArea();
    void buildStatusBar();
    void showSnapshot(SnapshotPointer snapshot);
    void setThreshold(double threshold);
    void rebuildModelToggles();
    void addRecentFile(const QString& path);
    void refreshRecentMenu();
    void showAbout();
    void selectRiskGroup(int model, int group);

    ValidationTask* m_task;
    SnapshotPointer m_snapshot;
    RocChartView* m_roc;
    CalibrationChartView* m_calibration;
    RiskDistributionView* m_distribution;
    ThresholdPanel* m_threshold;
    MetricTableModel* m_metrics;
    RiskGroupTableModel* m_riskGroups;
    QSortFilterProxyModel* m_riskGroupProxy;
    CopyableTableView* m_riskGroupView;
    CohortPanel* m_cohort;
    ComparisonPanel* m_comparison;
    UpdatingPanel* m_updating;
    DecisionCurveView* m_decision;
    SubgroupPanel* m_subgroups;
    PeriodPanel* m_periods;
    SettingsPanel* m_settings;
    QTabWidget* m_tabs;
    QHBoxLayout* m_toggles;
    QLabel* m_title;
    QLabel* m_status;
    QProgressBar* m_progress;
    QPushButton* m_cancel;
    QMenu* m_recent;
    bool m_selectingGroup = false;
};

// The cautions every window and report carries, as one paragraph.
QString cautionText();

} // namespace plumbline
