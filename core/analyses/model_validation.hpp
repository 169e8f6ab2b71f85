#pragma once

#include "metrics/calibration_lr_tests.hpp"
#include "metrics/calibration_summary.hpp"
#include "intake/cohort.hpp"
#include "metrics/discrimination.hpp"
#include "metrics/estimate.hpp"
#include "metrics/score_order.hpp"
#include "analyses/decision_curve.hpp"
#include "resampling/metric_bootstrap.hpp"
#include "metrics/operating_points.hpp"
#include "analyses/panel_settings.hpp"
#include "metrics/risk_groups.hpp"
#include "metrics/threshold_metrics.hpp"

#include <optional>
#include <string>
#include <string_view>
#include <span>
#include <vector>

namespace plumbline {

// One metric of the panel: its interface key, the estimate and a plain-words reading.
// `estimate` carries the reported interval: the bootstrap's when one ran, else the analytic one,
// which `analytic` then keeps.
struct MetricEntry {
    std::string key;
    Estimate estimate;
    std::string reading;
    std::optional<Estimate> analytic;
    std::optional<MetricBootstrap> bootstrap;
    std::string intervalNote; // why the reported interval is not the usual one (empty when it is)
};

struct CalibrationCurvePoint {
    double predicted;
    double observed; // smoothed observed risk (raw loess value, may leave 0-1)
};

// Everything the panel says about one model on one cohort. An immutable snapshot.
struct ModelValidation {
    std::string name;
    std::vector<MetricEntry> metrics; // every panel key, in display order; undefined → empty value
    std::optional<HosmerLemeshowTest> hosmerLemeshow;
    std::optional<SpiegelhalterTest> spiegelhalter;
    std::optional<CalibrationLikelihoodRatioTests> likelihoodRatio;
    std::vector<RiskGroup> riskGroups;
    std::vector<RocPoint> roc;
    std::vector<CalibrationCurvePoint> calibrationCurve;
    std::string calibrationCurveMethod; // "direct", "binned" or empty when no curve
    std::vector<ThresholdMetrics> thresholds;
    std::vector<OperatingPoint> operatingPoints; // every 0.005 of risk, for a threshold slider
    std::vector<DecisionCurvePoint> decisionCurve; // net benefit over the decision range
    RiskHistogram riskDistribution;               // 50 bins over 0-1, by outcome class
    CurveBand calibrationBand; // empty without a bootstrap
    CurveBand rocBand;
    std::vector<std::string> warnings; // each says which value is missing or doubtful, and why

    const Estimate* metric(std::string_view key) const;
};

// The metric panel for one model (discrimination, calibration, overall accuracy, thresholds),
// with analytic intervals. A points-scale score gets discrimination only.
// `sourceLines` (each row's line in the file, may be empty) lets warnings name patients.
// Every metric's plain-words reading, from its reported interval, and the note that explains
// two readings that seem to disagree (scaled Brier and Nagelkerke R2).
void readMetrics(std::vector<MetricEntry>& metrics);

// `order`, when given, is the model's ascendingOrder (computed once by the caller and shared).
ModelValidation validateModel(const std::vector<std::uint8_t>& outcome, const ModelScores& model, ScoreScale scale,
                              const PanelSettings& settings, std::span<const std::uint32_t> sourceLines = {},
                              ScoreOrder order = {});

} // namespace plumbline
