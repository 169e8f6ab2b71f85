#pragma once

#include "files/analysis_file.hpp"
#include "intake/input_error.hpp"

#include <expected>
#include <string>

namespace plumbline {

// The bounds every analysis setting keeps, wherever it comes from: the command line, an
// analysis file or the window. One check, so every path refuses the same values with the same
// words. Lists and ranges are bounded so that no setting can make a run take minutes or
// gigabytes (a decision range of 1e-12 steps, five million thresholds).
struct SettingLimits {
    static constexpr double minConfidence = 0.5, maxConfidence = 0.999;
    static constexpr std::size_t minRiskGroups = 2, maxRiskGroups = 100;
    static constexpr std::size_t maxThresholds = 50;
    static constexpr std::size_t maxNriCuts = 20;
    static constexpr std::size_t maxDecisionPoints = 1000;
    static constexpr std::size_t maxReplicates = 20000;
    static constexpr std::size_t minMinimumCell = 1, maxMinimumCell = 1000;
    static constexpr unsigned minThreads = 1, maxThreads = 256;
    static constexpr std::size_t minLineBytes = 1024, maxLineBytes = std::size_t{1} << 30;
    static constexpr double maxCusumOdds = 20.0, minCusumYears = 0.1, maxCusumYears = 50.0;
    // Odds ratios nearer 1 give a chart whose in-control and shifted drifts hardly differ: its
    // simulated limit cannot reach the target run length, and it can never usefully signal
    // (our choice, docs/methods.md §21a).
    static constexpr double minCusumWorseOdds = 1.1, maxCusumBetterOdds = 0.9;
};

// Where the settings were given: the message names each setting as the user wrote it there
// (--confidence, key 'options.confidence', the Settings tab's "Confidence level").
enum class SettingsSource { CommandLine, AnalysisFile, Window };

// `file` is the analysis file's path when the source is one.
std::expected<void, InputError> checkAnalysisSettings(const AnalysisFile& analysis, SettingsSource source,
                                                      const std::string& file = {});

} // namespace plumbline
