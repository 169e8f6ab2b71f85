#include "cli_panel_options.hpp"

#include "intake/option_lists.hpp"

namespace plumbline::cli {

PanelOptions::PanelOptions()
{
    const PanelSettings d;
    thresholds = riskListText(d.thresholds, ",");
    groups = d.riskGroups;
    confidence = d.confidence;
    decisionThreshold = d.decisionThreshold;
    cInterval = d.cStatisticScale == CStatisticScale::Plain ? "plain" : "logit";
    binomialInterval = d.binomialInterval == CiMethod::ClopperPearson ? "clopper-pearson" : "wilson";
    nriCuts = riskListText(d.nriCutPoints, ",");
    decisionRange = riskListText({d.decisionFrom, d.decisionTo, d.decisionStep}, ",");
    periodUnit = d.periodUnit == PeriodUnit::Quarter ? "quarter" : "month";
    dateFormat = !d.dateFormat ? "iso" : *d.dateFormat == DateFormat::DayFirst ? "dmy" : "mdy";
    acceptable = acceptableCriteriaText(d.acceptable);
    cusumOdds = riskListText({d.monitoring.worseOdds, d.monitoring.betterOdds}, ",");
    cusumYears = d.monitoring.targetYears;
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
    command.add_option("--acceptable", acceptable,
                       "With --cluster: performance acceptable in a new site, c=MIN,oe=LOW:HIGH,slope=LOW:HIGH (default c=0.7,oe=0.8:1.2,slope=0.8:1.2)");
    command.add_option("--period-unit", periodUnit, "Periods of --period: month or quarter")->check(CLI::IsMember({"month", "quarter"}));
    command.add_option("--date-format", dateFormat, "Dates of --period: iso (YYYY-MM-DD), dmy (DD/MM/YYYY) or mdy (MM/DD/YYYY)")
        ->check(CLI::IsMember({"iso", "dmy", "mdy"}));
    command.add_option("--capacity", capacity,
                       "Patients the team can act on: a share (10%) or a number per day, week or month (40/week, needs --period); "
                       "gives the threshold that flags at most that many");
    command.add_option("--cusum-odds", cusumOdds, "Monitoring with --period: odds ratios the two CUSUMs watch for, worse,better (default 2,0.5)");
    command.add_option("--cusum-years", cusumYears, "Monitoring with --period: in-control run length of the CUSUMs in years of this volume (default 5)");
}

std::expected<PanelSettings, InputError> PanelOptions::resolved() const
{
    PanelSettings settings;
    settings.riskGroups = groups;
    settings.confidence = confidence;
    settings.decisionThreshold = decisionThreshold;
    settings.cStatisticScale = cInterval == "plain" ? CStatisticScale::Plain : CStatisticScale::Logit;
    settings.binomialInterval = binomialInterval == "clopper-pearson" ? CiMethod::ClopperPearson : CiMethod::Wilson;
    const auto tableThresholds = parseRiskList(thresholds, "--thresholds");
    if (!tableThresholds)
        return std::unexpected(tableThresholds.error());
    settings.thresholds = *tableThresholds;
    const auto cuts = parseRiskList(nriCuts, "--nri-cuts");
    if (!cuts)
        return std::unexpected(cuts.error());
    settings.nriCutPoints = *cuts;
    const auto range = parseDecisionRange(decisionRange, "--decision-range");
    if (!range)
        return std::unexpected(range.error());
    settings.decisionFrom = range->from;
    settings.decisionTo = range->to;
    settings.decisionStep = range->step;
    const auto criteria = parseAcceptableCriteria(acceptable, "--acceptable");
    if (!criteria)
        return std::unexpected(criteria.error());
    settings.acceptable = *criteria;
    settings.periodUnit = periodUnit == "quarter" ? PeriodUnit::Quarter : PeriodUnit::Month;
    if (dateFormat == "dmy")
        settings.dateFormat = DateFormat::DayFirst;
    else if (dateFormat == "mdy")
        settings.dateFormat = DateFormat::MonthFirst;
    if (!capacity.empty()) {
        const auto spec = parseCapacity(capacity, "--capacity");
        if (!spec)
            return std::unexpected(spec.error());
        settings.capacity = *spec;
    }
    const auto odds = parseOddsRatioPair(cusumOdds, "--cusum-odds");
    if (!odds)
        return std::unexpected(odds.error());
    settings.monitoring.worseOdds = odds->worse;
    settings.monitoring.betterOdds = odds->better;
    settings.monitoring.targetYears = cusumYears;
    return settings;
}

} // namespace plumbline::cli
