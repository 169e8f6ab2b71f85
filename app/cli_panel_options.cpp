#include "cli_panel_options.hpp"

#include "field_values.hpp"

#include <sstream>

namespace plumbline::cli {

void PanelOptions::addTo(CLI::App& command)
{
    command.add_option("--thresholds", thresholds, "Decision thresholds, e.g. 0.1,0.2,0.3 (positive if risk >= t)");
    command.add_option("--groups", groups, "Number of risk groups for the calibration table")->check(CLI::Range(2, 100));
    command.add_option("--confidence", confidence, "Confidence level of the intervals")->check(CLI::Range(0.5, 0.999));
    command.add_option("--c-interval", cInterval, "Scale of the C statistic's interval")
        ->check(CLI::IsMember({"logit", "plain"}));
    command.add_option("--binomial-interval", binomialInterval, "Interval for proportions")
        ->check(CLI::IsMember({"wilson", "clopper-pearson"}));
}

std::expected<PanelSettings, InputError> PanelOptions::resolved() const
{
    PanelSettings settings;
    settings.riskGroups = groups;
    settings.confidence = confidence;
    settings.cStatisticScale = cInterval == "plain" ? CStatisticScale::Plain : CStatisticScale::Logit;
    settings.binomialInterval = binomialInterval == "clopper-pearson" ? CiMethod::ClopperPearson : CiMethod::Wilson;
    settings.thresholds.clear();
    std::stringstream list(thresholds);
    std::string item;
    while (std::getline(list, item, ',')) {
        const auto value = parseNumber(item, false);
        if (!value || !(*value > 0.0 && *value < 1.0)) {
            InputError error;
            error.value = item;
            error.problem = "each --thresholds value must be a risk strictly between 0 and 1.";
            error.remedy = "give thresholds as probabilities separated by commas, e.g. --thresholds 0.1,0.2,0.3.";
            return std::unexpected(error);
        }
        settings.thresholds.push_back(*value);
    }
    return settings;
}

} // namespace plumbline::cli
