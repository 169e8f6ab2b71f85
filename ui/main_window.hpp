#pragma once

#include "run/analysis_snapshot.hpp"

#include <QMainWindow>

#include <functional>
#include <vector>

class QCheckBox;
class QHBoxLayout;
class QLabel;
class QMenu;
class QProgressBar;
class QPushButton;
class QStackedWidget;
class QTabWidget;

namespace plumbline {

class CalibrationChartView;
class CohortPanel;
class ComparisonPanel;
class CopyableTableView;
class DecisionCurveView;
class ElidedLabel;
class ExportableChartView;
class MetricTableModel;
class OverviewPanel;
class PeriodPanel;
class SitePoolingPanel;
class MonitoringPanel;
class RiskDistributionView;
class RiskGroupTableModel;
class RiskGroupsPanel;
class RocChartView;
class SettingsPanel;
class SubgroupPanel;
class ThresholdPanel;
class ThresholdSummaryModel;
class UpdatingPanel;
class ValidationTask;

// The workbench: one decision threshold above tabs that show discrimination and calibration
// side by side (Overview), the metric table, risk groups, comparisons, net benefit, subgroups,
// performance over time, updating, the cohort audit and the settings. It composes the panels
// and wires signals; it computes nothing.
class MainWindow : public QMainWindow {
    Q_OBJECT
public:
    explicit MainWindow(QWidget* parent = nullptr);
    ~MainWindow() override;

    // Opens the import dialog on a file (or empty); runs the analysis when the user confirms.
    void openWithDialog(const QString& path = {});
    // File → Open from database: the address and query, then the import dialog on its result.
    void openFromDatabase();
    // Runs an analysis directly (command line, snapshot mode, re-run, tests).
    void runRequest(const AnalysisRequest& request);
    // The analysis the Settings tab and the threshold describe now (Re-run, Save analysis).
    std::optional<AnalysisRequest> currentRequest() const;
    // Saves the current analysis; opens a saved one and runs it (input changes are warned about).
    bool saveAnalysis(const QString& path, QString* error = nullptr);
    // `allowOutsidePaths`: the user has confirmed inputs outside the analysis file's folder.
    bool openAnalysis(const QString& path, QStringList* warnings = nullptr, QString* error = nullptr, bool allowOutsidePaths = false);
    // Exports the report of the shown results: PDF or HTML (by suffix), XLSX, or CSV tables.
    // The report's charts mark the current threshold.
    bool exportReport(const QString& path, QString* error = nullptr);
    bool exportWorkbook(const QString& path, QString* error = nullptr);
    bool exportTables(const QString& folder, QString* error = nullptr);
    // Shows or hides a model in every chart.
    void setModelVisible(int model, bool visible);
    // Every divider back to its first place, the Overview shown, the window fitted to the screen.
    void resetLayout();
    // The chart Edit → Copy chart copies: the one clicked last, else the first shown.
    ExportableChartView* currentChart() const;

    SnapshotPointer snapshot() const { return m_snapshot; }
    ValidationTask* task() const { return m_task; }
    QTabWidget* tabs() const { return m_tabs; }
    OverviewPanel* overviewPanel() const { return m_overview; }
    RocChartView* rocView() const;
    CalibrationChartView* calibrationView() const;
    RiskDistributionView* distributionView() const;
    ThresholdSummaryModel* summaryModel() const;
    ThresholdPanel* thresholdPanel() const { return m_threshold; }
    MetricTableModel* metricModel() const { return m_metrics; }
    RiskGroupsPanel* riskGroupsPanel() const { return m_riskGroups; }
    CopyableTableView* riskGroupView() const;
    RiskGroupTableModel* riskGroupModel() const;
    ComparisonPanel* comparisonPanel() const { return m_comparison; }
    DecisionCurveView* decisionCurveView() const { return m_decision; }
    SubgroupPanel* subgroupPanel() const { return m_subgroups; }
    PeriodPanel* periodPanel() const { return m_periods; }
    SitePoolingPanel* sitePoolingPanel() const { return m_sites; }
    MonitoringPanel* monitoringPanel() const { return m_monitoring; }
    UpdatingPanel* updatingPanel() const { return m_updating; }
    SettingsPanel* settingsPanel() const { return m_settings; }
    QCheckBox* modelToggle(int model) const;

protected:
    void closeEvent(QCloseEvent* event) override;
    void dragEnterEvent(QDragEnterEvent* event) override;
    void dropEvent(QDropEvent* event) override;

private:
    void buildMenus();
    void buildFileMenu();
    QWidget* buildCentralArea();
    QWidget* buildOverviewPage();
    void buildStatusBar();
    void fitToScreen(bool always);
    // `complete` false: the analytic panel while the bootstrap still runs.
    void showSnapshot(SnapshotPointer snapshot, bool complete = true);
    void runStagesInTurns(SnapshotPointer shown, std::vector<std::function<void()>> stages, std::size_t next);
    void setThreshold(double threshold);
    void rebuildModelToggles();
    void addRecentFile(const QString& path);
    // Runs what an accepted import dialog maps, with the Settings tab's options.
    void runImported(const class ImportDialog& dialog);
    void refreshRecentMenu();
    void showAbout();
    void showPlanner();
    void askAndExportReport();
    void askAndExportTables();
    void askAndSaveAnalysis();
    void askAndOpenAnalysis();
    void announceWritten(const QString& what, const QString& path);
    bool refuseInputs(const QString& output, QString* error) const;
    QString cohortStem() const;

    ValidationTask* m_task;
    SnapshotPointer m_snapshot;
    QStackedWidget* m_overviewPages;
    OverviewPanel* m_overview;
    ThresholdPanel* m_threshold;
    MetricTableModel* m_metrics;
    RiskGroupsPanel* m_riskGroups;
    CohortPanel* m_cohort;
    ComparisonPanel* m_comparison;
    UpdatingPanel* m_updating;
    DecisionCurveView* m_decision;
    SubgroupPanel* m_subgroups;
    PeriodPanel* m_periods;
    SitePoolingPanel* m_sites;
    MonitoringPanel* m_monitoring;
    SettingsPanel* m_settings;
    QTabWidget* m_tabs;
    QHBoxLayout* m_toggles;
    ElidedLabel* m_title;
    ElidedLabel* m_status;
    QProgressBar* m_progress;
    QPushButton* m_cancel;
    QMenu* m_recent;
    bool m_outsideRefused = false; // the last analysis opened named an input outside its folder
};

// The cautions every window and report carries, as one paragraph.
QString cautionText();

} // namespace plumbline
