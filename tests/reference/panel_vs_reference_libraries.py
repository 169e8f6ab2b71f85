"""Live cross-check of the metric panel against general-purpose reference libraries.

Reference: Debian 12's scikit-learn 1.2, statsmodels 0.13, scipy 1.10 and numpy under
/usr/bin/python3. For the bundled sample cohort and several simulated cohorts (two of them with
heavy ties), plumbline-cli writes its JSON; this script recomputes from the same rows:
C (roc_auc_score), Brier (brier_score_loss), log loss (log_loss), average precision
(average_precision_score), calibration-in-the-large (GLM binomial with logit(p) as offset),
calibration slope and its intercept (Logit), O/E, Wilson and Clopper-Pearson intervals
(proportion_confint), the chi-square and normal p-values (scipy.stats), the risk-group sums and
the threshold counts. Tolerances: 1e-9 for counts, ranks and sums; 1e-6 for fitted values.
"""
import csv
import os
import subprocess
import sys
import tempfile

import numpy as np
import pandas as pd
import scipy.stats as st
import statsmodels.api as sm
from sklearn.metrics import average_precision_score, brier_score_loss, log_loss, roc_auc_score
from statsmodels.stats.proportion import proportion_confint

from reference_rows import is_missing, run_cli, score_status

cli, samples = sys.argv[1], sys.argv[2]
EXACT, FITTED = 1e-9, 1e-6
failures = []
checks = 0
exact_cases = []


def close(label, got, want, tol):
    global checks
    checks += 1
    if got is None or want is None or not abs(got - want) <= tol * max(1.0, abs(want)):
        failures.append(f"{label}: plumbline {got} vs reference {want} (tolerance {tol})")


def check_model(tag, model, y, p, settings):
    m = model["metrics"]
    z = st.norm.ppf(0.5 + settings["confidence"] / 2)
    close(f"{tag} C", m["c_statistic"]["estimate"], roc_auc_score(y, p), EXACT)
    close(f"{tag} Brier", m["brier"]["estimate"], brier_score_loss(y, p), EXACT)
    close(f"{tag} log loss", m["log_loss"]["estimate"], log_loss(y, p), EXACT)
    close(f"{tag} average precision", m["auprc"]["estimate"], average_precision_score(y, p), EXACT)
    lp = np.log(p / (1 - p))
    citl = sm.GLM(y, np.ones((len(y), 1)), family=sm.families.Binomial(), offset=lp).fit(tol=1e-12)
    close(f"{tag} calibration intercept", m["calibration_intercept"]["estimate"], citl.params[0], FITTED)
    close(f"{tag} calibration intercept SE", m["calibration_intercept"]["se"], citl.bse[0], FITTED)
    slope = sm.Logit(y, sm.add_constant(lp)).fit(disp=0, tol=1e-12)
    close(f"{tag} calibration slope", m["calibration_slope"]["estimate"], slope.params[1], FITTED)
    close(f"{tag} calibration slope SE", m["calibration_slope"]["se"], slope.bse[1], FITTED)
    close(f"{tag} recalibration intercept", m["recalibration_intercept"]["estimate"], slope.params[0], FITTED)
    close(f"{tag} slope CI lower", m["calibration_slope"]["ci_lower"], slope.params[1] - z * slope.bse[1], FITTED)
    observed, expected = y.sum(), p.sum()
    close(f"{tag} O/E", m["oe_ratio"]["estimate"], observed / expected, EXACT)
    # Both interval methods, both limits: log-normal with SE(log O/E) = sqrt(1/O - 1/N), exact
    # Poisson from chi-square quantiles (Ulm 1990, Am J Epidemiol 131:373; both from memory).
    oe = m["oe_ratio"]
    alpha = 1 - settings["confidence"]
    if oe["ci_method"] == "log_normal":
        se = np.sqrt(1 / observed - 1 / len(y))
        close(f"{tag} O/E lower", oe["ci_lower"], observed / expected * np.exp(-z * se), EXACT)
        close(f"{tag} O/E upper", oe["ci_upper"], observed / expected * np.exp(z * se), EXACT)
        close(f"{tag} O/E se_log", oe["se_log"], se, EXACT)
        close(f"{tag} O/E se on the ratio scale", oe["se"], observed / expected * se, EXACT)
    else:
        exact_cases.append(tag)
        close(f"{tag} O/E interval is exact below 10 events", float(oe["ci_method"] == "exact_poisson" and observed < 10), 1.0, EXACT)
        lower = st.chi2.ppf(alpha / 2, 2 * observed) / (2 * expected) if observed > 0 else 0.0
        close(f"{tag} O/E exact lower", oe["ci_lower"], lower, FITTED)
        close(f"{tag} O/E exact upper", oe["ci_upper"], st.chi2.ppf(1 - alpha / 2, 2 * observed + 2) / (2 * expected), FITTED)
    # Likelihood-ratio tests from the reference fits' log-likelihoods.
    ll_orig = np.sum(y * np.log(p) + (1 - y) * np.log(1 - p))
    tests = model["tests"]
    close(f"{tag} LR joint", tests["likelihood_ratio_joint"]["statistic"], 2 * (slope.llf - ll_orig), FITTED)
    close(f"{tag} LR joint p", tests["likelihood_ratio_joint"]["p_value"], st.chi2.sf(2 * (slope.llf - ll_orig), 2), FITTED)
    close(f"{tag} LR slope|CITL", tests["likelihood_ratio_slope_given_intercept"]["statistic"], 2 * (slope.llf - citl.llf), FITTED)
    # Spiegelhalter (formula of Spiegelhalter 1986, numpy) and its normal p-value (scipy).
    zs = np.sum((y - p) * (1 - 2 * p)) / np.sqrt(np.sum((1 - 2 * p) ** 2 * p * (1 - p)))
    close(f"{tag} Spiegelhalter z", tests["spiegelhalter"]["z"], zs, EXACT)
    close(f"{tag} Spiegelhalter p", tests["spiegelhalter"]["p_value"], 2 * st.norm.sf(abs(zs)), EXACT)
    check_groups(tag, model, y, p, settings)
    check_thresholds(tag, model, y, p, settings)


