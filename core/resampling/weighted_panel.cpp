#include "resampling/weighted_panel.hpp"

#include "metrics/logistic_recalibration.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <functional>
#include <numeric>
#include <tuple>
#include <utility>

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
    // Zero where the logarithm is infinite (a risk of exactly 0 or 1): only a patient whose
    // outcome contradicts that risk would need the term, and then no log-likelihood is reported.
    // A finite value lets the sweeps multiply by a count of zero without a branch.
    for (std::size_t k = 0; k < s.x.size(); ++k) {
        s.logRisk[k] = s.x[k] > 0.0 ? std::log(s.x[k]) : 0.0;
        s.logComplement[k] = s.x[k] < 1.0 ? std::log1p(-s.x[k]) : 0.0;
    }
}

void addStartRisks(ModelSupport& s, const FitStart& start)
{
    StartRisks risks{start, {}, {}};
    predictedRisksInto(s.lp, start.calibrationIntercept, 1.0, risks.intercept);
    predictedRisksInto(s.lp, start.recalibrationIntercept, start.slope, risks.slope);
    s.startRisks = std::move(risks);
}

namespace {
constexpr std::uint32_t eventBit = 1u << 31, firstOfPointBit = 1u << 30, rowBits = firstOfPointBit - 1;
} // namespace

