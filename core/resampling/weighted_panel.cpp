#include "resampling/weighted_panel.hpp"

#include "metrics/logistic_recalibration.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <numeric>

namespace plumbline {

ModelSupport buildModelSupport(std::span<const double> score, const ScoreOrder& order, bool risks)
{
    ModelSupport s;
    s.risks = risks;
    s.rowSupport.resize(score.size());
    s.rowsInOrder = order;
    for (std::size_t k = 0; k < order.size(); ++k) {
        const double value = score[order[k]];
        if (s.x.empty() || value != s.x.back())
            s.x.push_back(value);
        s.rowSupport[order[k]] = static_cast<std::uint32_t>(s.x.size() - 1);
    }
    if (risks)
        addRiskTerms(s);
    return s;
}

void addRiskTerms(ModelSupport& s)
{
    s.lp = clampedLogits(s.x);
    s.logRisk.resize(s.x.size());
    s.logComplement.resize(s.x.size());
    for (std::size_t k = 0; k < s.x.size(); ++k) {
        s.logRisk[k] = std::log(s.x[k]);
        s.logComplement[k] = std::log1p(-s.x[k]);
    }
}

void countRows(const ModelSupport& support, std::span<const std::uint8_t> outcome,
               std::span<const std::uint16_t> rowCounts, SupportCounts& counts)
{
    // In score order the writes to the two per-point arrays (megabytes each) are sequential; the
    // random reads are of the smaller count and outcome arrays. A point's rows are consecutive,
    // so its first row sets the sums and no clearing pass is needed. Whole numbers: the order of
    // the additions changes nothing.
    // A support small enough for the cache (the 4-decimal risks of a typical export: ten thousand
    // points) is counted in file order instead: the row arrays are then read in sequence and the
    // additions land in the cache.
    constexpr std::size_t cachedPoints = 1 << 15;
    if (support.rowsInOrder.size() == outcome.size() && support.x.size() > cachedPoints) {
        counts.events.resize(support.x.size());
        counts.nonEvents.resize(support.x.size());
        double* events = counts.events.data();
        double* nonEvents = counts.nonEvents.data();
        std::uint32_t previous = std::numeric_limits<std::uint32_t>::max();
        for (const std::uint32_t i : support.rowsInOrder) {
            const double c = rowCounts[i];
            const double y = outcome[i];
            const std::uint32_t k = support.rowSupport[i];
            if (k != previous) {
                events[k] = c * y;
                nonEvents[k] = c - c * y;
                previous = k;
            } else {
                events[k] += c * y;
                nonEvents[k] += c - c * y;
            }
        }
        return;
    }
    counts.events.assign(support.x.size(), 0.0);
    counts.nonEvents.assign(support.x.size(), 0.0);
    double* events = counts.events.data();
    double* nonEvents = counts.nonEvents.data();
    for (std::size_t i = 0; i < outcome.size(); ++i) {
        const double c = rowCounts[i];
        const double y = outcome[i];
        const std::uint32_t k = support.rowSupport[i];
        events[k] += c * y;
        nonEvents[k] += c - c * y;
    }
}

SupportCounts sampleCounts(const ModelSupport& support, std::span<const std::uint8_t> outcome)
{
    SupportCounts counts;
    const std::vector<std::uint16_t> ones(outcome.size(), 1);
    countRows(support, outcome, ones, counts);
    return counts;
}

namespace {

struct Totals {
    double events = 0.0;
    double nonEvents = 0.0;
    double patients() const { return events + nonEvents; }
};

Totals totals(const SupportCounts& c)
{
    return {std::accumulate(c.events.begin(), c.events.end(), 0.0),
            std::accumulate(c.nonEvents.begin(), c.nonEvents.end(), 0.0)};
}

// Mann–Whitney C with half credit for ties (docs/methods.md §15 sweep), and average precision.
void discrimination(const ModelSupport& s, const SupportCounts& c, const Totals& t, PanelValues& out)
{
    double belowNonEvents = 0.0, numerator = 0.0;
    for (std::size_t k = 0; k < s.x.size(); ++k) {
        numerator += c.events[k] * (belowNonEvents + 0.5 * c.nonEvents[k]);
        belowNonEvents += c.nonEvents[k];
    }
    out[CStatistic] = numerator / (t.events * t.nonEvents);
    double tp = 0.0, fp = 0.0, ap = 0.0;
    for (std::size_t k = s.x.size(); k > 0; --k) {
        tp += c.events[k - 1];
        fp += c.nonEvents[k - 1];
        if (c.events[k - 1] > 0.0)
            ap += c.events[k - 1] / t.events * tp / (tp + fp);
    }
    out[Auprc] = ap;
}

void accuracy(const ModelSupport& s, const SupportCounts& c, const Totals& t, PanelValues& out)
{
    double squared = 0.0, logLikelihood = 0.0, eventRisk = 0.0, nonEventRisk = 0.0;
    bool contradicted = false;
    const bool precomputed = s.logRisk.size() == s.x.size() && s.logComplement.size() == s.x.size();
    for (std::size_t k = 0; k < s.x.size(); ++k) {
        const double p = s.x[k], e = c.events[k], f = c.nonEvents[k];
        squared += e * (1.0 - p) * (1.0 - p) + f * p * p;
        eventRisk += e * p;
        nonEventRisk += f * p;
        if ((e > 0.0 && p <= 0.0) || (f > 0.0 && p >= 1.0))
            contradicted = true;
        else
            logLikelihood += (e > 0.0 ? e * (precomputed ? s.logRisk[k] : std::log(p)) : 0.0)
                + (f > 0.0 ? f * (precomputed ? s.logComplement[k] : std::log1p(-p)) : 0.0);
    }
    const double n = t.patients();
    const double rate = t.events / n;
    out[DiscriminationSlope] = eventRisk / t.events - nonEventRisk / t.nonEvents;
    out[OeRatio] = eventRisk + nonEventRisk > 0.0 ? std::optional<double>(t.events / (eventRisk + nonEventRisk)) : std::nullopt;
    out[Brier] = squared / n;
    out[ScaledBrier] = 1.0 - squared / n / (rate * (1.0 - rate));
    if (contradicted)
        return;
    out[LogLoss] = -logLikelihood / n;
    const double nullLogLikelihood = t.events * std::log(rate) + t.nonEvents * std::log(1.0 - rate);
    out[NagelkerkeR2] = (1.0 - std::exp(2.0 * (nullLogLikelihood - logLikelihood) / n))
        / (1.0 - std::exp(2.0 * nullLogLikelihood / n));
}

void calibrationFits(const ModelSupport& s, const SupportCounts& c, const FitStart& start, PanelValues& out)
{
    // Patients whose outcome contradicts a risk of 0 or 1 are left out, as in the full sample.
    // Buffers kept per thread: a replicate on a million distinct risks would otherwise allocate
    // and fault in fresh megabytes every time.
    // Only points holding a patient enter the fits (about a third of a replicate's points hold
    // none); a point without trials adds exactly zero to every sum, so the fits are unchanged.
    thread_local std::vector<double> lp, events, trials;
    lp.resize(s.x.size());
    events.resize(s.x.size());
    trials.resize(s.x.size());
    std::size_t used = 0;
    for (std::size_t k = 0; k < s.x.size(); ++k) {
        const double agreeingEvents = contradictsOutcome(s.x[k], true) ? 0.0 : c.events[k];
        const double agreeingNonEvents = contradictsOutcome(s.x[k], false) ? 0.0 : c.nonEvents[k];
        // Branch-free: written at `used` always, kept only when the point has trials.
        lp[used] = s.lp[k];
        events[used] = agreeingEvents;
        trials[used] = agreeingEvents + agreeingNonEvents;
        used += trials[used] > 0.0;
    }
    const BinomialPoints points{std::span(lp).first(used), std::span(events).first(used), std::span(trials).first(used)};
    // Estimates only: a replicate reads no standard error or log-likelihood.
    if (const auto intercept = calibrationInterceptEstimate(points, start.calibrationIntercept))
        out[CalibrationIntercept] = *intercept;
    if (const auto slope = calibrationSlopeEstimate(points, start.recalibrationIntercept, start.slope)) {
        out[CalibrationSlope] = slope->slope;
        out[RecalibrationIntercept] = slope->intercept;
    }
}

void smoothedCurve(const ModelSupport& s, const SupportCounts& c, const LoessOptions& options, PanelValues& out,
                   CurveSample* curve)
{
    // The fixed risks and the replicate's events are viewed, not copied; only the patient counts
    // are formed (in a buffer kept per thread).
    thread_local std::vector<double> patients;
    patients.resize(s.x.size());
    for (std::size_t k = 0; k < s.x.size(); ++k)
        patients[k] = c.events[k] + c.nonEvents[k];
    thread_local LoessSummary loess;
    if (!loessInto(RiskPoints{s.x, patients, c.events}, options, loess))
        return;
    out[Ici] = loess.ici;
    out[E50] = loess.e50;
    out[E90] = loess.e90;
    out[Emax] = loess.emax;
    if (curve) {
        curve->values.clear();
        for (const std::size_t k : curve->at)
            curve->values.push_back(loess.fitted[k]);
    }
}

} // namespace

PanelValues smoothedCalibrationValues(const ModelSupport& s, const SupportCounts& c, const LoessOptions& loess)
{
    PanelValues out{};
    const Totals t = totals(c);
    if (t.events <= 0.0 || t.nonEvents <= 0.0 || !s.risks)
        return out;
    smoothedCurve(s, c, loess, out, nullptr);
    return out;
}

PanelValues weightedPanel(const ModelSupport& s, const SupportCounts& c, const FitStart& start,
                          const LoessOptions* loess, CurveSample* curve)
{
    PanelValues out{};
    const Totals t = totals(c);
    if (t.events <= 0.0 || t.nonEvents <= 0.0)
        return out;
    discrimination(s, c, t, out);
    if (!s.risks)
        return out;
    accuracy(s, c, t, out);
    calibrationFits(s, c, start, out);
    if (loess)
        smoothedCurve(s, c, *loess, out, curve);
    return out;
}

std::vector<double> sensitivityAtFalsePositiveRates(const ModelSupport& s, const SupportCounts& c,
                                                    std::span<const double> rates)
{
    // Walk the ROC polyline from the top threshold down. For each requested rate r (ascending),
    // the last vertex with FPR <= r gives the sensitivity when its FPR equals r (the highest
    // sensitivity at that rate), otherwise the segment to the next vertex is interpolated.
    const Totals t = totals(c);
    std::vector<double> out(rates.size(), 1.0);
    double tp = 0.0, fp = 0.0, lastFpr = 0.0, lastTpr = 0.0;
    std::size_t next = 0;
    for (std::size_t k = s.x.size(); k > 0 && next < rates.size(); --k) {
        tp += c.events[k - 1];
        fp += c.nonEvents[k - 1];
        const double fpr = fp / t.nonEvents, tpr = tp / t.events;
        while (next < rates.size() && rates[next] < fpr) {
            const double share = (rates[next] - lastFpr) / (fpr - lastFpr);
            out[next++] = lastTpr + share * (tpr - lastTpr);
        }
        lastFpr = fpr;
        lastTpr = tpr;
    }
    return out;
}

} // namespace plumbline
