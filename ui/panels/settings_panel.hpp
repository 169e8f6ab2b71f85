#pragma once

#include "run/analysis_request.hpp"

#include <QWidget>

class QCheckBox;
class QComboBox;
class QDoubleSpinBox;
class QLabel;
class QLineEdit;
class QSpinBox;

namespace plumbline {

// The analysis options (replicates, seed, interval types, level, risk groups, thresholds, NRI
// cut-points, the decision curve's range, periods, small-cell rule) and the report's text, with
// Re-run. It starts at the command line's defaults (AnalysisRequest{}). Values a user cannot use
// are refused here with the command line's message, never passed on.
class SettingsPanel : public QWidget {
    Q_OBJECT
public:
    explicit SettingsPanel(QWidget* parent = nullptr);

    void setRequest(const AnalysisRequest& request);
    // The request with the panel's options, or an empty optional (and a shown message) if a
    // list cannot be read.
    std::optional<AnalysisRequest> request() const;

signals:
    void rerunRequested();

private:
    QWidget* buildAnalysisBox();
    QWidget* buildReportBox();

    AnalysisRequest m_base;
    QSpinBox* m_replicates;
    QLineEdit* m_seed;
    QComboBox* m_ciMethod;
    QDoubleSpinBox* m_confidence;
    QComboBox* m_cInterval;
    QComboBox* m_binomialInterval;
    QSpinBox* m_groups;
    QLineEdit* m_thresholds;
    QLineEdit* m_nriCuts;
    QLineEdit* m_decisionRange;
    QCheckBox* m_stratified;
    QLineEdit* m_title;
    QLineEdit* m_model;
    QLineEdit* m_outcome;
    QLineEdit* m_population;
    QLineEdit* m_period;
    QLineEdit* m_notes;
    QSpinBox* m_minimumCell;
    QComboBox* m_periodUnit;
    QComboBox* m_dateFormat;
    QLineEdit* m_capacity; // --capacity: empty for none
    QLineEdit* m_cusumOdds;
    QLineEdit* m_acceptable; // --acceptable: what a new site must reach (pooling across sites)
    QDoubleSpinBox* m_cusumYears;
    QLabel* m_problem;
};

} // namespace plumbline
