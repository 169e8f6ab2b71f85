#pragma once

#include "run/analysis_snapshot.hpp"
#include "analyses/model_updating.hpp"

#include <QFutureWatcher>
#include <QWidget>

#include <optional>

class QComboBox;
class QLabel;
class QPushButton;
class QSpinBox;
class QTableWidget;

namespace plumbline {

class UpdateCalibrationView;

// Updating a model for the local population: pick the model and the method, run (in the
// background) the core's update with its optimism bootstrap, and see the formula, the closed
// test, apparent and corrected performance, what the shared threshold means before and after,
// and original against updated calibration.
class UpdatingPanel : public QWidget {
    Q_OBJECT
public:
    explicit UpdatingPanel(QWidget* parent = nullptr);
    ~UpdatingPanel() override;

    void setSnapshot(SnapshotPointer snapshot);
    void setThreshold(double threshold);
    void runUpdate();
    const std::optional<ModelUpdate>& update() const { return m_update; }
    QString formulaText() const;
    QTableWidget* optimismTable() const { return m_optimism; }

signals:
    void updateFinished();

private:
    void showUpdate();

    SnapshotPointer m_snapshot;
    QComboBox* m_model;
    QComboBox* m_method;
    QSpinBox* m_replicates;
    QPushButton* m_run;
    QLabel* m_formula;
    QLabel* m_atThreshold;
    QLabel* m_cautions;
    QTableWidget* m_optimism;
    UpdateCalibrationView* m_chart;
    QFutureWatcher<std::optional<ModelUpdate>> m_watcher;
    std::optional<ModelUpdate> m_update;
    double m_threshold = 0.2;
};

} // namespace plumbline
