"""Measures the truths stated in sample-data/README.md on readmissions.csv, with general-purpose
tools only (Debian 12's pandas 1.5, scikit-learn 1.2, statsmodels 0.13.5, numpy; run it with
/usr/bin/python3 sample-data/measure_truths.py [sample-data/readmissions.csv]).

Definitions (docs/methods.md): O/E = observed events / sum of predicted risks; calibration slope
= the coefficient of logit(p) in a logistic regression of the outcome on it (statsmodels Logit);
C = the area under the ROC curve (scikit-learn roc_auc_score). Rows used: the complete cases of
the two scores (numbers within [0, 1]) and the outcome, as the intake's documented rules give.

The CUSUM is the risk-adjusted Bernoulli CUSUM of Steiner, Cook, Farewell & Treasure (2000):
W_t = max(0, W_{t-1} + w_t), w_t = y_t log(R) - log(1 - p_t + R p_t), R = 2 (odds doubled), in
discharge order (file order within a day). Its limit h is set here by simulation: outcomes drawn
from the model's own risks (resampled from the hospital's), h the smallest on a 0.05 grid whose
mean run length is at least five years of the hospital's discharges. Written in this script,
independently of the workbench's own CUSUM.
"""
import sys

import numpy as np
import pandas as pd
import statsmodels.api as sm
from sklearn.metrics import roc_auc_score

path = sys.argv[1] if len(sys.argv) > 1 else "sample-data/readmissions.csv"
raw = pd.read_csv(path, dtype=str, keep_default_na=False)
frame = raw.copy()
for column in ("supplier_score", "local_score"):
    frame[column] = pd.to_numeric(frame[column], errors="coerce")
frame = frame[frame["supplier_score"].between(0, 1) & frame["local_score"].between(0, 1)
              & frame["readmitted_30d"].isin(["yes", "no"])].copy()
frame["y"] = (frame["readmitted_30d"] == "yes").astype(int)
frame["date"] = pd.to_datetime(frame["discharge_date"])
frame["month"] = frame["date"].dt.strftime("%Y-%m")
models = {"supplier": "supplier_score", "local": "local_score"}


def oe(part, column):
    return part["y"].sum() / part[column].sum()


def slope(part, column):
    p = part[column].clip(1e-9, 1 - 1e-9)
    x = sm.add_constant(np.log(p / (1 - p)))
    return sm.Logit(part["y"], x).fit(disp=0).params.iloc[1]


def c_statistic(part, column):
    return roc_auc_score(part["y"], part[column])


def offset_odds_ratio(part, column):
    """exp(intercept) of a logistic regression with logit(p) as offset: observed odds / predicted."""
    p = part[column].clip(1e-9, 1 - 1e-9)
    fit = sm.GLM(part["y"], np.ones((len(part), 1)), family=sm.families.Binomial(),
                 offset=np.log(p / (1 - p))).fit()
    low, high = fit.conf_int()[0].iloc[0], fit.conf_int()[1].iloc[0]
    return np.exp(fit.params.iloc[0]), np.exp(low), np.exp(high)


print(f"rows read {len(raw):,}; rows used {len(frame):,}; events {frame['y'].sum():,}")
print(f"event rate {frame['y'].mean():.4f}; mean supplier risk {frame['supplier_score'].mean():.4f}; "
      f"mean local risk {frame['local_score'].mean():.4f}")
for name, column in models.items():
    print(f"{name}: O/E {oe(frame, column):.3f}, slope {slope(frame, column):.3f}, C {c_statistic(frame, column):.3f}")

print("\nby hospital: n, events, then per model C, O/E, slope")
for hospital, part in frame.groupby("hospital"):
    cells = "; ".join(f"{name} C {c_statistic(part, c):.3f} O/E {oe(part, c):.3f} slope {slope(part, c):.3f}"
                      for name, c in models.items())
    print(f"  {hospital}: n {len(part):,}, events {part['y'].sum():,}; {cells}")

print("\nby payer: local O/E, supplier O/E")
for payer, part in frame.groupby("payer"):
    print(f"  {payer}: n {len(part):,}; local {oe(part, 'local_score'):.3f}; supplier {oe(part, 'supplier_score'):.3f}")

print("\nby year: O/E and C per model")
for year, part in frame.groupby(frame["date"].dt.year):
    print(f"  {year}: " + "; ".join(f"{name} O/E {oe(part, c):.3f} C {c_statistic(part, c):.3f}"
                                    for name, c in models.items()))

