#include "cli_panel_options.hpp"

#include "field_values.hpp"

#include <cstdio>
#include <sstream>

namespace plumbline::cli {

namespace {

std::string numberList(const std::vector<double>& values)
{
    std::string out;
    for (double v : values) {
        char buffer[32];
        std::snprintf(buffer, sizeof buffer, "%g", v);
        out += (out.empty() ? "" : ",") + std::string(buffer);
    }
    return out;
}

} // namespace

PanelOptions::PanelOptions()
{
    const PanelSettings d;
    thresholds = numberList(d.thresholds);
    groups = d.riskGroups;
    confidence = d.confidence;
    decisionThreshold = d.decisionThreshold;
    cInterval = d.cStatisticScale == CStatisticScale::Plain ? "plain" : "logit";
    binomialInterval = d.binomialInterval == CiMethod::ClopperPearson ? "clopper-pearson" : "wilson";
    nriCuts = numberList(d.nriCutPoints);
    decisionRange = numberList({d.decisionFrom, d.decisionTo, d.decisionStep});
    periodUnit = d.periodUnit == PeriodUnit::Quarter ? "quarter" : "month";
    dateFormat = !d.dateFormat ? "iso" : *d.dateFormat == DateFormat::DayFirst ? "dmy" : "mdy";
}

void PanelOptions::addTo(CLI::App& command)
{
    command.add_option("--thresholds", thresholds, "Decision thresholds, e.g. 0.1,0.2,0.3 (positive if risk >= t)");
    command.add_option("--groups", groups, "Number of risk groups for the calibration table")->check(CLI::Range(2, 100));
    command.add_option("--confidence", confidence, "Confidence level of the intervals")->check(CLI::Range(0.5, 0.999));
    command.add_option("--decision-threshold", decisionThreshold,
                       "The threshold the care team will act on, marked on the report's charts (default 0.2)")
        ->check(CLI::Range(0.0, 1.0));
    command.add_option("--c-interval", cInterval, "Scale of the C statistic's interval")
        ->check(CLI::IsMember({"logit", "plain"}));
    command.add_option("--binomial-interval", binomialInterval, "Interval for proportions")
        ->check(CLI::IsMember({"wilson", "clopper-pearson"}));
    command.add_option("--nri-cuts", nriCuts, "Risk cut-points of the categorical NRI (default: the thresholds)");
    command.add_option("--decision-range", decisionRange, "Decision curve thresholds: from,to,step (default 0.05,0.50,0.01)");
    command.add_option("--period-unit", periodUnit, "Periods of --period: month or quarter")->check(CLI::IsMember({"month", "quarter"}));
    command.add_option("--date-format", dateFormat, "Dates of --period: iso (YYYY-MM-DD), dmy (DD/MM/YYYY) or mdy (MM/DD/YYYY)")
        ->check(CLI::IsMember({"iso", "dmy", "mdy"}));
}

std::expected<PanelSettings, InputError> PanelOptions::resolved() const
{
    PanelSettings settings;
    settings.riskGroups = groups;
    settings.confidence = confidence;
    settings.decisionThreshold = decisionThreshold;
    settings.cStatisticScale = cInterval == "plain" ? CStatisticScale::Plain : CStatisticScale::Logit;
    settings.binomialInterval = binomialInterval == "clopper-pearson" ? CiMethod::ClopperPearson : CiMethod::Wilson;
    auto risks = [](const std::string& text, const std::string& option, std::vector<double>& out) -> std::optional<InputError> {
        out.clear();
        std::stringstream list(text);
        std::string item;
        while (std::getline(list, item, ',')) {
            const auto value = parseNumber(item, false);
            if (!value || !(*value > 0.0 && *value < 1.0)) {
                InputError error;
                error.value = item;
                error.problem = "each " + option + " value must be a risk strictly between 0 and 1.";
                error.remedy = "give them as probabilities separated by commas, e.g. " + option + " 0.1,0.2,0.3.";
                return error;
            }
            out.push_back(*value);
        }
        return std::nullopt;
    };
    if (auto error = risks(thresholds, "--thresholds", settings.thresholds))
        return std::unexpected(*error);
    if (auto error = risks(nriCuts, "--nri-cuts", settings.nriCutPoints))
        return std::unexpected(*error);
    std::vector<double> range;
    std::stringstream parts(decisionRange);
    std::string part;
    while (std::getline(parts, part, ','))
        if (const auto value = parseNumber(part, false))
            range.push_back(*value);
    if (range.size() != 3 || !(range[0] > 0.0 && range[0] < range[1] && range[1] < 1.0 && range[2] > 0.0)) {
        InputError error;
        error.value = decisionRange;
        error.problem = "--decision-range takes three numbers: the first and last threshold (between 0 and 1) and the step.";
        error.remedy = "e.g. --decision-range 0.05,0.50,0.01.";
        return std::unexpected(error);
    }
    settings.decisionFrom = range[0];
    settings.decisionTo = range[1];
    settings.decisionStep = range[2];
    settings.periodUnit = periodUnit == "quarter" ? PeriodUnit::Quarter : PeriodUnit::Month;
    if (dateFormat == "dmy")
        settings.dateFormat = DateFormat::DayFirst;
    else if (dateFormat == "mdy")
        settings.dateFormat = DateFormat::MonthFirst;
    return settings;
}

} // namespace plumbline::cli
