#include "resampling/interval_choice.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>

namespace plumbline {

namespace {

bool holds(const std::pair<double, double>& interval, double value)
{
    const double slack = 1e-12 * std::max(1.0, std::abs(value));
    return interval.first <= value + slack && value - slack <= interval.second;
}

std::string number(double value)
{
    char buffer[32];
    std::snprintf(buffer, sizeof buffer, "%.2f", value);
    return buffer;
}

Estimate withInterval(Estimate e, const std::pair<double, double>& interval, CiMethod method)
{
    e.lower = interval.first;
    e.upper = interval.second;
    e.ciMethod = method;
    return e;
}

Estimate withoutInterval(Estimate e)
{
    e.lower.reset();
    e.upper.reset();
    e.ciMethod = CiMethod::None;
    return e;
}

std::string sparseReason(const BootstrapEvidence& evidence)
{
    if (evidence.events < IntervalRule::minimumClass || evidence.nonEvents < IntervalRule::minimumClass)
        return "too few of one class for the bootstrap (" + std::to_string(evidence.events) + (evidence.events == 1 ? " event, " : " events, ")
            + std::to_string(evidence.nonEvents) + (evidence.nonEvents == 1 ? " non-event" : " non-events") + "; the rule asks for 20 of each)";
    return "too many bootstrap draws lacked one class (" + std::to_string(evidence.redrawn) + " of "
        + std::to_string(evidence.replicates) + " redrawn; the rule allows 1 %)";
}

// Falls back from a bootstrap interval that cannot be trusted: percentile if it holds the
// estimate, else the analytic interval, else none.
ChosenInterval fallBack(const Estimate& analytic, const MetricBootstrap& b, const std::string& reason, bool percentileAlreadyTried)
{
    const double value = *analytic.value;
    if (!percentileAlreadyTried && holds(b.percentile, value))
        return {withInterval(analytic, b.percentile, CiMethod::BootstrapPercentile), "percentile interval: " + reason};
    if (analytic.lower && analytic.upper)
        return {analytic, "analytic interval: " + reason + ", and the percentile interval misses the estimate"};
    return {withoutInterval(analytic), "no interval: " + reason + ", and the percentile interval misses the estimate"};
}

} // namespace

bool BootstrapEvidence::sparse() const
{
    return events < IntervalRule::minimumClass || nonEvents < IntervalRule::minimumClass
        || (replicates > 0 && double(redrawn) > IntervalRule::maximumRedrawnShare * double(replicates));
}

ChosenInterval chooseInterval(const Estimate& analytic, const MetricBootstrap& b, BootstrapCi asked, const BootstrapEvidence& evidence)
{
    ChosenInterval chosen;
    if (!analytic.value)
        return {analytic, {}};
    const double value = *analytic.value;
    const bool hasAnalytic = analytic.lower && analytic.upper;
    if (evidence.sparse() && hasAnalytic) {
        chosen = {analytic, "analytic interval: " + sparseReason(evidence) + "; the bootstrap intervals stay in the result"};
    } else if (asked == BootstrapCi::Bca) {
        if (!b.bca || !b.z0)
            chosen = fallBack(analytic, b, "every bootstrap replicate lies on one side of the estimate, so BCa is undefined", false);
        else if (std::abs(*b.z0) > IntervalRule::maximumBiasCorrection)
            chosen = fallBack(analytic, b, "the bias correction is extreme (z0 = " + number(*b.z0) + ": over 84 % of replicates on one side)", false);
        else if (!holds(*b.bca, value))
            chosen = fallBack(analytic, b, "the BCa interval misses the estimate", false);
        else
            chosen = {withInterval(analytic, *b.bca, CiMethod::BootstrapBca), {}};
    } else {
        chosen = holds(b.percentile, value) ? ChosenInterval{withInterval(analytic, b.percentile, CiMethod::BootstrapPercentile), {}}
                                            : fallBack(analytic, b, "the percentile interval misses the estimate", true);
    }
    // Few events and no analytic interval: the bootstrap interval is all there is; say so, and
    // keep the note short enough to be shared by every metric in that position.
    if (evidence.sparse() && !hasAnalytic && chosen.estimate.lower)
        chosen.note = std::string(chosen.estimate.ciMethod == CiMethod::BootstrapBca ? "BCa" : "percentile")
            + " bootstrap interval, the only one this metric has, read with care: " + sparseReason(evidence)
            + (chosen.note.empty() ? "" : ", and BCa was not usable");
    if (const auto degenerate = withoutDegenerateInterval(chosen.estimate); !degenerate.empty())
        chosen.note = degenerate;
    return chosen;
}

ChosenInterval chooseDifferenceInterval(const Estimate& analytic, const MetricBootstrap& b, const BootstrapEvidence& evidence)
{
    if (!analytic.value)
        return {analytic, {}};
    const bool hasAnalytic = analytic.lower && analytic.upper;
    ChosenInterval chosen;
    if (evidence.sparse() && hasAnalytic)
        chosen = {analytic, "analytic interval: " + sparseReason(evidence) + "; the bootstrap interval stays in the result"};
    else if (holds(b.percentile, *analytic.value))
        chosen = {withInterval(analytic, b.percentile, CiMethod::BootstrapPercentile), {}};
    else
        chosen = fallBack(analytic, b, "the paired percentile interval misses the estimate", true);
    if (const auto degenerate = withoutDegenerateInterval(chosen.estimate); !degenerate.empty())
        chosen.note = degenerate;
    return chosen;
}

std::string intervalRuleText()
{
    return "the bootstrap interval asked for, except: with fewer than 20 events or 20 non-events, or more than 1 % of draws "
           "redrawn, the analytic or exact interval where the metric has one; when BCa's bias correction is extreme (|z0| > 1) "
           "or an interval misses its estimate, the percentile interval, else the analytic one, else none; an interval of zero "
           "width is no interval. The tables' notes say when and why.";
}

std::string withoutDegenerateInterval(Estimate& e)
{
    if (!e.lower || !e.upper || !e.value)
        return {};
    const double scale = std::max({1.0, std::abs(*e.value), std::abs(*e.lower), std::abs(*e.upper)});
    if (*e.upper - *e.lower > 1e-12 * scale)
        return {};
    e = withoutInterval(e);
    return "no interval: it would have zero width (the data leave no room for uncertainty to show, e.g. every score equal)";
}

} // namespace plumbline
