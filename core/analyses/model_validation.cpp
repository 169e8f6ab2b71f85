#include "analyses/model_validation.hpp"

#include "metrics/distributions.hpp"
#include "resampling/interval_choice.hpp"
#include "metrics/logistic_recalibration.hpp"
#include "metrics/loess_calibration.hpp"
#include "metrics/metric_reading.hpp"
#include "metrics/overall_accuracy.hpp"
#include "metrics/panel_keys.hpp"
#include "metrics/score_order.hpp"

#include <algorithm>
#include <array>

namespace plumbline {

namespace {

Estimate wald(double value, double se, double confidence)
{
    const double z = zForConfidence(confidence);
    return {value, se, value - z * se, value + z * se, CiMethod::Wald};
}

Estimate optionalPoint(const std::optional<double>& value)
{
    return value ? Estimate::point(*value) : Estimate::undefined();
}

class PanelBuilder {
public:
    PanelBuilder(const std::vector<std::uint8_t>& outcome, const ModelScores& model, const PanelSettings& settings,
                 std::span<const std::uint32_t> lines, ScoreOrder order)
        : m_y(outcome)
        , m_p(model.values)
        , m_settings(settings)
        , m_lines(lines)
        , m_order(order.size() == model.values.size() ? std::move(order) : ascendingOrder(model.values))
    {
        m_result.name = model.name;
        for (std::string_view key : panelKeys)
            m_result.metrics.push_back({std::string(key), Estimate::undefined(), {}, std::nullopt, std::nullopt, {}});
    }

    void discrimination(bool risks)
    {
        // C and its DeLong SE from the order, a tie block at a time: nothing is held per patient.
        const Estimate c = cStatistic(m_y, m_p, m_order, m_settings.cStatisticScale, m_settings.confidence);
        set("c_statistic", c);
        if (c.value && !c.lower)
            warn("the C statistic has no interval: it needs at least two patients with and without the event, and C strictly between 0 and 1.");
        if (c.value && *c.value > 0.85)
            warn("the C statistic is above 0.85, unusual for models such as 30-day readmission: check that no predictor uses information recorded after the time of prediction (common practice).");
        RocSummary roc = rocSummary(m_y, m_p, m_order, m_settings.rocPoints);
        set("auprc", optionalPoint(roc.averagePrecision));
        m_result.roc = std::move(roc.thinned);
        if (risks)
            set("discrimination_slope", optionalPoint(discriminationSlope(m_y, m_p)));
    }

    void calibration()
    {
        regressions();
        set("oe_ratio", observedExpectedRatio(m_y, m_p, m_settings.confidence));
        m_result.spiegelhalter = spiegelhalterTest(m_y, m_p);
        if (!m_result.spiegelhalter)
            warn("Spiegelhalter's z is undefined: every risk is 0.5 (or 0 or 1).");
        groups();
        smoothedCurve();
    }

    // The logistic recalibration fits and their tests; the logits (a double per patient) and
    // the weights (a byte) live only while they run.
    void regressions()
    {
        std::size_t clamped = 0;
        const std::vector<double> lp = clampedLogits(m_p, &clamped);
        const std::vector<std::uint8_t> weights = fitWeights(clamped);
        const double confidence = m_settings.confidence;
        const auto intercept = fitCalibrationIntercept(m_y, lp, weights);
        if (intercept)
            set("calibration_intercept", wald(intercept->alpha, intercept->se, confidence));
        else
            warn("calibration-in-the-large cannot be estimated (the fit does not converge).");
        const auto slope = fitCalibrationSlope(m_y, lp, weights);
        if (slope) {
            set("calibration_slope", wald(slope->slope, slope->slopeSe, confidence));
            set("recalibration_intercept", wald(slope->intercept, slope->interceptSe, confidence));
        } else {
            warn("the calibration slope cannot be estimated: the risks separate the outcomes perfectly or are all equal.");
        }
        if (intercept)
            m_result.likelihoodRatio = calibrationLikelihoodRatioTests(logLikelihoodOfLogits(m_y, lp, weights), *intercept,
                                                                       slope ? &*slope : nullptr);
    }

    void overall()
    {
        const OverallAccuracy o = overallAccuracy(m_y, m_p);
        set("brier", optionalPoint(o.brier));
        set("scaled_brier", optionalPoint(o.scaledBrier));
        set("log_loss", optionalPoint(o.logLoss));
        set("nagelkerke_r2", optionalPoint(o.nagelkerkeR2));
        if (o.contradictedCertainties > 0)
            warn("log loss and Nagelkerke R2 are infinite, so not reported: " + std::to_string(o.contradictedCertainties)
                 + " patients had a predicted risk of 0 or 1 that their outcome contradicts.");
    }

    void thresholds()
    {
        m_result.operatingPoints = operatingPoints(m_y, m_p, m_order, 0.005);
        // From counts at or above each threshold: the support points the bootstrap needs (five
        // doubles per distinct risk) are not built for the sample's own curve.
        const std::vector<double> grid = decisionGrid(m_settings.decisionFrom, m_settings.decisionTo, m_settings.decisionStep);
        const auto events = static_cast<std::size_t>(std::count(m_y.begin(), m_y.end(), std::uint8_t{1}));
        m_result.decisionCurve = decisionCurve(countsAtOrAbove(m_y, m_p, m_order, grid), events, m_y.size(), grid);
        m_result.riskDistribution = riskHistogram(m_y, m_p, 50);
        m_result.thresholds = thresholdMetrics(m_y, m_p, m_order, m_settings.thresholds, m_settings.confidence,
                                               m_settings.binomialInterval);
    }

    void warn(const std::string& text) { m_result.warnings.push_back("Model '" + m_result.name + "': " + text); }

