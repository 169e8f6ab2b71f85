#include "analyses/model_comparison.hpp"

#include "metrics/discrimination.hpp"
#include "metrics/distributions.hpp"
#include "metrics/panel_keys.hpp"
#include "analyses/two_threads.hpp"
#include "analyses/validation.hpp"

#include <algorithm>
#include <cmath>

namespace plumbline {

std::vector<std::string> comparisonCautions()
{
    return {
        "The paired DeLong test compares models fixed in advance; it is not valid for nested models both fitted on these data "
        "(Demler, Pencina & D'Agostino 2012) - use a likelihood-ratio test of the added predictors there.",
        "NRI and IDI are descriptive: the category-free NRI can overstate the value of a model, both depend on calibration and "
        "on the event rate, and their events and non-events parts must be read separately (Kerr et al. 2014; Pepe et al. 2015; "
        "Hilden & Gerds 2014). Prefer the difference in C, calibration and net benefit.",
        "A model updated or refitted on these same patients looks better here than it will on new patients unless its "
        "performance is corrected for optimism.",
    };
}

std::size_t riskCategory(double risk, const std::vector<double>& cutPoints)
{
    return static_cast<std::size_t>(std::upper_bound(cutPoints.begin(), cutPoints.end(), risk) - cutPoints.begin());
}

const DifferenceEstimate* ModelComparison::difference(const std::string& key) const
{
    for (const auto& d : differences)
        if (d.key == key)
            return &d;
    return nullptr;
}

namespace {

// A difference with its normal (Wald or DeLong) interval, cut at the quantity's range: a
// difference of two proportions lies in [−1, 1] (an NRI in [−2, 2]), and an interval reaching
// past it would claim values the quantity cannot take. `truncated` says when the cut was made.
DifferenceEstimate normalDifference(std::string key, double value, double se, double confidence, CiMethod method,
                                    double lowest = -1.0, double highest = 1.0)
{
    DifferenceEstimate d{std::move(key), Estimate::point(value), std::nullopt, std::nullopt, std::nullopt, {}, false};
    if (!(se > 0.0) || !std::isfinite(se))
        return d;
    const double z = zForConfidence(confidence);
    d.estimate.se = se;
    d.estimate.lower = std::max(lowest, value - z * se);
    d.estimate.upper = std::min(highest, value + z * se);
    d.truncated = value - z * se < lowest || value + z * se > highest;
    d.estimate.ciMethod = method;
    d.pValue = twoSidedNormalP(value / se);
    return d;
}

struct Moves {
    double upEvents = 0, downEvents = 0, upNonEvents = 0, downNonEvents = 0;
};

// NRI from moves (Pencina et al. 2008): components, SE0 for the test, SE1 for the interval.
void addNri(std::vector<DifferenceEstimate>& out, const std::string& prefix, const Moves& m, double events,
            double nonEvents, double confidence)
{
    const double pue = m.upEvents / events, pde = m.downEvents / events;
    const double pun = m.upNonEvents / nonEvents, pdn = m.downNonEvents / nonEvents;
    const double nriEvents = pue - pde, nriNonEvents = pdn - pun, nri = nriEvents + nriNonEvents;
    const double se0 = std::sqrt((pue + pde) / events + (pun + pdn) / nonEvents);
    const double se1 = std::sqrt((pue + pde - nriEvents * nriEvents) / events + (pun + pdn - nriNonEvents * nriNonEvents) / nonEvents);
    const double seEvents = std::sqrt(std::max(0.0, (pue + pde - nriEvents * nriEvents) / events));
    const double seNonEvents = std::sqrt(std::max(0.0, (pun + pdn - nriNonEvents * nriNonEvents) / nonEvents));
    out.push_back(normalDifference(prefix + "_events", nriEvents, seEvents, confidence, CiMethod::Wald));
    out.push_back(normalDifference(prefix + "_non_events", nriNonEvents, seNonEvents, confidence, CiMethod::Wald));
    DifferenceEstimate total = normalDifference(prefix, nri, se1, confidence, CiMethod::Wald, -2.0, 2.0);
    if (se0 > 0.0)
        total.pValue = twoSidedNormalP(nri / se0);
    out.push_back(total);
}

ModelComparison comparePair(const Cohort& cohort, std::size_t a, std::size_t b, const ValidationResult& result,
                            const PanelSettings& settings, const std::vector<double>& cuts, const std::vector<ScoreOrder>* orders,
                            unsigned threads)
{
    const auto& y = cohort.outcome;
    const auto& pa = cohort.models[a].values;
    const auto& pb = cohort.models[b].values;
    const double confidence = settings.confidence;
    ModelComparison out;
    out.modelA = cohort.models[a].name;
    out.modelB = cohort.models[b].name;

    // The two models' placements are independent: on two threads when the caller has them.
    Placements placementsA, placementsB;
    auto place = [&](std::size_t which) {
        const std::size_t model = which == 0 ? a : b;
        const auto& p = cohort.models[model].values;
        (which == 0 ? placementsA : placementsB) = orders ? delongPlacements(y, p, (*orders)[model]) : delongPlacements(y, p);
    };
    if (threads >= 2) {
        onTwoThreads(2, place);
    } else {
        place(0);
        place(1);
    }
    const double varDiff = delongVariance(placementsA) + delongVariance(placementsB) - 2.0 * delongCovariance(placementsA, placementsB);
    out.differences.push_back(normalDifference("c_statistic_difference", placementsB.c - placementsA.c,
                                               std::sqrt(std::max(0.0, varDiff)), confidence, CiMethod::DeLongPlain));
    if (!scaleIsProbabilistic(cohort.scale))
        return out;

    const std::size_t n = y.size();
    double events = 0, sumD = 0, sumD2 = 0;
    double idiEvents = 0, idiEvents2 = 0, idiNon = 0, idiNon2 = 0;
    Moves categorical, continuous;
    out.reclassification.cutPoints = cuts;
    const std::size_t categories = cuts.size() + 1;
    out.reclassification.events.assign(categories, std::vector<std::size_t>(categories, 0));
    out.reclassification.nonEvents.assign(categories, std::vector<std::size_t>(categories, 0));
    for (std::size_t i = 0; i < n; ++i) {
        const double d = (pb[i] - y[i]) * (pb[i] - y[i]) - (pa[i] - y[i]) * (pa[i] - y[i]);
        sumD += d;
        sumD2 += d * d;
        const double change = pb[i] - pa[i];
        const std::size_t ca = riskCategory(pa[i], cuts), cb = riskCategory(pb[i], cuts);
        if (y[i]) {
            ++events;
            idiEvents += change;
            idiEvents2 += change * change;
            categorical.upEvents += cb > ca;
            categorical.downEvents += cb < ca;
            continuous.upEvents += change > 0;
            continuous.downEvents += change < 0;
            ++out.reclassification.events[ca][cb];
        } else {
            idiNon += change;
            idiNon2 += change * change;
            categorical.upNonEvents += cb > ca;
            categorical.downNonEvents += cb < ca;
            continuous.upNonEvents += change > 0;
            continuous.downNonEvents += change < 0;
            ++out.reclassification.nonEvents[ca][cb];
        }
    }
    const double nonEvents = double(n) - events;
    const double meanD = sumD / double(n);
    const double sdD = std::sqrt(std::max(0.0, (sumD2 - double(n) * meanD * meanD) / double(n - 1)));
    out.differences.push_back(normalDifference("brier_difference", meanD, sdD / std::sqrt(double(n)), confidence, CiMethod::Wald));
    auto metricOf = [&](std::size_t model, PanelMetric k) { return result.models[model].metrics[k].estimate.value; };
    if (metricOf(a, CalibrationSlope) && metricOf(b, CalibrationSlope))
        out.differences.push_back({"calibration_slope_difference", Estimate::point(*metricOf(b, CalibrationSlope) - *metricOf(a, CalibrationSlope)), std::nullopt, std::nullopt, std::nullopt, {}, false});
    if (metricOf(a, Ici) && metricOf(b, Ici))
        out.differences.push_back({"ici_difference", Estimate::point(*metricOf(b, Ici) - *metricOf(a, Ici)), std::nullopt, std::nullopt, std::nullopt, {}, false});
    if (!cuts.empty())
        addNri(out.differences, "nri", categorical, events, nonEvents, confidence);
    addNri(out.differences, "nri_continuous", continuous, events, nonEvents, confidence);
    // IDI = difference of discrimination slopes; SE from the class-wise variances of the change.
    const double meanE = idiEvents / events, meanN = idiNon / nonEvents;
    const double varE = (idiEvents2 - events * meanE * meanE) / (events - 1);
    const double varN = (idiNon2 - nonEvents * meanN * meanN) / (nonEvents - 1);
    out.differences.push_back(normalDifference("idi", meanE - meanN, std::sqrt(varE / events + varN / nonEvents), confidence, CiMethod::Wald));
    // ΔNB at each threshold of the panel.
    const auto& ta = result.models[a].thresholds;
    const auto& tb = result.models[b].thresholds;
    for (std::size_t k = 0; k < ta.size() && k < tb.size(); ++k) {
        out.netBenefitThresholds.push_back(ta[k].threshold);
        out.netBenefitDifferences.push_back({"net_benefit_difference", Estimate::point(tb[k].netBenefit - ta[k].netBenefit), std::nullopt, std::nullopt, std::nullopt, {}, false});
    }
    return out;
}

} // namespace

std::vector<ModelComparison> compareModels(const Cohort& cohort, const ValidationResult& result,
                                           const PanelSettings& settings, const std::vector<double>& cutPoints,
                                           const std::vector<ScoreOrder>* orders, unsigned threads)
{
    std::vector<double> cuts = cutPoints;
    std::sort(cuts.begin(), cuts.end());
    std::vector<ModelComparison> out;
    for (std::size_t a = 0; a < cohort.models.size(); ++a)
        for (std::size_t b = a + 1; b < cohort.models.size(); ++b)
            out.push_back(comparePair(cohort, a, b, result, settings, cuts, orders, threads));
    return out;
}

} // namespace plumbline
