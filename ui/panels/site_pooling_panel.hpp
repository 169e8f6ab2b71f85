#pragma once

#include "run/analysis_snapshot.hpp"

#include <QWidget>

class QComboBox;
class QLabel;
class QSplitter;
class QTableWidget;

namespace plumbline {

class SiteForestView;

// Performance across sites (--cluster) for one model: a forest chart per measure (C, O/E,
// calibration slope) with each site, the pooled diamond and the prediction interval for a new
// site; a table of the pooled values, HKSJ and prediction intervals, τ², I² and the probability
// of acceptable performance in a new site; the method, the notes and the cautions.
class SitePoolingPanel : public QWidget {
    Q_OBJECT
public:
    explicit SitePoolingPanel(QWidget* parent = nullptr);

    void setSnapshot(SnapshotPointer snapshot);
    QComboBox* modelPicker() const { return m_model; }
    SiteForestView* cChart() const { return m_c; }
    SiteForestView* oeChart() const { return m_oe; }
    SiteForestView* slopeChart() const { return m_slope; }
    QTableWidget* table() const { return m_table; }
    QString noteText() const;
    void resetLayout();

private:
    void showModel(int index);

    SnapshotPointer m_snapshot;
    QComboBox* m_model;
    SiteForestView* m_c;
    SiteForestView* m_oe;
    SiteForestView* m_slope;
    QSplitter* m_charts;
    QTableWidget* m_table;
    QLabel* m_note;
};

} // namespace plumbline
