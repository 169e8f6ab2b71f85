"""Cross-check of model updating against statsmodels 0.13 (Debian, /usr/bin/python3).

On the sample cohort, `plumbline-cli update` fits recalibration in the large (GLM binomial with
logit(p) as offset) and logistic recalibration (Logit of y on logit(p)); statsmodels refits both
on the same rows. Tolerance 1e-6 for the fitted coefficients and the written risks.
"""
import csv
import json
import subprocess
import sys
import tempfile

import numpy as np
import pandas as pd
import statsmodels.api as sm

from reference_rows import is_missing, score_status

cli, samples = sys.argv[1], sys.argv[2]
failures, checks = [], 0


def close(label, got, want, tol):
    global checks
    checks += 1
    if not abs(got - want) <= tol * max(1.0, abs(want)):
        failures.append(f"{label}: plumbline {got} vs statsmodels {want}")


frame = pd.read_csv(f"{samples}/readmissions.csv", dtype=str, keep_default_na=False)
frame = frame[~frame["readmitted_30d"].map(is_missing) & frame["supplier_score"].map(score_status).isna()]
y = (frame["readmitted_30d"].str.strip().str.lower() == "yes").astype(int).to_numpy()
p = np.clip(frame["supplier_score"].astype(float).to_numpy(), 1e-12, 1 - 1e-12)
lp = np.log(p / (1 - p))
offset_fit = sm.GLM(y, np.ones((len(y), 1)), family=sm.families.Binomial(), offset=lp).fit(tol=1e-12)
logit_fit = sm.Logit(y, sm.add_constant(lp)).fit(disp=0, tol=1e-12)

with tempfile.TemporaryDirectory() as work:
    for method, want_a, want_b in [("intercept", offset_fit.params[0], 1.0),
                                   ("logistic", logit_fit.params[0], logit_fit.params[1])]:
        out, js = f"{work}/{method}.csv", f"{work}/{method}.json"
        subprocess.run([cli, "update", f"{samples}/readmissions.csv", "--outcome", "readmitted_30d", "--score",
                        "supplier_score", "--id", "encounter_id", "--method", method, "--bootstrap", "20",
                        "--out", out, "--json", js], check=True, capture_output=True)
        update = json.load(open(js))["updates"][0]
        close(f"{method} intercept", update["intercept"], want_a, 1e-6)
        close(f"{method} slope", update["slope"], want_b, 1e-6)
        rows = list(csv.DictReader(open(out)))
        close(f"{method} rows written", len(rows), len(y), 0)
        for row in rows[::997]:
            q = min(max(float(row["supplier_score"]), 1e-12), 1 - 1e-12)
            expected = 1 / (1 + np.exp(-(want_a + want_b * np.log(q / (1 - q)))))
            close(f"{method} updated risk of {row['encounter_id']}", float(row["supplier_score_updated"]), expected, 1e-6)

for failure in failures:
    print("FAIL", failure)
print(f"{checks - len(failures)} passed, {len(failures)} failed")
sys.exit(1 if failures else 0)
