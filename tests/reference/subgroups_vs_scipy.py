"""Live cross-check of the subgroup analysis against numpy, scipy and statsmodels.

Reference: Debian 12's numpy 1.24, scipy 1.10, statsmodels 0.13 and pandas 1.5 under
/usr/bin/python3. plumbline-cli validates the bundled sample cohort by hospital and by age band;
this script recomputes from the same rows, level by level:
- calibration-in-the-large and its SE (statsmodels GLM, binomial, logit(p) as offset), the
  calibration slope and its SE (statsmodels Logit on logit(p)) and the C statistic (scikit-learn
  roc_auc_score) of every level;
- Cochran's Q, Q = sum w_i (x_i - x_w)^2 with w_i = 1/SE_i^2 and x_w the inverse-variance mean,
  and its p-value from chi-square with k - 1 df (Cochran 1954, Biometrics 10:101; the usual
  meta-analysis form, e.g. Borenstein et al. 2009, Introduction to Meta-Analysis, ch. 16), on the
  calibration-in-the-large and the calibration slope (SEs from statsmodels) and on logit(C) (SE by the delta method from the
  program's DeLong SE, which no general library computes);
- the funnel plot's exact Poisson control limits for O/E (Spiegelhalter 2005, Stat Med 24:1185,
  appendix: the p-quantile r of Poisson(E) from scipy.stats.poisson.ppf, interpolated as
  (r - a)/E with a = (F(r) - p)/(F(r) - F(r - 1)); the interpolation rule from memory).
Tolerances: 1e-9 for sums and quantiles, 1e-6 for fitted values and what depends on them.
"""
import sys

import numpy as np
import pandas as pd
import scipy.stats as st
import statsmodels.api as sm
from sklearn.metrics import roc_auc_score

from reference_rows import is_missing, run_cli, score_status

cli, samples = sys.argv[1], sys.argv[2]
EXACT, FITTED = 1e-9, 1e-6
failures = []
checks = 0


def close(label, got, want, tol):
    global checks
    checks += 1
    if got is None or want is None or not abs(got - want) <= tol * max(1.0, abs(want)):
        failures.append(f"{label}: plumbline {got} vs reference {want} (tolerance {tol})")


def funnel_limit(expected, p, upper):
    q = 1 - p if upper else p
    r = st.poisson.ppf(q, expected)
    at_r = st.poisson.cdf(r, expected)
    below = st.poisson.cdf(r - 1, expected) if r > 0 else 0.0
    a = (at_r - q) / (at_r - below)
    return max(0.0, r - a) / expected


def cochran(estimates):
    x = np.array([e for e, _ in estimates])
    w = 1 / np.array([s for _, s in estimates]) ** 2
    pooled = np.sum(w * x) / np.sum(w)
    q = float(np.sum(w * (x - pooled) ** 2))
    return q, float(st.chi2.sf(q, len(x) - 1))


path = f"{samples}/readmissions.csv"
scores = ["supplier_score", "local_score"]
columns = ["hospital", "age_band"]
result = run_cli(cli, [path, "--outcome", "readmitted_30d", "--score", scores[0], "--score", scores[1],
                       "--group", columns[0], "--group", columns[1], "--bootstrap", "0"])
frame = pd.read_csv(path, dtype=str, keep_default_na=False)
keep = ~frame["readmitted_30d"].map(is_missing)
for s in scores:
    keep &= frame[s].map(score_status).isna()
frame = frame[keep]
y_all = frame["readmitted_30d"].str.strip().str.lower().isin(["yes", "1", "true", "y"]).astype(int).to_numpy()

per_level = {}
for row in result["subgroups"]:
    level_rows = (frame[row["column"]] == row["level"]).to_numpy()
    y = y_all[level_rows]
    p = frame.loc[level_rows, row["model"]].astype(float).to_numpy()
    tag = f"{row['column']}={row['level']}/{row['model']}"
    close(f"{tag} n", row["n"], len(y), EXACT)
    close(f"{tag} events", row["events"], y.sum(), EXACT)
    m = row["metrics"]
    fit = sm.GLM(y, np.ones((len(y), 1)), family=sm.families.Binomial(), offset=np.log(p / (1 - p))).fit(tol=1e-12)
    close(f"{tag} calibration-in-the-large", m["calibration_intercept"]["estimate"], fit.params[0], FITTED)
    close(f"{tag} calibration-in-the-large SE", m["calibration_intercept"]["se"], fit.bse[0], FITTED)
    slope = sm.Logit(y, sm.add_constant(np.log(p / (1 - p)))).fit(disp=0, tol=1e-12)
    close(f"{tag} calibration slope", m["calibration_slope"]["estimate"], slope.params[1], FITTED)
    close(f"{tag} calibration slope SE", m["calibration_slope"]["se"], slope.bse[1], FITTED)
    c = roc_auc_score(y, p)
    close(f"{tag} C", m["c_statistic"]["estimate"], c, EXACT)
    if not row["too_small"]:
        key = (row["column"], row["model"])
        per_level.setdefault((key, "calibration_intercept"), []).append((fit.params[0], fit.bse[0]))
        per_level.setdefault((key, "calibration_slope"), []).append((slope.params[1], slope.bse[1]))
        per_level.setdefault((key, "c_statistic"), []).append(
            (np.log(c / (1 - c)), m["c_statistic"]["se"] / (c * (1 - c))))

close("heterogeneity tests made", len(result["heterogeneity"]), 3 * len(columns) * len(scores), EXACT)
for h in result["heterogeneity"]:
    tag = f"{h['column']}/{h['model']}/{h['metric']}"
    estimates = per_level[((h["column"], h["model"]), h["metric"])]
    q, p_value = cochran(estimates)
    close(f"{tag} levels", h["levels"], len(estimates), EXACT)
    close(f"{tag} df", h["df"], len(estimates) - 1, EXACT)
    close(f"{tag} Cochran Q", h["q"], q, FITTED)
    # The p-value can be tiny (a real between-hospital difference): compare on the log scale.
    close(f"{tag} Cochran p (log10)", np.log10(h["p_value"]), np.log10(p_value), FITTED)

for f in result["funnel"]:
    level_rows = (frame[f["column"]] == f["level"]).to_numpy()
    tag = f"funnel {f['column']}={f['level']}/{f['model']}"
    close(f"{tag} observed", f["observed"], y_all[level_rows].sum(), EXACT)
    e = frame.loc[level_rows, f["model"]].astype(float).sum()
    close(f"{tag} expected", f["expected"], e, EXACT)
    close(f"{tag} 95% lower", f["limits_95"][0], funnel_limit(e, 0.025, False), EXACT)
    close(f"{tag} 95% upper", f["limits_95"][1], funnel_limit(e, 0.025, True), EXACT)
    close(f"{tag} 99.8% lower", f["limits_99_8"][0], funnel_limit(e, 0.001, False), EXACT)
    close(f"{tag} 99.8% upper", f["limits_99_8"][1], funnel_limit(e, 0.001, True), EXACT)

for failure in failures:
    print("FAIL", failure)
print(f"{checks - len(failures)} passed, {len(failures)} failed")
sys.exit(1 if failures else 0)
