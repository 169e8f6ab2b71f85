#pragma once

#include "metrics/calibration_lr_tests.hpp"
#include "metrics/operating_points.hpp"
#include "metrics/risk_groups.hpp"

#include <cstdint>
#include <optional>
#include <span>
#include <stop_token>
#include <string>
#include <vector>

namespace plumbline {

// Updating a model for the local population (Steyerberg et al. 2004, Stat Med 23:2567; Janssen
// et al. 2008, J Clin Epidemiol 61:76): recalibration in the large (a new intercept, logit(p) as
// offset), logistic recalibration (a + b·logit(p)), or the closed-testing choice between keeping
// the model, the first and the second by likelihood-ratio tests (Vergouwe et al. 2017,
// Stat Med 36:4529).
enum class UpdateMethod { Intercept, Logistic, ClosedTest };
enum class UpdateChoice { None, Intercept, Logistic };

std::string_view updateMethodName(UpdateMethod method);
std::string_view updateChoiceName(UpdateChoice choice);

struct UpdateFit {
    UpdateChoice choice = UpdateChoice::None;
    double intercept = 0.0;  // a (or α for the intercept update)
    double slope = 1.0;      // b (1 for the intercept update)
    std::optional<CalibrationLikelihoodRatioTests> tests; // what the closed test looked at

    double updatedRisk(double risk) const; // expit(a + b·logit(p)), p clamped as for the fits
    std::string formula() const;           // "logit(p_updated) = -0.5340 + 1.0000 × logit(p)"
};

// Fits the update on (frequency-weighted) grouped data: distinct risks with events and trials.
std::optional<UpdateFit> fitUpdate(std::span<const double> risks, std::span<const double> events,
                                   std::span<const double> trials, UpdateMethod method, double alpha);

// Apparent and optimism-corrected performance of the updated model on the data it was fitted
// on (Harrell, Lee & Mark 1996, Stat Med 15:361): refit the whole procedure (closed test
// included) in each bootstrap sample, measure it there and on the original data; optimism =
// mean difference; corrected = apparent − optimism.
struct OptimismRow {
    std::string key; // c_statistic, calibration_intercept, calibration_slope, brier, oe_ratio
    double apparent = 0.0;
    double optimism = 0.0;
    double corrected = 0.0;
};

struct ModelUpdate {
    std::string model;
    UpdateMethod method = UpdateMethod::ClosedTest;
    UpdateFit fit;
    std::vector<OptimismRow> optimism;
    std::size_t replicates = 0;
    std::size_t replicatesUsed = 0;
    std::vector<RiskGroup> originalGroups;
    std::vector<RiskGroup> updatedGroups;
    std::vector<OperatingPoint> updatedOperatingPoints; // every 0.005 of updated risk
    std::vector<std::string> cautions;
};

struct UpdateSettings {
    UpdateMethod method = UpdateMethod::ClosedTest;
    double alpha = 0.05;               // level of the closed test
    std::size_t optimismReplicates = 200;
    std::uint64_t seed = 20240101;
    std::size_t riskGroups = 10;
    double confidence = 0.95;
};

// Adds "<name>_updated" for each model of the cohort, updated on these data (the method names of
// the CLI: intercept, logistic, closed-test); returns what was fitted. Models that cannot be
// updated are left out.
struct Cohort;
std::vector<ModelUpdate> addUpdatedModels(Cohort& cohort, const std::string& method, const UpdateSettings& base = {});

// nullopt when the update cannot be fitted (one class, separation, constant risks) or on stop.
std::optional<ModelUpdate> updateModel(std::span<const std::uint8_t> outcome, std::span<const double> risk,
                                       const std::string& name, const UpdateSettings& settings,
                                       std::stop_token stop = {});

} // namespace plumbline
