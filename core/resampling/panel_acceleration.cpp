#include "resampling/panel_acceleration.hpp"

#include "resampling/bootstrap_interval.hpp"
#include "metrics/logistic_recalibration.hpp"

#include <cmath>
#include <functional>
#include <numeric>
#include <thread>

namespace plumbline {

namespace {

constexpr std::string_view closedForm = "closed-form jackknife";
constexpr std::string_view influence = "influence function";
constexpr std::string_view grouped = "grouped jackknife (20 groups)";

// Jackknife-type values for every (support point, class) with patients, weighted by how many.
class ClassValues {
public:
    // Room for every (point, class) at once: growing a million-entry vector by doubling would
    // copy and fault in its pages again and again.
    explicit ClassValues(std::size_t points)
    {
        m_values.reserve(2 * points);
        m_counts.reserve(2 * points);
    }
    void add(double value, double count)
    {
        if (count > 0.0) {
            m_values.push_back(value);
            m_counts.push_back(count);
        }
    }
    double acceleration() const { return accelerationFromJackknife(m_values, m_counts); }

private:
    std::vector<double> m_values;
    std::vector<double> m_counts;
};

double expit(double x)
{
    return 1.0 / (1.0 + std::exp(-x));
}

// ln p and ln(1 − p) of a support point: precomputed for a risk support, the same functions.
double logRisk(const ModelSupport& s, std::size_t k)
{
    return s.logRisk.size() == s.x.size() ? s.logRisk[k] : std::log(s.x[k]);
}

double logComplement(const ModelSupport& s, std::size_t k)
{
    return s.logComplement.size() == s.x.size() ? s.logComplement[k] : std::log1p(-s.x[k]);
}

struct Sums {
    double events = 0, nonEvents = 0, riskSum = 0, eventRisk = 0, nonEventRisk = 0, squared = 0, logLikelihood = 0;
};

Sums sums(const ModelSupport& s, const SupportCounts& c)
{
    Sums t;
    for (std::size_t k = 0; k < s.x.size(); ++k) {
        const double p = s.x[k], e = c.events[k], f = c.nonEvents[k];
        t.events += e;
        t.nonEvents += f;
        t.eventRisk += e * p;
        t.nonEventRisk += f * p;
        t.squared += e * (1 - p) * (1 - p) + f * p * p;
        if (s.risks && p > 0.0 && p < 1.0)
            t.logLikelihood += e * logRisk(s, k) + f * logComplement(s, k);
    }
    t.riskSum = t.eventRisk + t.nonEventRisk;
    return t;
}

void cStatistic(const ModelSupport& s, const SupportCounts& c, const Sums& t, double cFull, PanelAccelerations& out)
{
    if (t.events < 2 || t.nonEvents < 2)
        return;
    const double u = cFull * t.events * t.nonEvents;
    ClassValues values(s.x.size());
    double below = 0.0, above = t.events;
    for (std::size_t k = 0; k < s.x.size(); ++k) {
        above -= c.events[k];
        values.add((u - (below + 0.5 * c.nonEvents[k])) / ((t.events - 1) * t.nonEvents), c.events[k]);
        values.add((u - (above + 0.5 * c.events[k])) / (t.events * (t.nonEvents - 1)), c.nonEvents[k]);
        below += c.nonEvents[k];
    }
    out[CStatistic] = Acceleration{values.acceleration(), closedForm};
}

void averagePrecision(const ModelSupport& s, const SupportCounts& c, const Sums& t, double ap, PanelAccelerations& out)
{
    // P_k = TP_k / D_k with cumulative counts from the top; IF(m, y) = [y(P_m − AP) + y·S1(m) − S2(m)]/E.
    const std::size_t d = s.x.size();
    std::vector<double> precision(d), share(d);
    double tp = 0.0, fp = 0.0;
    for (std::size_t k = d; k > 0; --k) {
        tp += c.events[k - 1];
        fp += c.nonEvents[k - 1];
        precision[k - 1] = tp + fp > 0.0 ? tp / (tp + fp) : 0.0;
        share[k - 1] = tp + fp;
    }
    ClassValues values(s.x.size());
    double s1 = 0.0, s2 = 0.0;
    for (std::size_t m = 0; m < d; ++m) {
        if (share[m] > 0.0) {
            s1 += c.events[m] / share[m];
            s2 += c.events[m] * precision[m] / share[m];
        }
        const double ifEvent = ((precision[m] - ap) + s1 - s2) / t.events;
        const double ifNonEvent = -s2 / t.events;
        values.add(-ifEvent, c.events[m]);
        values.add(-ifNonEvent, c.nonEvents[m]);
    }
    out[Auprc] = Acceleration{values.acceleration(), influence};
}

void accuracy(const ModelSupport& s, const SupportCounts& c, const Sums& t, const PanelValues& full,
              PanelAccelerations& out)
{
    const double n = t.events + t.nonEvents;
    ClassValues brier(s.x.size()), scaled(s.x.size()), logLoss(s.x.size()), nagelkerke(s.x.size()), oe(s.x.size()),
        slope(s.x.size());
    // The null log-likelihood and the R² denominator depend only on which class the left-out
    // patient is in: computed once per class (the same expressions), not per patient.
    struct NullModel {
        double total, ll0, denominator;
    };
    auto nullModel = [](double events, double nonEvents) {
        const double total = events + nonEvents;
        const double ll0 = events * std::log(events / total) + nonEvents * std::log(nonEvents / total);
        return NullModel{total, ll0, 1.0 - std::exp(2.0 * ll0 / total)};
    };
    const NullModel withoutOne[2] = {nullModel(t.events, t.nonEvents - 1), nullModel(t.events - 1, t.nonEvents)};
    auto nagelkerkeOf = [&withoutOne](double ll, int y) {
        const NullModel& m = withoutOne[y];
        return (1.0 - std::exp(2.0 * (m.ll0 - ll) / m.total)) / m.denominator;
    };
    for (std::size_t k = 0; k < s.x.size(); ++k) {
        const double p = s.x[k];
        for (int y = 0; y <= 1; ++y) {
            const double count = y ? c.events[k] : c.nonEvents[k];
            if (count <= 0.0)
                continue;
            const double events = t.events - y, nonEvents = t.nonEvents - (1 - y);
            const double rate = events / (n - 1);
            const double b = (t.squared - (y ? (1 - p) * (1 - p) : p * p)) / (n - 1);
            brier.add(b, count);
            scaled.add(1.0 - b / (rate * (1 - rate)), count);
            oe.add(events / (t.riskSum - p), count);
            slope.add(y ? (t.eventRisk - p) / events - t.nonEventRisk / t.nonEvents
                        : t.eventRisk / t.events - (t.nonEventRisk - p) / nonEvents,
                      count);
            if (full[LogLoss]) {
                const double ll = t.logLikelihood - (y ? logRisk(s, k) : logComplement(s, k));
                logLoss.add(-ll / (n - 1), count);
                nagelkerke.add(nagelkerkeOf(ll, y), count);
            }
        }
    }
    out[Brier] = Acceleration{brier.acceleration(), closedForm};
    out[OeRatio] = Acceleration{oe.acceleration(), closedForm};
    if (t.events >= 2 && t.nonEvents >= 2) {
        out[ScaledBrier] = Acceleration{scaled.acceleration(), closedForm};
        out[DiscriminationSlope] = Acceleration{slope.acceleration(), closedForm};
        if (full[LogLoss]) {
            out[LogLoss] = Acceleration{logLoss.acceleration(), closedForm};
            out[NagelkerkeR2] = Acceleration{nagelkerke.acceleration(), closedForm};
        }
    }
}

void fits(const ModelSupport& s, const SupportCounts& c, const FullSampleFits& f, const PanelValues& full,
          PanelAccelerations& out)
{
    ClassValues intercept(s.x.size()), slope(s.x.size()), recalibration(s.x.size());
    const double iaa = f.slopeInformation[0], iab = f.slopeInformation[1], ibb = f.slopeInformation[2];
    for (std::size_t k = 0; k < s.x.size(); ++k) {
        const double lp = s.lp[k];
        const double piOffset = expit(f.start.calibrationIntercept + lp);
        const double piSlope = expit(f.start.recalibrationIntercept + f.start.slope * lp);
        for (int y = 0; y <= 1; ++y) {
            if (contradictsOutcome(s.x[k], y == 1))
                continue; // left out of the fits themselves
            const double count = y ? c.events[k] : c.nonEvents[k];
            // Influence values up to a positive factor; the jackknife value is its negative.
            intercept.add(-(y - piOffset), count);
            slope.add(-(y - piSlope) * (iaa * lp - iab), count);
            recalibration.add(-(y - piSlope) * (ibb - iab * lp), count);
        }
    }
    if (full[CalibrationIntercept])
        out[CalibrationIntercept] = Acceleration{intercept.acceleration(), influence};
    if (f.hasSlope && full[CalibrationSlope]) {
        out[CalibrationSlope] = Acceleration{slope.acceleration(), influence};
        out[RecalibrationIntercept] = Acceleration{recalibration.acceleration(), influence};
    }
}

void smoothedCurve(const ModelSupport& s, const SupportCounts& sample, std::span<const std::uint8_t> outcome,
                   const LoessOptions& loess, const PanelValues& full, PanelAccelerations& out)
{
    const std::size_t groups = std::min<std::size_t>(20, outcome.size());
    constexpr std::array<PanelMetric, 4> metrics{Ici, E50, E90, Emax};
    // Each left-out group's loess metrics alone (no fits, no C), the groups shared between two
    // threads; values are kept by group so the result does not depend on the threads.
    std::vector<PanelValues> byGroup(groups);
    // Group g holds rows g, g + groups, g + 2·groups, …: its counts are the sample's less those
    // rows (whole numbers, so exactly what counting the kept rows gives).
    auto work = [&](std::size_t first) {
        SupportCounts counts;
        for (std::size_t g = first; g < groups; g += 2) {
            counts.events.assign(sample.events.begin(), sample.events.end());
            counts.nonEvents.assign(sample.nonEvents.begin(), sample.nonEvents.end());
            for (std::size_t i = g; i < outcome.size(); i += groups)
                (outcome[i] ? counts.events : counts.nonEvents)[s.rowSupport[i]] -= 1.0;
            byGroup[g] = smoothedCalibrationValues(s, counts, loess);
        }
    };
    {
        std::jthread second(work, std::size_t{1});
        work(0);
    }
    std::array<std::vector<double>, 4> values;
    for (const PanelValues& v : byGroup)
        for (std::size_t m = 0; m < metrics.size(); ++m)
            if (v[metrics[m]])
                values[m].push_back(*v[metrics[m]]);
    for (std::size_t m = 0; m < metrics.size(); ++m)
        if (full[metrics[m]] && values[m].size() == groups)
            out[metrics[m]] = Acceleration{accelerationFromJackknife(values[m]), grouped};
}

} // namespace

PanelAccelerations panelAccelerations(const ModelSupport& support, const SupportCounts& counts, const PanelValues& full,
                                      const FullSampleFits& fitsAtFull, std::span<const std::uint8_t> outcome,
                                      const LoessOptions* loess)
{
    PanelAccelerations out{};
    const Sums t = sums(support, counts);
    if (full[CStatistic])
        cStatistic(support, counts, t, *full[CStatistic], out);
    if (full[Auprc])
        averagePrecision(support, counts, t, *full[Auprc], out);
    if (!support.risks)
        return out;
    accuracy(support, counts, t, full, out);
    fits(support, counts, fitsAtFull, full, out);
    if (loess && full[Ici])
        smoothedCurve(support, counts, outcome, *loess, full, out);
    return out;
}

} // namespace plumbline
