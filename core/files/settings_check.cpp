#include "files/settings_check.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>

namespace plumbline {

namespace {

enum class Setting { Confidence, RiskGroups, Thresholds, NriCuts, DecisionRange, DecisionThreshold, Replicates, MinimumCell,
                     AddUpdated, Threads, MaxLineBytes, Capacity, Cluster, Acceptable,
                     CusumOdds, CusumYears };

struct SettingName {
    const char* commandLine;
    const char* analysisFile;
    const char* window;
};

SettingName nameOf(Setting setting)
{
    switch (setting) {
    case Setting::Confidence: return {"--confidence", "options.confidence", "Confidence level"};
    case Setting::RiskGroups: return {"--groups", "options.risk_groups", "Risk groups"};
    case Setting::Thresholds: return {"--thresholds", "options.thresholds", "Thresholds for the tables"};
    case Setting::NriCuts: return {"--nri-cuts", "options.nri_cuts", "NRI cut-points"};
    case Setting::DecisionRange: return {"--decision-range", "options.decision_range", "Decision curve range"};
    case Setting::DecisionThreshold: return {"--decision-threshold", "options.decision_threshold", "Decision threshold"};
    case Setting::Replicates: return {"--bootstrap", "options.bootstrap", "Bootstrap replicates"};
    case Setting::MinimumCell: return {"--min-cell", "options.minimum_cell", "Suppress counts below"};
    case Setting::AddUpdated: return {"--add-updated", "options.add_updated", "Add updated models"};
    case Setting::Threads: return {"--threads", "options.threads", "Threads"};
    case Setting::MaxLineBytes: return {"--max-line-length", "reading.max_line_bytes", "Longest line"};
    case Setting::Capacity: return {"--capacity", "options.capacity", "Capacity"};
    case Setting::Cluster: return {"--cluster", "columns.cluster", "Site column"};
    case Setting::Acceptable: return {"--acceptable", "options.acceptable", "Acceptable in a new site"};
    case Setting::CusumOdds: return {"--cusum-odds", "options.cusum_odds", "CUSUM odds ratios"};
    case Setting::CusumYears: return {"--cusum-years", "options.cusum_years", "CUSUM run length in years"};
    }
    return {"", "", ""};
}

std::string numberText(double value)
{
    char buffer[32];
    std::snprintf(buffer, sizeof buffer, "%.10g", value);
    return buffer;
}

class Checker {
public:
    Checker(SettingsSource source, std::string file)
        : m_source(source)
        , m_file(std::move(file))
    {
    }