def check_groups(tag, model, y, p, settings):
    method = "beta" if settings["binomial_interval"] == "clopper-pearson" else "wilson"
    groups = model["risk_groups"]
    close(f"{tag} risk groups cover all", sum(g["n"] for g in groups), len(y), EXACT)
    statistic = 0.0
    for g in groups:
        inside = (p >= g["risk_min"]) & (p <= g["risk_max"])
        close(f"{tag} group {g['group']} n", g["n"], inside.sum(), EXACT)
        close(f"{tag} group {g['group']} events", g["events"], y[inside].sum(), EXACT)
        close(f"{tag} group {g['group']} expected", g["expected"], p[inside].sum(), EXACT)
        lo, hi = proportion_confint(g["events"], g["n"], alpha=1 - settings["confidence"], method=method)
        close(f"{tag} group {g['group']} CI lower", g["ci_lower"], lo, FITTED if method == "beta" else EXACT)
        close(f"{tag} group {g['group']} CI upper", g["ci_upper"], hi, FITTED if method == "beta" else EXACT)
        e = p[inside].sum()
        statistic += (y[inside].sum() - e) ** 2 / (e * (1 - e / inside.sum()))
    # External validation: nothing is estimated on these data, so df = number of groups
    # (Hosmer & Lemeshow 2013, Applied Logistic Regression, 3rd ed., §5.2.2; from memory),
    # counted here from the groups, not read from the program.
    hl = model["tests"]["hosmer_lemeshow"]
    close(f"{tag} HL statistic", hl["statistic"], statistic, EXACT)
    close(f"{tag} HL df", hl["df"], len(groups), EXACT)
    close(f"{tag} HL p", hl["p_value"], st.chi2.sf(statistic, len(groups)), EXACT)


