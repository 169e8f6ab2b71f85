#pragma once

#include "charts/exportable_chart_view.hpp"
#include "analyses/model_validation.hpp"

#include <string>
#include <vector>

namespace plumbline {

// One level's smoothed calibration curve, for drawing beside the other levels'.
struct LevelCurve {
    std::string level;
    std::vector<CalibrationCurvePoint> curve; // empty: too small to estimate, or withheld
};

// Calibration curves by subgroup level for one model: each level's smoothed observed risk
// against predicted risk on a square plot with the ideal line, so a committee sees at which site
// the risks run high or low and where they are too extreme. Levels without a curve are named in
// the legend as such, never silently dropped.
class LevelCalibrationView : public ExportableChartView {
    Q_OBJECT
public:
    explicit LevelCalibrationView(QWidget* parent = nullptr);

    void setCurves(const std::vector<LevelCurve>& levels);
};

} // namespace plumbline