void packRowsInOrder(ModelSupport& s, std::span<const std::uint8_t> outcome)
{
    s.packedRows.clear();
    s.packedOutcome = nullptr;
    if (outcome.size() > rowBits || s.rowsInOrder.size() != outcome.size())
        return;
    s.packedRows.resize(outcome.size());
    std::uint32_t previous = std::numeric_limits<std::uint32_t>::max();
    for (std::size_t j = 0; j < s.rowsInOrder.size(); ++j) {
        const std::uint32_t i = s.rowsInOrder[j];
        const std::uint32_t k = s.rowSupport[i];
        s.packedRows[j] = i | (outcome[i] ? eventBit : 0u) | (k != previous ? firstOfPointBit : 0u);
        previous = k;
    }
    s.packedOutcome = outcome.data();
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
    if (support.packedOutcome == outcome.data() && support.packedRows.size() == outcome.size()
        && support.x.size() > cachedPoints) {
        // The same walk, with the outcome and the point changes read from the packed rows, and
        // without a branch (where a point starts is random, so a branch would often be
        // mispredicted): a point's running sums are integers, restarted by a mask at its first
        // row, and stored at every row (the last store is the point's total). Whole numbers
        // below 2^53, so the doubles are those the additions in doubles gave.
        counts.events.resize(support.x.size());
        counts.nonEvents.resize(support.x.size());
        double* events = counts.events.data();
        double* nonEvents = counts.nonEvents.data();
        std::size_t k = std::numeric_limits<std::size_t>::max(); // the first row moves it to point 0
        std::uint64_t pointEvents = 0, pointNonEvents = 0;
        for (const std::uint32_t packed : support.packedRows) {
            const std::uint64_t c = rowCounts[packed & rowBits];
            const std::uint64_t event = 0 - std::uint64_t(packed >> 31); // all ones for an event
            const std::uint64_t first = (packed >> 30) & 1;
            const std::uint64_t keep = first - 1; // all ones unless the point starts here
            k += first;
            pointEvents = (pointEvents & keep) + (c & event);
            pointNonEvents = (pointNonEvents & keep) + (c & ~event);
            events[k] = double(pointEvents);
            nonEvents[k] = double(pointNonEvents);
        }
        return;
    }
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

// Every sum of the panel taken over the points in ascending order, gathered in one sweep (a
// replicate on a million distinct risks is bound by reading its counts, so each is read once):
// the class totals, the Mann–Whitney numerator, the accuracy sums, and for the calibration fits
// the points holding a patient (compacted) with, when the support carries the fits' risks at
// this start, the sums of the fits' first Newton pass.
struct AscendingSweep {
    Totals totals;
    double cNumerator = 0.0;
    double squared = 0.0, logLikelihood = 0.0, eventRisk = 0.0, nonEventRisk = 0.0;
    bool contradicted = false;
    std::size_t used = 0;
    bool startSums = false;
    InterceptSums intercept;
    SlopeSums slope;
};

// Buffers kept per thread: a replicate on a million distinct risks would otherwise allocate and
// fault in fresh megabytes every time.
struct FitPoints {
    std::vector<double> lp, events, trials;
};

bool sameStart(const FitStart& a, const FitStart& b)
{
    return a.calibrationIntercept == b.calibrationIntercept && a.recalibrationIntercept == b.recalibrationIntercept
        && a.slope == b.slope;
}

// The sums of both fits' first Newton pass (InterceptSums::add and SlopeSums::add at each point)
// kept two to a 128-bit vector: the two fits' risks side by side, and the slope fit's sums in
// pairs that take the same products ([h00, t0], [h01, t1], [h11, t2], [g0, g1]). Each lane does
// the scalar code's operations in its order, so every sum is the same double; the sweep runs
// out of registers with twenty scalar sums, and pairs halve the instructions.
using Pair = double __attribute__((vector_size(2 * sizeof(double))));

struct StartSumPairs {
    Pair scoreInformation{}; // intercept fit: score, information
    double skew = 0.0;
    Pair first{}, second{}, third{}, gradient{}; // [h00, t0], [h01, t1], [h11, t2], [g0, g1]
    double t3 = 0.0;

    [[gnu::always_inline]] void add(double x, double events, double trials, double interceptRisk, double slopeRisk)
    {
        const Pair p = {interceptRisk, slopeRisk};
        const Pair tp = trials * p;
        const Pair v = tp * (1.0 - p);
        const Pair r = events - tp;
        const Pair w = v * (1.0 - 2.0 * p);
        scoreInformation += Pair{r[0], v[0]};
        skew += w[0];
        const Pair a = {v[1], w[1]};
        const Pair ax = a * x;
        const Pair axx = ax * x;
        first += a;
        second += ax;
        third += axx;
        t3 += axx[1] * x;
        gradient += Pair{r[1], r[1]} * Pair{1.0, x};
    }
    void into(InterceptSums& intercept, SlopeSums& slope) const
    {
        intercept.score = scoreInformation[0];
        intercept.information = scoreInformation[1];
        intercept.skew = skew;
        slope.h00 = first[0];
        slope.t0 = first[1];
        slope.h01 = second[0];
        slope.t1 = second[1];
        slope.h11 = third[0];
        slope.t2 = third[1];
        slope.t3 = t3;
        slope.g0 = gradient[0];
        slope.g1 = gradient[1];
    }
};

AscendingSweep sweepAscending(const ModelSupport& s, const SupportCounts& c, const FitStart& start, FitPoints& fit)
{
    // Every sum is a local until the end, and the arrays are raw pointers: the result lives in
    // the caller's frame, and a double member there could alias the stores to the fit points,
    // which would make the compiler store and reload every sum at every point.
    const std::size_t d = s.x.size();
    const double* const x = s.x.data();
    const double* const events = c.events.data();
    const double* const nonEvents = c.nonEvents.data();
    double totalEvents = 0.0, totalNonEvents = 0.0, cNumerator = 0.0, belowNonEvents = 0.0;
    AscendingSweep out;
    // A points score gets the discrimination sums only: everything below `risks` in the loop
    // reads arrays a risk support alone has (the test is the same at every point).
    const bool risks = s.risks;
    const bool precomputed = s.logRisk.size() == d && s.logComplement.size() == d;
    const bool startSums = risks && s.startRisks && sameStart(s.startRisks->start, start);
    const double* const interceptRisk = startSums ? s.startRisks->intercept.data() : nullptr;
    const double* const slopeRisk = startSums ? s.startRisks->slope.data() : nullptr;
    const double* const lp = s.lp.data();
    const double* const logRisk = precomputed ? s.logRisk.data() : nullptr;
    const double* const logComplement = precomputed ? s.logComplement.data() : nullptr;
    if (risks) {
        fit.lp.resize(d);
        fit.events.resize(d);
        fit.trials.resize(d);
    }
    double* const fitLp = fit.lp.data();
    double* const fitEvents = fit.events.data();
    double* const fitTrials = fit.trials.data();
    double squared = 0.0, logLikelihood = 0.0;
    bool contradicted = false;
    StartSumPairs startPairs;
    Pair risk{}; // Σ events·p, Σ non-events·p
    std::size_t used = 0;
    for (std::size_t k = 0; k < d; ++k) {
        const double p = x[k], e = events[k], f = nonEvents[k];
        totalEvents += e;
        totalNonEvents += f;
        cNumerator += e * (belowNonEvents + 0.5 * f);
        belowNonEvents += f;
        if (!risks)
            continue;
        // Accuracy, the events' and non-events' terms side by side in a vector's lanes.
        const Pair counts = {e, f};
        const Pair distance = {1.0 - p, p};
        const Pair squares = counts * distance * distance;
        squared += squares[0] + squares[1];
        risk += counts * p;
        // Without branches on the counts (which points hold events is random in a replicate): a
        // zero count times a finite logarithm adds a zero, and a contradicted panel reports no
        // log-likelihood, so what its terms add does not matter.
        contradicted |= ((e > 0.0) & (p <= 0.0)) | ((f > 0.0) & (p >= 1.0));
        if (logRisk) {
            const Pair terms = counts * Pair{logRisk[k], logComplement[k]};
            logLikelihood += terms[0] + terms[1];
        } else if (!((e > 0.0 && p <= 0.0) || (f > 0.0 && p >= 1.0)))
            logLikelihood += (e > 0.0 ? e * std::log(p) : 0.0) + (f > 0.0 ? f * std::log1p(-p) : 0.0);
        // Calibration fits: patients whose outcome contradicts a risk of 0 or 1 are left out, as
        // in the full sample. Only points holding a patient are kept (about a third of a
        // replicate's points hold none; such a point adds exactly zero to every sum), written
        // at `used` always and kept when the point has trials: branch-free.
        const double agreeingEvents = contradictsOutcome(p, true) ? 0.0 : e;
        const double agreeingNonEvents = contradictsOutcome(p, false) ? 0.0 : f;
        const double trials = agreeingEvents + agreeingNonEvents;
        fitLp[used] = lp[k];
        fitEvents[used] = agreeingEvents;
        fitTrials[used] = trials;
        used += trials > 0.0;
        if (interceptRisk)
            startPairs.add(lp[k], agreeingEvents, trials, interceptRisk[k], slopeRisk[k]);
    }
    out.totals = {totalEvents, totalNonEvents};
    out.cNumerator = cNumerator;
    out.squared = squared;
    out.logLikelihood = logLikelihood;
    out.eventRisk = risk[0];
    out.nonEventRisk = risk[1];
    out.contradicted = contradicted;
    out.used = used;
    out.startSums = startSums;
    startPairs.into(out.intercept, out.slope);
    return out;
}

void accuracy(const AscendingSweep& a, PanelValues& out)
{
    const Totals& t = a.totals;
    const double n = t.patients();
    const double rate = t.events / n;
    out[DiscriminationSlope] = a.eventRisk / t.events - a.nonEventRisk / t.nonEvents;
    out[OeRatio] = a.eventRisk + a.nonEventRisk > 0.0 ? std::optional<double>(t.events / (a.eventRisk + a.nonEventRisk)) : std::nullopt;
    out[Brier] = a.squared / n;
    out[ScaledBrier] = 1.0 - a.squared / n / (rate * (1.0 - rate));
    if (a.contradicted)
        return;
    out[LogLoss] = -a.logLikelihood / n;
    const double nullLogLikelihood = t.events * std::log(rate) + t.nonEvents * std::log(1.0 - rate);
    out[NagelkerkeR2] = (1.0 - std::exp(2.0 * (nullLogLikelihood - a.logLikelihood) / n))
        / (1.0 - std::exp(2.0 * nullLogLikelihood / n));
}

void calibrationFits(const AscendingSweep& a, const FitPoints& fit, const FitStart& start, PanelValues& out)
{
    const BinomialPoints points{std::span(fit.lp).first(a.used), std::span(fit.events).first(a.used),
                                std::span(fit.trials).first(a.used)};
    // Estimates only: a replicate reads no standard error or log-likelihood.
    if (const auto intercept = calibrationInterceptEstimate(points, start.calibrationIntercept,
                                                            a.startSums ? &a.intercept : nullptr))
        out[CalibrationIntercept] = *intercept;
    if (const auto slope = calibrationSlopeEstimate(points, start.recalibrationIntercept, start.slope,
                                                    a.startSums ? &a.slope : nullptr)) {
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
                          const LoessOptions* loess, CurveSample* curve, FromTheTop* fromTop)
{
    PanelValues out{};
    thread_local FitPoints fit;
    const AscendingSweep sweep = sweepAscending(s, c, start, fit);
    const Totals& t = sweep.totals;
    thread_local FromTheTop apOnly;
    double ap = 0.0;
    sweepFromTheTop(s, c, t.events, t.nonEvents, fromTop ? *fromTop : apOnly, &ap);
    if (t.events <= 0.0 || t.nonEvents <= 0.0)
        return out;
    out[CStatistic] = sweep.cNumerator / (t.events * t.nonEvents);
    out[Auprc] = ap;
    if (!s.risks)
        return out;
    accuracy(sweep, out);
    calibrationFits(sweep, fit, start, out);
    if (loess)
        smoothedCurve(s, c, *loess, out, curve);
    return out;
}

namespace {

// The smallest non-negative false-positive count fp with rate < fp / nonEvents, as the division
// rounds: the walk below then compares counts and divides only at the few vertices where a
// requested rate is passed (a division per point was most of its cost on a million points).
// Division is monotone in fp, so the boundary is a few ulps from the product. NaN when it is not
// found within a few steps (no non-events, a rate outside [0, 1], NaN): the walk then divides at
// every vertex, as before.
double firstCountBeyond(double rate, double nonEvents)
{
    constexpr int steps = 8;
    auto beyond = [&](double fp) { return rate < fp / nonEvents; };
    if (!(nonEvents > 0.0) || !(rate >= 0.0 && rate <= 1.0))
        return NAN;
    double fp = rate * nonEvents;
    for (int i = 0; i < steps && !beyond(fp); ++i)
        fp = std::nextafter(fp, INFINITY);
    if (!beyond(fp))
        return NAN;
    for (int i = 0; i < steps && fp > 0.0 && beyond(std::nextafter(fp, 0.0)); ++i)
        fp = std::nextafter(fp, 0.0);
    return fp > 0.0 && beyond(std::nextafter(fp, 0.0)) ? NAN : fp;
}

} // namespace

void sweepFromTheTop(const ModelSupport& s, const SupportCounts& c, double events, double nonEvents,
                     FromTheTop& request, double* averagePrecision)
{
    // Sensitivity: walk the ROC polyline from the top threshold down. For each requested rate r
    // (ascending), the last vertex with FPR <= r gives the sensitivity when its FPR equals r (the
    // highest sensitivity at that rate), otherwise the segment to the next vertex is interpolated.
    const auto rates = request.falsePositiveRates;
    request.sensitivity.assign(rates.size(), 1.0);
    thread_local std::vector<double> beyond;
    beyond.resize(rates.size());
    for (std::size_t j = 0; j < rates.size(); ++j)
        beyond[j] = firstCountBeyond(rates[j], nonEvents);
    // Net benefit: the counts at or above each threshold's first point, recorded as the sweep
    // passes it (the running sums from the top, added in the order suffix sums would be).
    thread_local std::vector<std::tuple<std::size_t, std::size_t, std::size_t>> firstAbove; // point, set, threshold
    thread_local std::vector<std::pair<double, double>> above;                            // events, non-events
    firstAbove.clear();
    request.netBenefit.resize(request.thresholdSets.size());
    std::size_t thresholdCount = 0;
    for (std::size_t set = 0; set < request.thresholdSets.size(); ++set) {
        const auto thresholds = request.thresholdSets[set];
        request.netBenefit[set].resize(thresholds.size());
        for (std::size_t j = 0; j < thresholds.size(); ++j) {
            const auto k = std::lower_bound(s.x.begin(), s.x.end(), thresholds[j]) - s.x.begin();
            firstAbove.emplace_back(static_cast<std::size_t>(k), set, thresholdCount++);
        }
    }
    std::sort(firstAbove.begin(), firstAbove.end(), std::greater<>());
    above.resize(thresholdCount);
    auto nextThreshold = firstAbove.begin();
    double tp = 0.0, fp = 0.0, lastTp = 0.0, lastFp = 0.0, ap = 0.0;
    std::size_t next = 0;
    // Average precision (docs/methods.md §15) adds a term at each point holding events, and
    // which points hold them is random in a replicate: the points' running counts are written
    // to a small buffer, kept when the point holds events, and their terms added a buffer at a
    // time, in the same order, so the sweep itself does not branch on them.
    constexpr std::size_t held = 256;
    double heldEvents[held], heldTp[held], heldFp[held];
    std::size_t holding = 0;
    auto addHeld = [&] {
        for (std::size_t i = 0; i < holding; ++i)
            ap += heldEvents[i] / events * heldTp[i] / (heldTp[i] + heldFp[i]);
        holding = 0;
    };
    for (std::size_t k = s.x.size(); k > 0; --k) {
        for (; nextThreshold != firstAbove.end() && std::get<0>(*nextThreshold) == k; ++nextThreshold)
            above[std::get<2>(*nextThreshold)] = {tp, fp};
        const double e = c.events[k - 1];
        tp += e;
        fp += c.nonEvents[k - 1];
        heldEvents[holding] = e;
        heldTp[holding] = tp;
        heldFp[holding] = fp;
        holding += e > 0.0;
        if (holding == held)
            addHeld();
        if (next < rates.size() && !(fp < beyond[next])) { // rates[next] < fp / nonEvents, or not known without dividing
            const double fpr = fp / nonEvents, tpr = tp / events;
            const double lastFpr = lastFp / nonEvents, lastTpr = lastTp / events;
            while (next < rates.size() && rates[next] < fpr) {
                const double share = (rates[next] - lastFpr) / (fpr - lastFpr);
                request.sensitivity[next++] = lastTpr + share * (tpr - lastTpr);
            }
        }
        lastFp = fp;
        lastTp = tp;
    }
    addHeld();
    for (; nextThreshold != firstAbove.end(); ++nextThreshold)
        above[std::get<2>(*nextThreshold)] = {tp, fp};
    const double n = tp + fp;
    for (std::size_t set = 0, index = 0; set < request.thresholdSets.size(); ++set)
        for (std::size_t j = 0; j < request.thresholdSets[set].size(); ++j, ++index) {
            const double t = request.thresholdSets[set][j];
            request.netBenefit[set][j] = above[index].first / n - above[index].second / n * t / (1.0 - t);
        }
    if (averagePrecision)
        *averagePrecision = ap;
}

std::vector<double> sensitivityAtFalsePositiveRates(const ModelSupport& s, const SupportCounts& c,
                                                    std::span<const double> rates)
{
    const Totals t = totals(c);
    FromTheTop request;
    request.falsePositiveRates = rates;
    sweepFromTheTop(s, c, t.events, t.nonEvents, request);
    return request.sensitivity;
}

} // namespace plumbline
