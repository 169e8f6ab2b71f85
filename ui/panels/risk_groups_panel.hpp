#pragma once

#include "run/analysis_snapshot.hpp"

#include <QWidget>

class QSortFilterProxyModel;
class QSplitter;

namespace plumbline {

class CalibrationChartView;
class CopyableTableView;
class RiskGroupTableModel;

// The risk-group table beside the calibration plot it describes: selecting a row rings its
// point, hovering a point selects its row. Sortable; Ctrl+C copies rows for a spreadsheet.
class RiskGroupsPanel : public QWidget {
    Q_OBJECT
public:
    explicit RiskGroupsPanel(QWidget* parent = nullptr);

    void setSnapshot(SnapshotPointer snapshot);
    void setThreshold(double threshold);
    void setModelVisible(int model, bool visible);
    // Selects a group's row (from a point hovered or clicked in any calibration plot).
    void selectGroup(int model, int group);
    void resetLayout();

    CopyableTableView* tableView() const { return m_view; }
    RiskGroupTableModel* tableModel() const { return m_model; }
    CalibrationChartView* chartView() const { return m_chart; }

signals:
    // The selected row's group (−1, −1 when none), so every calibration plot can ring it.
    void groupSelected(int model, int group);

private:
    RiskGroupTableModel* m_model;
    QSortFilterProxyModel* m_proxy;
    CopyableTableView* m_view;
    CalibrationChartView* m_chart;
    QSplitter* m_split;
};

} // namespace plumbline
