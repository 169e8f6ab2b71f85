#pragma once

#include "analysis_request.hpp"

#include <QWidget>

class QCheckBox;
class QComboBox;
class QDoubleSpinBox;
class QLabel;
class QLineEdit;
class QSpinBox;

namespace plumbline {

// The analysis options (replicates, seed, interval type, level, risk groups, thresholds) with
// Re-run. Values a user cannot use are refused here with a message, never passed on.
class SettingsPanel : public QWidget {
    Q_OBJECT
public:
    explicit SettingsPanel(QWidget* parent = nullptr);

    void setRequest(const AnalysisRequest& request);
    // The request with the panel's options, or an empty optional (and a shown message) if the
    // thresholds cannot be read.
    std::optional<AnalysisRequest> request() const;

signals:
    void rerunRequested();

private:
    AnalysisRequest m_base;
    QSpinBox* m_replicates;
    QSpinBox* m_seed;
    QComboBox* m_ciMethod;
    QDoubleSpinBox* m_confidence;
    QSpinBox* m_groups;
    QLineEdit* m_thresholds;
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
    QLabel* m_problem;
};

} // namespace plumbline
