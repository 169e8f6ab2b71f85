"""Reference values for random-effects pooling (core/metrics/random_effects_pool), written to
tests/data/random_effects/reference.json, which random_effects_pool_tests compares with.

    /usr/bin/python3 tests/reference/random_effects_reference.py          # write the JSON
    /usr/bin/python3 tests/reference/random_effects_reference.py --check  # recompute, compare

Sources, each value from a general-purpose library, none from Plumbline:
- statsmodels 0.13.5 statsmodels.stats.meta_analysis.combine_effects(y, v, method_re="chi2",
  use_t=True): "chi2" is DerSimonian-Laird. From it: tau2 (DL, untruncated: see statsmodels_dl), q, i2, mean_effect_re (the
  pooled mean with the DL tau2), sd_eff_w_re (its usual SE, 1/sqrt(sum w)) and the fourth
  interval of conf_int(alpha=0.05, use_t=True), ci_eff_re_wls: the mean +- t(k-1) * sqrt(var_hksj_re)
  with var_hksj_re = sum w (y - mean)^2 / ((k - 1) sum w), i.e. the Hartung-Knapp-Sidik-Jonkman
  interval with the DL tau2.
- scipy 1.10 optimize.minimize_scalar (bounded Brent) maximising the restricted log-likelihood
  -1/2 [sum log(v + t2) + log sum w + sum w (y - mu(t2))^2], w = 1/(v + t2), over t2 >= 0:
  the REML tau2; then the pooled mean, its SE and the HKSJ interval with that tau2 by the same
  formulas, and the 95 % prediction interval mu +- t(k-2) sqrt(tau2 + SE^2) (Riley, Higgins &
  Deeks 2011, BMJ 342:d549) with scipy.stats.t.ppf.
The data sets are invented: logit C of seven sites (clear heterogeneity), four nearly equal
estimates (tau2 truncated at 0), and three sites (the fewest with a prediction interval).
"""
import json
import math
import os
import sys

import numpy as np
from scipy import optimize, stats
from statsmodels.stats.meta_analysis import combine_effects

HERE = os.path.dirname(os.path.abspath(__file__))
OUT = os.path.join(HERE, "..", "data", "random_effects", "reference.json")

DATA = {
    "seven_sites": ([1.10, 0.85, 1.32, 0.95, 1.25, 0.70, 1.05], [0.010, 0.020, 0.015, 0.030, 0.012, 0.025, 0.018]),
    "homogeneous": ([0.10, 0.12, 0.09, 0.11], [0.04, 0.05, 0.03, 0.06]),
    "three_sites": ([-0.20, 0.15, 0.40], [0.02, 0.01, 0.03]),
}


def reml_tau2(y, v):
    def negative(t2):
        w = 1.0 / (v + t2)
        mu = np.sum(w * y) / np.sum(w)
        return 0.5 * (np.sum(np.log(v + t2)) + math.log(np.sum(w)) + np.sum(w * (y - mu) ** 2))
    upper = 10.0 * (np.var(y) + np.max(v))
    fit = optimize.minimize_scalar(negative, bounds=(0.0, upper), method="bounded", options={"xatol": 1e-14, "maxiter": 5000})
    # The bounded search never lands exactly on the bound; a maximum at 0 is 0.
    return 0.0 if negative(0.0) <= fit.fun else float(fit.x)


def with_tau2(y, v, t2):
    w = 1.0 / (v + t2)
    mu = float(np.sum(w * y) / np.sum(w))
    se = float(math.sqrt(1.0 / np.sum(w)))
    k = len(y)
    hksj_se = float(math.sqrt(np.sum(w * (y - mu) ** 2) / ((k - 1) * np.sum(w))))
    t = stats.t.ppf(0.975, k - 1)
    out = {"mean": mu, "se": se, "hksj_lower": mu - t * hksj_se, "hksj_upper": mu + t * hksj_se}
    tp = stats.t.ppf(0.975, k - 2)
    out["prediction_lower"] = mu - tp * math.sqrt(t2 + se * se)
    out["prediction_upper"] = mu + tp * math.sqrt(t2 + se * se)
    return out


def statsmodels_dl(dl, ci):
    """statsmodels 0.13.5 does not truncate the DL tau2 at 0 (its _fit_tau_mm returns the raw
    moment estimate), so the value is stored untruncated; below 0 the truncated tau2 is 0 and
    the pooled values are its fixed-effect ones (mean_effect_fe, sd_eff_w_fe, and ci_eff_fe_wls,
    the HKSJ interval with tau2 = 0)."""
    out = {"tau2_untruncated": float(dl.tau2), "q": float(dl.q), "i2": float(dl.i2)}
    if dl.tau2 >= 0:
        out.update(mean=float(dl.mean_effect_re), se=float(dl.sd_eff_w_re), hksj_lower=float(ci[3][0]), hksj_upper=float(ci[3][1]))
    else:
        out.update(mean=float(dl.mean_effect_fe), se=float(dl.sd_eff_w_fe), hksj_lower=float(ci[2][0]), hksj_upper=float(ci[2][1]))
    return out


def reference():
    out = {}
    for name, (y, v) in DATA.items():
        y, v = np.asarray(y), np.asarray(v)
        with np.errstate(invalid="ignore"):  # statsmodels takes the root of a negative tau2's variance
            dl = combine_effects(y, v, method_re="chi2", use_t=True)
            ci = dl.conf_int(alpha=0.05, use_t=True)
        t2 = reml_tau2(y, v)
        out[name] = {
            "y": list(y), "v": list(v),
            "statsmodels_dl": statsmodels_dl(dl, ci),
            "scipy_reml": dict(tau2=t2, **with_tau2(y, v, t2)),
        }
    return out


def main():
    values = reference()
    if "--check" in sys.argv:
        with open(OUT) as f:
            stored = json.load(f)
        bad = []
        for name, blocks in values.items():
            for block in ("statsmodels_dl", "scipy_reml"):
                for key, value in blocks[block].items():
                    if not math.isclose(value, stored[name][block][key], rel_tol=1e-9, abs_tol=1e-12):
                        bad.append(f"{name}.{block}.{key}: {value} now, {stored[name][block][key]} stored")
        if bad:
            print("\n".join(bad))
            sys.exit(1)
        print("random-effects reference values: unchanged")
        return
    with open(OUT, "w") as f:
        json.dump(values, f, indent=2)
        f.write("\n")


if __name__ == "__main__":
    main()
