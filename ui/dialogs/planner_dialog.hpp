#pragma once

#include "analyses/validation.hpp"

#include <QDialog>

class QDoubleSpinBox;
class QLabel;
class QLineEdit;
class QPlainTextEdit;

namespace plumbline {

// The sample-size planner: anticipated prevalence and C statistic in, the minimum number of
// patients under each of Riley et al.'s criteria out, with the one that drives it — the same
// text as `plumbline-cli plan`.
class PlannerDialog : public QDialog {
    Q_OBJECT
public:
    explicit PlannerDialog(QWidget* parent = nullptr);

    void setInputs(double prevalence, double cStatistic, const QString& thresholds);
    // The loaded cohort's achieved interval widths beside the common targets, shown above the plan.
    void setAchieved(const std::vector<ValidationResult::PrecisionRow>& rows);
    QString achievedText() const;
    QString planText() const;

private:
    void recompute();

    QDoubleSpinBox* m_prevalence;
    QDoubleSpinBox* m_c;
    QLineEdit* m_thresholds;
    QLabel* m_achieved;
    QPlainTextEdit* m_plan;
};

} // namespace plumbline