    // Weights of the calibration fits, a byte a patient: 0 for a patient whose outcome
    // contradicts a risk of 0 or 1 (within 1e-12), 1 otherwise; says which patients were left
    // out and why.
    std::vector<std::uint8_t> fitWeights(std::size_t clamped)
    {
        std::vector<std::uint8_t> weights(m_y.size(), 1);
        std::size_t left = 0;
        std::string lines;
        for (std::size_t i = 0; i < m_y.size(); ++i)
            if (contradictsOutcome(m_p[i], m_y[i] != 0)) {
                weights[i] = 0;
                if (++left <= 5 && i < m_lines.size())
                    lines += (lines.empty() ? "" : ", ") + std::to_string(m_lines[i]);
            }
        if (left > 0)
            warn(std::to_string(left) + " patients have a predicted risk within 1e-12 of 0 or 1 that their outcome contradicts (an event at "
                 "a risk of 0, or a non-event at a risk of 1)" + (lines.empty() ? "" : ", first on lines " + lines)
                 + "; they are left out of calibration-in-the-large, the calibration slope, the recalibration intercept and the "
                   "likelihood-ratio tests, whose values would otherwise depend only on how such a risk is rounded.");
        if (clamped > left)
            warn(std::to_string(clamped - left) + " patients have a predicted risk within 1e-12 of 0 or 1 (a logit beyond ±27.6) that "
                 "their outcome agrees with; the calibration regressions hold those risks at 1e-12 or 1 - 1e-12, which changes no estimate "
                 "noticeably.");
        return weights;
    }

    ModelValidation take()
    {
        readMetrics(m_result.metrics);
        return std::move(m_result);
    }

private:
    void set(std::string_view key, Estimate estimate)
    {
        for (auto& entry : m_result.metrics)
            if (entry.key == key) {
                entry.estimate = std::move(estimate);
                entry.intervalNote = withoutDegenerateInterval(entry.estimate);
                if (!entry.intervalNote.empty())
                    warn(metricLabel(key) + ": " + entry.intervalNote + ".");
            }
    }

    void groups()
    {
        m_result.riskGroups = riskGroups(m_y, m_p, m_order, m_settings.riskGroups, m_settings.confidence,
                                         m_settings.binomialInterval);
        if (m_result.riskGroups.size() < m_settings.riskGroups)
            warn("only " + std::to_string(m_result.riskGroups.size()) + " of " + std::to_string(m_settings.riskGroups)
                 + " risk groups could be formed: tied risks are never split across groups.");
        m_result.hosmerLemeshow = hosmerLemeshow(m_result.riskGroups);
        if (!m_result.hosmerLemeshow)
            warn("the Hosmer-Lemeshow test is undefined: fewer than two risk groups, or a group whose mean risk is 0 or 1.");
        const bool sparse = std::any_of(m_result.riskGroups.begin(), m_result.riskGroups.end(), [](const RiskGroup& g) {
            return g.expected < 5.0 || double(g.n) - g.expected < 5.0;
        });
        if (sparse && m_result.hosmerLemeshow)
            warn("some risk groups expect fewer than 5 events or non-events: the Hosmer-Lemeshow p-value is unreliable.");
    }

    void smoothedCurve()
    {
        // Read off the shared order: binned, no support points are held (three doubles per
        // distinct risk), only the curve's points are kept.
        const auto loess = loessCurve(m_y, m_p, m_order, m_settings.calibrationCurvePoints);
        if (!loess) {
            warn("no smoothed calibration curve (so no ICI, E50, E90, Emax): it needs at least 10 distinct risks; read the risk-group table instead.");
            return;
        }
        set("ici", Estimate::point(loess->summary.ici));
        set("e50", Estimate::point(loess->summary.e50));
        set("e90", Estimate::point(loess->summary.e90));
        set("emax", Estimate::point(loess->summary.emax));
        m_result.calibrationCurveMethod = loess->summary.binned ? "binned" : "direct";
        for (const auto& [risk, fitted] : loess->points)
            m_result.calibrationCurve.push_back({risk, fitted});
    }

    const std::vector<std::uint8_t>& m_y;
    const std::vector<double>& m_p;
    const PanelSettings& m_settings;
    std::span<const std::uint32_t> m_lines;
    ScoreOrder m_order;
    ModelValidation m_result;
};

} // namespace

const Estimate* ModelValidation::metric(std::string_view key) const
{
    for (const auto& entry : metrics)
        if (entry.key == key)
            return &entry.estimate;
    return nullptr;
}

void readMetrics(std::vector<MetricEntry>& metrics)
{
    for (auto& entry : metrics)
        entry.reading = metricReading(entry.key, entry.estimate);
    if (metrics.size() == PanelMetricCount) {
        const std::string note = overallAccuracyAgreementNote(metrics[ScaledBrier].estimate, metrics[NagelkerkeR2].estimate);
        metrics[ScaledBrier].reading += note;
        metrics[NagelkerkeR2].reading += note;
    }
}

ModelValidation validateModel(const std::vector<std::uint8_t>& outcome, const ModelScores& model, ScoreScale scale,
                              const PanelSettings& settings, std::span<const std::uint32_t> sourceLines, ScoreOrder order)
{
    PanelBuilder builder(outcome, model, settings, sourceLines, std::move(order));
    const bool risks = scaleIsProbabilistic(scale);
    builder.discrimination(risks);
    if (!risks) {
        builder.warn("scores on the points scale are not risks: only discrimination is computed; calibration, overall accuracy and threshold metrics need risks.");
        return builder.take();
    }
    builder.calibration();
    builder.overall();
    builder.thresholds();
    return builder.take();
}

} // namespace plumbline