    // An error naming the setting where the user gave it, with the value and the allowed range.
    std::expected<void, InputError> refuse(Setting setting, const std::string& value, const std::string& problem,
                                           const std::string& remedy) const
    {
        const SettingName name = nameOf(setting);
        InputError error;
        error.value = value;
        switch (m_source) {
        case SettingsSource::CommandLine: error.problem = std::string(name.commandLine) + " " + problem; break;
        case SettingsSource::AnalysisFile:
            error.file = m_file;
            error.key = name.analysisFile;
            error.problem = problem;
            break;
        case SettingsSource::Window: error.problem = std::string(name.window) + ": " + problem; break;
        }
        error.remedy = remedy;
        return std::unexpected(error);
    }

private:
    SettingsSource m_source;
    std::string m_file;
};

bool isRisk(double v)
{
    return std::isfinite(v) && v > 0.0 && v < 1.0;
}

std::expected<void, InputError> checkRiskList(const Checker& check, Setting setting, const std::vector<double>& values, std::size_t most)
{
    if (values.size() > most)
        return check.refuse(setting, std::to_string(values.size()) + " values", "takes at most " + std::to_string(most) + " values.",
                            "give fewer values (for a fine grid of thresholds, use the decision curve's range).");
    for (double v : values)
        if (!isRisk(v))
            return check.refuse(setting, numberText(v), "takes risks strictly between 0 and 1.", "give probabilities, e.g. 0.1,0.2,0.3.");
    return {};
}

std::expected<void, InputError> checkPanel(const Checker& check, const PanelSettings& p)
{
    using L = SettingLimits;
    if (!(std::isfinite(p.confidence) && p.confidence >= L::minConfidence && p.confidence <= L::maxConfidence))
        return check.refuse(Setting::Confidence, numberText(p.confidence), "must lie between 0.5 and 0.999.", "give a level such as 0.95.");
    if (p.riskGroups < L::minRiskGroups || p.riskGroups > L::maxRiskGroups)
        return check.refuse(Setting::RiskGroups, std::to_string(p.riskGroups), "must be a whole number from 2 to 100.", "give e.g. 10.");
    if (auto ok = checkRiskList(check, Setting::Thresholds, p.thresholds, L::maxThresholds); !ok)
        return ok;
    if (auto ok = checkRiskList(check, Setting::NriCuts, p.nriCutPoints, L::maxNriCuts); !ok)
        return ok;
    const std::string range = numberText(p.decisionFrom) + "," + numberText(p.decisionTo) + "," + numberText(p.decisionStep);
    if (!(isRisk(p.decisionFrom) && isRisk(p.decisionTo) && p.decisionFrom < p.decisionTo && std::isfinite(p.decisionStep)
          && p.decisionStep > 0.0))
        return check.refuse(Setting::DecisionRange, range,
                            "takes the first and last threshold (between 0 and 1, the first below the last) and a step above 0.",
                            "e.g. 0.05,0.50,0.01.");
    const double points = std::floor((p.decisionTo - p.decisionFrom) / p.decisionStep + 1e-9) + 1.0;
    if (points > double(L::maxDecisionPoints))
        return check.refuse(Setting::DecisionRange, range, "would give " + numberText(points) + " thresholds; at most 1000 are drawn.",
                            "use a step of at least " + numberText((p.decisionTo - p.decisionFrom) / double(L::maxDecisionPoints - 1)) + ".");
    if (const std::string problem = acceptableCriteriaProblem(p.acceptable); !problem.empty())
        return check.refuse(Setting::Acceptable, acceptableCriteriaText(p.acceptable), problem, "e.g. c=0.70,oe=0.8:1.2,slope=0.8:1.2.");
    if (!(std::isfinite(p.decisionThreshold) && p.decisionThreshold >= 0.0 && p.decisionThreshold <= 1.0))
        return check.refuse(Setting::DecisionThreshold, numberText(p.decisionThreshold), "must lie between 0 and 1.", "give e.g. 0.2.");
    // The CUSUMs: one odds ratio above 1 (worse) and one below (better), neither so extreme that
    // a single patient signals; an in-control run length of a tenth of a year to 50 years of volume.
    const MonitoringSettings& m = p.monitoring;
    if (!(std::isfinite(m.worseOdds) && std::isfinite(m.betterOdds) && m.worseOdds >= L::minCusumWorseOdds && m.worseOdds <= L::maxCusumOdds
          && m.betterOdds <= L::maxCusumBetterOdds && m.betterOdds >= 1.0 / L::maxCusumOdds))
        return check.refuse(Setting::CusumOdds, numberText(m.worseOdds) + "," + numberText(m.betterOdds),
                            "takes two odds ratios: the first from 1.1 to 20 (worse outcomes), the second from 0.05 to 0.9 (better); "
                            "nearer 1 a chart cannot signal.",
                            "e.g. 2,0.5.");
    if (!(std::isfinite(m.targetYears) && m.targetYears >= L::minCusumYears && m.targetYears <= L::maxCusumYears))
        return check.refuse(Setting::CusumYears, numberText(m.targetYears), "must lie between 0.1 and 50 years.", "give e.g. 5.");
    return {};
}

} // namespace

std::expected<void, InputError> checkAnalysisSettings(const AnalysisFile& a, SettingsSource source, const std::string& file)
{
    using L = SettingLimits;
    const Checker check(source, file);
    if (auto ok = checkPanel(check, a.panel); !ok)
        return ok;
    if (a.bootstrap.replicates > L::maxReplicates)
        return check.refuse(Setting::Replicates, std::to_string(a.bootstrap.replicates), "must be a whole number from 0 to 20000.",
                            "give e.g. 1000, or 0 for analytic intervals only.");
    if (a.bootstrap.threads < L::minThreads || a.bootstrap.threads > L::maxThreads)
        return check.refuse(Setting::Threads, std::to_string(a.bootstrap.threads), "must be a whole number from 1 to 256.", "give e.g. 2.");
    if (a.minimumCell < L::minMinimumCell || a.minimumCell > L::maxMinimumCell)
        return check.refuse(Setting::MinimumCell, std::to_string(a.minimumCell), "must be a whole number from 1 to 1000.",
                            "give e.g. 11 (a common small-cell rule).");
    if (!a.addUpdated.empty() && a.addUpdated != "intercept" && a.addUpdated != "logistic" && a.addUpdated != "closed-test")
        return check.refuse(Setting::AddUpdated, a.addUpdated, "must be intercept, logistic or closed-test.", "give one of them, or leave it out.");
    if (const auto& c = a.panel.capacity) {
        const bool share = c->kind == CapacitySpec::Kind::Share;
        if (share && !(std::isfinite(c->amount) && c->amount > 0.0 && c->amount <= 100.0))
            return check.refuse(Setting::Capacity, capacityText(*c), "is a share of the patients and must lie above 0% and at most 100%.", "give e.g. 10%.");
        if (!share && !(std::isfinite(c->amount) && c->amount > 0.0 && c->amount <= maxCapacityRate))
            return check.refuse(Setting::Capacity, capacityText(*c), "must be a number of patients above 0 and at most 1000000000 per day, week or month.", "give e.g. 40/week.");
        // A rate becomes a number of patients only over the cohort's dates.
        if (!share && !a.intake.periodColumn)
            return check.refuse(Setting::Capacity, capacityText(*c), "counts patients per unit of time and needs the cohort's dates.",
                                "name a date column with --period (in the window: Period (date) column when opening the file), or give a share such as 10%.");
    }
    if (a.intake.maxLineBytes < L::minLineBytes || a.intake.maxLineBytes > L::maxLineBytes)
        return check.refuse(Setting::MaxLineBytes, std::to_string(a.intake.maxLineBytes), "must lie between 1024 and 1073741824 bytes.",
                            "give e.g. 1048576 (1 MB, the default).");
    if (const auto& cluster = a.intake.clusterColumn) {
        if (cluster->empty())
            return check.refuse(Setting::Cluster, "", "names no column.", "give the column that holds each row's site, e.g. hospital.");
        const auto& scores = a.intake.scoreColumns;
        if (*cluster == a.intake.outcomeColumn || std::find(scores.begin(), scores.end(), *cluster) != scores.end())
            return check.refuse(Setting::Cluster, *cluster, "names the outcome or a score column, which cannot be a site.",
                                "give the column that holds each row's site, e.g. hospital.");
    }
    return {};
}

} // namespace plumbline
