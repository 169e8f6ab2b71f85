"""Live cross-check of pooling across sites (--cluster) against scikit-learn, statsmodels and scipy.

Reference: Debian 12's scikit-learn 1.2, statsmodels 0.13.5, scipy 1.10 and pandas 1.5 under
/usr/bin/python3. plumbline-cli validates the bundled sample cohort with --cluster hospital; this
script recomputes from the same rows, hospital by hospital (however many the sample holds):
- each site's C (scikit-learn roc_auc_score), ln O/E with SE sqrt(1/O - 1/N) (docs/methods.md §8)
  and the calibration slope with its Wald SE (statsmodels Logit on logit(p));
- per measure, on the pooled scale (logit C with the program's DeLong SE moved by the delta
  method, which no general library computes; ln O/E; slope): tau2, Q and I2 by DerSimonian-Laird
  from statsmodels combine_effects(method_re="chi2") (truncated at 0: statsmodels 0.13.5 does not),
  and tau2 by REML from scipy minimize_scalar on the restricted log-likelihood (docs/methods.md
  §25), then the pooled value and its HKSJ and prediction intervals with that tau2.
Tolerances: 1e-9 for counts and C, 1e-6 for fitted values and what depends on them.
"""
import math
import sys

import numpy as np
import pandas as pd
import scipy.stats as st
import statsmodels.api as sm
from sklearn.metrics import roc_auc_score
from statsmodels.stats.meta_analysis import combine_effects

from random_effects_reference import reml_tau2
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


path = f"{samples}/readmissions.csv"
scores = ["supplier_score", "local_score"]
result = run_cli(cli, [path, "--outcome", "readmitted_30d", "--score", scores[0], "--score", scores[1],
                       "--cluster", "hospital", "--bootstrap", "0"])
frame = pd.read_csv(path, dtype=str, keep_default_na=False)
keep = ~frame["readmitted_30d"].map(is_missing)
for s in scores:
    keep &= frame[s].map(score_status).isna()
frame = frame[keep]
y_all = frame["readmitted_30d"].str.strip().str.lower().isin(["yes", "1", "true", "y"]).astype(int).to_numpy()
block = result["site_pooling"]
hospitals = sorted(h for h in frame["hospital"].unique() if h != "")
close("sites", block["sites"], len(hospitals), EXACT)

for model in block["models"]:
    name = model["model"]
    for measure in model["measures"]:
        tag = f"{name}/{measure['measure']}"
        ys, vs = [], []
        for site in measure["sites"]:
            rows = (frame["hospital"] == site["site"]).to_numpy()
            y = y_all[rows]
            p = frame.loc[rows, name].astype(float).to_numpy()
            close(f"{tag}/{site['site']} n", site["n"], len(y), EXACT)
            close(f"{tag}/{site['site']} events", site["events"], y.sum(), EXACT)
            if measure["measure"] == "c_statistic":
                c = roc_auc_score(y, p)
                close(f"{tag}/{site['site']} C", site["estimate"], c, EXACT)
                ys.append(math.log(c / (1 - c)))
                vs.append(site["se"] ** 2)  # the program's DeLong SE on the logit scale
            elif measure["measure"] == "oe_ratio":
                o, e, n = y.sum(), p.sum(), len(y)
                close(f"{tag}/{site['site']} O/E", site["estimate"], o / e, EXACT)
                close(f"{tag}/{site['site']} SE", site["se"], math.sqrt(1 / o - 1 / n), EXACT)
                ys.append(math.log(o / e))
                vs.append(1 / o - 1 / n)
            else:
                fit = sm.Logit(y, sm.add_constant(np.log(p / (1 - p)))).fit(disp=0, tol=1e-12)
                close(f"{tag}/{site['site']} slope", site["estimate"], fit.params[1], FITTED)
                close(f"{tag}/{site['site']} slope SE", site["se"], fit.bse[1], FITTED)
                ys.append(fit.params[1])
                vs.append(fit.bse[1] ** 2)
        y, v = np.array(ys), np.array(vs)
        with np.errstate(invalid="ignore"):
            dl = combine_effects(y, v, method_re="chi2", use_t=True)
        close(f"{tag} tau2 DL", measure["tau2_dl"], max(0.0, float(dl.tau2)), FITTED)
        close(f"{tag} Q", measure["q"], float(dl.q), FITTED)
        close(f"{tag} I2", measure["i2"], max(0.0, float(dl.i2)), FITTED)
        t2 = reml_tau2(y, v)
        close(f"{tag} tau2 REML", measure["tau2_reml"], t2, FITTED)
        w = 1 / (v + t2)
        mu = float(np.sum(w * y) / np.sum(w))
        se = math.sqrt(1 / np.sum(w))
        k = len(y)
        back = {"c_statistic": lambda x: 1 / (1 + math.exp(-x)), "oe_ratio": math.exp, "calibration_slope": lambda x: x}[measure["measure"]]
        close(f"{tag} pooled", measure["pooled"], back(mu), FITTED)
        hk = math.sqrt(np.sum(w * (y - mu) ** 2) / ((k - 1) * np.sum(w)))
        t = st.t.ppf(0.975, k - 1)
        # plain HKSJ is "hksj_interval_unmodified"; the reported one scales by max(1, q) (methods §25)
        close(f"{tag} HKSJ lower", measure["hksj_interval_unmodified"][0], back(mu - t * hk), FITTED)
        close(f"{tag} HKSJ upper", measure["hksj_interval_unmodified"][1], back(mu + t * hk), FITTED)
        hm = max(hk, se)
        close(f"{tag} HKSJ max(1, q) lower", measure["hksj_interval"][0], back(mu - t * hm), FITTED)
        close(f"{tag} HKSJ max(1, q) upper", measure["hksj_interval"][1], back(mu + t * hm), FITTED)
        tp = st.t.ppf(0.975, k - 2)
        close(f"{tag} prediction lower", measure["prediction_interval"][0], back(mu - tp * math.sqrt(t2 + se * se)), FITTED)
        close(f"{tag} prediction upper", measure["prediction_interval"][1], back(mu + tp * math.sqrt(t2 + se * se)), FITTED)

for failure in failures:
    print("FAIL", failure)
print(f"{checks - len(failures)} passed, {len(failures)} failed")
sys.exit(1 if failures else 0)