def check_thresholds(tag, model, y, p, settings):
    method = "beta" if settings["binomial_interval"] == "clopper-pearson" else "wilson"
    for row in model["thresholds"]:
        t = row["threshold"]
        flagged = p >= t
        tp, fp = int((flagged & (y == 1)).sum()), int((flagged & (y == 0)).sum())
        close(f"{tag} t={t} TP", row["tp"], tp, EXACT)
        close(f"{tag} t={t} FP", row["fp"], fp, EXACT)
        lo, hi = proportion_confint(tp, int(y.sum()), alpha=1 - settings["confidence"], method=method)
        close(f"{tag} t={t} sensitivity CI", row["sensitivity_ci_lower"], lo, FITTED)
        close(f"{tag} t={t} net benefit", row["net_benefit"], tp / len(y) - fp / len(y) * t / (1 - t), EXACT)


def usable_rows(path, outcome, scores):
    frame = pd.read_csv(path, dtype=str, keep_default_na=False)
    keep = ~frame[outcome].map(is_missing)
    for column in scores:
        keep &= frame[column].map(score_status).isna()
    frame = frame[keep]
    y = frame[outcome].str.strip().str.lower().isin(["yes", "1", "true", "y"]).astype(int).to_numpy()
    return y, {column: frame[column].astype(float).to_numpy() for column in scores}


def validate(tag, path, outcome, scores, extra=()):
    args = [path, "--outcome", outcome]
    for column in scores:
        args += ["--score", column]
    result = run_cli(cli, args + ["--bootstrap", "0"] + list(extra))
    settings = result["settings"]["panel"]
    y, p = usable_rows(path, outcome, scores)
    close(f"{tag} rows used", result["cohort"]["rows_used"], len(y), EXACT)
    for model in result["models"]:
        check_model(f"{tag}/{model['name']}", model, y, p[model["name"]], settings)


with tempfile.TemporaryDirectory() as work:
    validate("sample", f"{samples}/readmissions.csv", "readmitted_30d", ["supplier_score", "local_score"])
    for seed, rows, step in [(11, 3000, None), (12, 8000, 0.05), (13, 2000, 0.01)]:
        raw = os.path.join(work, f"sim{seed}.csv")
        subprocess.run([cli, "simulate", "--rows", str(rows), "--seed", str(seed), "--out", raw], check=True,
                       capture_output=True)
        y, p = usable_rows(raw, "readmitted_30d", ["supplier_score", "local_score"])
        path = os.path.join(work, f"clean{seed}.csv")
        with open(path, "w", newline="") as handle:
            writer = csv.writer(handle)
            writer.writerow(["y", "a", "b"])
            for k in range(len(y)):
                a, b = p["supplier_score"][k], p["local_score"][k]
                if step:  # heavy ties: risks rounded to a coarse grid, kept inside (0, 1)
                    a = min(max(round(a / step) * step, step), 1 - step)
                    b = min(max(round(b / step) * step, step), 1 - step)
                writer.writerow([y[k], repr(float(a)), repr(float(b))])
        extra = ["--binomial-interval", "clopper-pearson", "--thresholds", "0.05,0.15,0.25"] if seed == 12 else []
        validate(f"simulated seed {seed}" + (f" ties {step}" if step else ""), path, "y", ["a", "b"], extra)
    # A small cohort with fewer than 10 events: the exact Poisson O/E interval, at 90 %.
    small = os.path.join(work, "small.csv")
    with open(os.path.join(work, "clean11.csv")) as source, open(small, "w") as target:
        lines = source.readlines()
        target.writelines(lines[:61])
    validate("small cohort", small, "y", ["a", "b"], ["--confidence", "0.9"])
    close("the exact Poisson interval was checked", float(len(exact_cases) > 0), 1.0, EXACT)

for failure in failures:
    print("FAIL", failure)
print(f"{checks - len(failures)} passed, {len(failures)} failed")
sys.exit(1 if failures else 0)