print("\nLinnet Hill Memorial by month: mean supplier risk, mean local risk, observed rate")
linnet = frame[frame["hospital"] == "Linnet Hill Memorial"]
for month, part in linnet.groupby("month"):
    print(f"  {month}: n {len(part)}, supplier {part['supplier_score'].mean():.3f}, "
          f"local {part['local_score'].mean():.3f}, observed {part['y'].mean():.3f}")
halves = {"2024": linnet[linnet["date"].dt.year == 2024],
          "2025-01..06": linnet[(linnet["month"] >= "2025-01") & (linnet["month"] <= "2025-06")],
          "2025-07..12": linnet[linnet["month"] >= "2025-07"]}
for label, part in halves.items():
    print(f"  {label}: n {len(part)}, mean supplier {part['supplier_score'].mean():.4f}, "
          f"mean local {part['local_score'].mean():.4f}, observed {part['y'].mean():.4f}")
others = frame[frame["hospital"] != "Linnet Hill Memorial"]
for label, part in {"others 2024": others[others["date"].dt.year == 2024],
                    "others 2025-01..06": others[(others["month"] >= "2025-01") & (others["month"] <= "2025-06")],
                    "others 2025-07..12": others[others["month"] <= "2025-06"],
                    "others 2025-07..12": others[others["month"] >= "2025-07"]}.items():
    print(f"  {label}: mean supplier {part['supplier_score'].mean():.4f}, observed {part['y'].mean():.4f}")

print("\nthe whole network by quarter: mean supplier risk, observed rate")
for quarter, part in frame.groupby(frame["date"].dt.to_period("Q")):
    print(f"  {quarter}: mean supplier {part['supplier_score'].mean():.4f}, observed {part['y'].mean():.4f}")

print("\nSaltmarsh District: observed odds / predicted odds (offset logistic, 95% CI) by window")
salt = frame[frame["hospital"] == "Saltmarsh District"].sort_index()
windows = {"2024-01..2025-03": salt[salt["month"] <= "2025-03"],
           "2025-04..2025-07": salt[(salt["month"] >= "2025-04") & (salt["month"] <= "2025-07")],
           "2025-08..2025-12": salt[salt["month"] >= "2025-08"]}
for label, part in windows.items():
    cells = "; ".join("{} OR {:.2f} ({:.2f}-{:.2f}) O/E {:.2f}".format(name, *offset_odds_ratio(part, c), oe(part, c))
                      for name, c in models.items())
    print(f"  {label}: n {len(part)}, observed {part['y'].mean():.3f}; {cells}")


def cusum_weights(y, p, ratio=2.0):
    return y * np.log(ratio) - np.log(1 - p + ratio * p)


def limit_for_run_length(risks, target, seed=20240101, paths=2000):
    """Smallest h on a 0.05 grid whose simulated in-control mean run length reaches target.

    Each simulated chart runs until it first passes the largest h of the grid (or 6 x target
    discharges); its first passage of any smaller h is when its running maximum first passes it.
    """
    rng = np.random.default_rng(seed)
    grid = np.arange(2.0, 6.5001, 0.05)
    cap = int(6 * target)
    run = np.full((paths, grid.size), cap, dtype=float)
    passed = np.zeros(paths, dtype=int)  # grid values already passed by each chart
    chart = np.zeros(paths)
    for t in range(cap):
        p = rng.choice(risks, size=paths)
        y = rng.random(paths) < p
        chart = np.maximum(0.0, chart + cusum_weights(y, p))
        now = np.searchsorted(grid, chart, side="left")  # grid values below the chart
        for k in np.nonzero(now > passed)[0]:
            run[k, passed[k]:now[k]] = t + 1
            passed[k] = now[k]
        if (passed == grid.size).all():
            break
    arl = run.mean(axis=0)
    k = int(np.argmax(arl >= target))
    return grid[k], arl[k]


years = (salt["date"].max() - salt["date"].min()).days / 365.25
target = 5 * len(salt) / years
print(f"\nSaltmarsh CUSUM (OR 2), in-control ARL target {target:,.0f} discharges (5 years of its volume)")
for name, column in models.items():
    h, arl = limit_for_run_length(salt[column].to_numpy(), target)
    chart, signals = 0.0, []
    for (_, row), w in zip(salt.iterrows(), cusum_weights(salt["y"].to_numpy(), salt[column].to_numpy())):
        chart = max(0.0, chart + w)
        if chart > h:
            signals.append(row["discharge_date"])
            chart = 0.0  # the chart restarts after a signal
    print(f"  {name}: h {h:.2f} (simulated ARL {arl:,.0f}); signals {signals}")
