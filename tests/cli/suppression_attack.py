#!/usr/bin/python3
"""Tries to recover every suppressed count of a report from what the report prints.

Reads the CSV tables of one report (--csv-dir) and the HTML (for the cohort line) and plays a
reader who wants the small cells back: it writes down every exact relation the printed numbers
give (columns that add up to the cohort, TP + FN = events, a reclassification row against the
threshold table, the NRI's estimate and Wald interval, an O/E interval's width, net benefit at a
printed threshold), then solves for each suppressed count with linear algebra (numpy), and tries
the direct inversions (a rate times its patients, expected over mean predicted, an interval's
width). Exit status 1 when any suppressed count comes back or when the report suppresses nothing.

The relations are the report's own definitions (docs/methods.md); the solver is numpy's SVD.
"""
import csv
import math
import re
import sys
from pathlib import Path

import numpy as np

folder, html_path, confidence = Path(sys.argv[1]), Path(sys.argv[2]), float(sys.argv[3]) if len(sys.argv) > 3 else 0.95
z = {0.95: 1.959963984540054, 0.9: 1.6448536269514722, 0.99: 2.5758293035489004}[confidence]  # normal quantiles (scipy.stats.norm.ppf)


def table(name):
    path = folder / f"{name}.csv"
    if not path.exists():
        return []
    with path.open(newline="", encoding="utf-8") as f:
        return list(csv.DictReader(f))


def hidden(text):
    return text.startswith("<") or text == "suppressed"


def exact(constant):
    """Counts add up to whole numbers: a relation with a whole constant is exact (net benefit's are rounded)."""
    return abs(constant - round(constant)) < 1e-9


def number(text):
    try:
        return float(text)
    except (TypeError, ValueError):
        return None


cohort = re.search(r"Cohort: (\d+) patients, (\d+) with the event", html_path.read_text(encoding="utf-8"))
N, E = int(cohort.group(1)), int(cohort.group(2))

unknowns = {}   # name -> column
known = {}      # name -> value
equations = []  # (coefficients {name: c}, constant): sum c*x = constant
recovered = []
suppressed_total = 0


def cell(name, text):
    """A printed count: known, or an unknown of the system."""
    global suppressed_total
    if hidden(text):
        if name not in unknowns:
            unknowns[name] = len(unknowns)
            suppressed_total += 1
        return name
    value = number(text)
    if value is None:
        return None
    known[name] = value
    return name


def relate(terms, constant=0.0):
    """sum(coefficient * cell) = constant; cells that are None make the relation unusable."""
    if any(name is None for name, _ in terms):
        return
    equations.append((terms, constant))


# Risk groups: each model's patients and events add up to the cohort; a rate times the patients,
# an interval or expected / mean predicted give the counts back.
groups_by_model = {}
for row in table("risk_groups"):
    m = row["Model"]
    n = cell(f"rg:{m}:{row['Group']}:n", row["Patients"])
    e = cell(f"rg:{m}:{row['Group']}:e", row["Events"])
    groups_by_model.setdefault(m, []).append((n, e))
    if hidden(row["Patients"]) and number(row["Expected"]) and number(row["Mean predicted"]):
        recovered.append(f"risk group {m}/{row['Group']} patients from expected / mean predicted")
    if hidden(row["Events"]) and number(row["Observed"]) and not hidden(row["Patients"]):
        recovered.append(f"risk group {m}/{row['Group']} events from the observed rate")
    if hidden(row["Events"]) and number(row.get("Interval lower")):
        recovered.append(f"risk group {m}/{row['Group']} events from the interval")
for m, rows in groups_by_model.items():
    relate([(n, 1.0) for n, _ in rows], N)
    relate([(e, 1.0) for _, e in rows], E)
for row in table("calibration_tests"):
    if row["Test"].startswith("Hosmer") and number(row["Statistic"]) is not None:
        if any(hidden(r["Events"]) or hidden(r["Patients"]) for r in table("risk_groups") if r["Model"] == row["Model"]):
            recovered.append(f"Hosmer-Lemeshow statistic of {row['Model']} printed beside suppressed risk groups")

# Threshold table: TP + FN = events, FP + TN = non-events; the proportions and net benefit give the counts.
threshold_cells = {}
for row in table("thresholds"):
    m, t = row["Model"], float(row["Threshold"])
    tp, fp, tn, fn = (cell(f"th:{m}:{t:.6f}:{k}", row[k]) for k in ("TP", "FP", "TN", "FN"))
    threshold_cells[(m, round(t, 6))] = (tp, fp)
    relate([(tp, 1.0), (fn, 1.0)], E)
    relate([(fp, 1.0), (tn, 1.0)], N - E)
    if any(hidden(row[k]) for k in ("TP", "FP", "TN", "FN")):
        for derived in ("Sensitivity", "Specificity", "PPV", "NPV", "Flagged", "Net benefit"):
            if number(row[derived]) is not None:
                recovered.append(f"threshold {m}/{t}: {derived} printed beside a suppressed count")
    nb = number(row["Net benefit"])
    if nb is not None:
        w = t / (1 - t)
        relate([(tp, 1.0), (fp, -w)], nb * N)
for row in table("net_benefit"):
    t = float(row["Threshold"])
    nb = number(row["Net benefit"])
    if nb is not None and (row["Model"], round(t, 6)) in threshold_cells:
        tp, fp = threshold_cells[(row["Model"], round(t, 6))]
        relate([(tp, 1.0), (fp, -t / (1 - t))], nb * N)

# Reclassification: a row (column) adds up to the patients model A (B) puts in that category, the
# difference of two flagged counts of the threshold table; the NRI and its Wald interval give the
# patients moved up and down.
comparisons = table("comparisons")
for path in sorted(folder.glob("reclassification*.csv")):
    rows = table(path.stem)
    if not rows:
        continue
    pair = [(r["Model A"], r["Model B"]) for r in comparisons][:1]
    model_a, model_b = pair[0] if pair else (None, None)
    categories = sorted({r["Category under A"] for r in rows}, key=lambda c: float(c.strip("[)").split(",")[0]))
    k = len(categories)
    cuts = [float(c.strip("[)").split(",")[0]) for c in categories[1:]]
    grid = {}
    for r in rows:
        side = "ev" if r["Outcome"] == "event" else "ne"
        i, j = categories.index(r["Category under A"]), categories.index(r["Category under B"])
        grid[(side, i, j)] = cell(f"{path.stem}:{side}:{i}:{j}", r["Patients"])
    for side, total, which in (("ev", E, 0), ("ne", N - E, 1)):
        for by_row, model in ((True, model_a), (False, model_b)):
            def flagged(q):
                key = (model, round(cuts[q], 6))
                return threshold_cells[key][which] if key in threshold_cells else None
            for i in range(k):
                terms = [(grid[(side, i, j)] if by_row else grid[(side, j, i)], 1.0) for j in range(k)]
                if i + 1 < k:
                    terms.append((flagged(i), 1.0))
                if i == 0:
                    relate(terms, total)
                elif flagged(i - 1) is not None:
                    relate(terms + [(flagged(i - 1), -1.0)], 0.0)
        part = {"ev": "NRI, events part", "ne": "NRI, non-events part"}[side]
        for c in comparisons:
            if c["Difference"] == part and number(c["Estimate"]) is not None and number(c.get("Estimate lower")) is not None:
                est, lo, hi = float(c["Estimate"]), float(c["Estimate lower"]), float(c["Estimate upper"])
                se = (hi - lo) / (2 * z)
                up_minus_down = est * total
                up_plus_down = (se * se + est * est / total) * total * total
                up, down = (up_plus_down + up_minus_down) / 2, (up_plus_down - up_minus_down) / 2
                upper = [(grid[(side, i, j)], 1.0) for i in range(k) for j in range(k) if j > i]
                lower = [(grid[(side, i, j)], 1.0) for i in range(k) for j in range(k) if j < i]
                relate(upper, round(up))
                relate(lower, round(down))

# Subgroups and periods: the same patients under every model; levels add up to the cohort; an O/E
# interval's width gives the events (log-normal: se = 1/sqrt(O)).
def events_from_interval(lo, hi):
    return (2 * z / math.log(hi / lo)) ** 2


levels = {}
for row in table("subgroups"):
    n = cell(f"sg:{row['Column']}:{row['Level']}:n", row["Patients"])
    e = cell(f"sg:{row['Column']}:{row['Level']}:e", row["Events"])
    levels.setdefault(row["Column"], {})[row["Level"]] = (n, e)
    if (hidden(row["Events"]) or hidden(row["Patients"])) and number(row.get("O/E interval lower")):
        recovered.append(f"subgroup {row['Column']}/{row['Level']}: O/E interval printed beside a suppressed count")
for column, by_level in levels.items():
    relate([(n, 1.0) for n, _ in by_level.values()], N)
    relate([(e, 1.0) for _, e in by_level.values()], E)
for row in table("funnel"):
    sg = [r for r in table("subgroups") if r["Column"] == row["Column"] and r["Level"] == row["Level"]]
    if sg and hidden(sg[0]["Events"]) and number(row["O/E"]) is not None and number(row["Expected events"]) is not None:
        recovered.append(f"funnel {row['Column']}/{row['Level']}: O/E x expected gives the events")
periods = {}
for row in table("periods"):
    n = cell(f"p:{row['Period']}:n", row["Patients"])
    e = cell(f"p:{row['Period']}:e", row["Events"])
    periods[row["Period"]] = (n, e)
    if hidden(row["Events"]) and number(row.get("O/E interval lower")):
        recovered.append(f"period {row['Period']}: O/E interval printed beside suppressed events")
if periods:
    relate([(n, 1.0) for n, _ in periods.values()], N)
    relate([(e, 1.0) for _, e in periods.values()], E)
    # Each reference row names its months ("first year (2024-01 to 2024-12)", "latest (…)").
    for row in table("first_year"):
        if number(row.get("O/E interval lower")) is None:
            continue
        span = re.search(r"\((\S+)(?: to (\S+))?\)", row.get("Months", ""))
        if not span:
            continue
        low, high = span.group(1), span.group(2) or span.group(1)
        months = [p for p in periods if low <= p <= high]
        relate([(periods[p][1], 1.0) for p in months],
               round(events_from_interval(float(row["O/E interval lower"]), float(row["O/E interval upper"]))))

# Solve: substitute the known counts, then a suppressed count is determined when no solution of
# the homogeneous system moves it (its row of the null-space basis is zero).
if unknowns:
    rows = []
    for terms, constant in equations:
        coefficients = np.zeros(len(unknowns))
        for name, c in terms:
            if name in unknowns:
                coefficients[unknowns[name]] += c
        if np.any(coefficients):
            rows.append(coefficients)
    if rows:
        a = np.array(rows)
        _, s, vt = np.linalg.svd(a)
        rank = int(np.sum(s > 1e-9 * max(1.0, s[0])))
        null = vt[rank:].T
        for name, j in unknowns.items():
            if null.shape[1] == 0 or np.max(np.abs(null[j])) < 1e-9:
                recovered.append(f"{name} solves from the printed totals")

    # Bounds: counts are never negative, so a reader can also solve for the smallest and largest
    # value each suppressed count could take (scipy's linprog over the exact relations); where
    # they meet, the count is known.
    from scipy.optimize import linprog
    exact_rows, exact_rhs = [], []
    for terms, constant in equations:
        if not exact(constant) or any(abs(c) != 1.0 for _, c in terms):
            continue
        coefficients, rhs = np.zeros(len(unknowns)), float(constant)
        for name, c in terms:
            if name in unknowns:
                coefficients[unknowns[name]] += c
            else:
                rhs -= c * known[name]
        if np.any(coefficients):
            exact_rows.append(coefficients)
            exact_rhs.append(rhs)
    if exact_rows:
        for name, j in unknowns.items():
            objective = np.zeros(len(unknowns))
            objective[j] = 1.0
            low = linprog(objective, A_eq=np.array(exact_rows), b_eq=np.array(exact_rhs), bounds=(0, None), method="highs")
            high = linprog(-objective, A_eq=np.array(exact_rows), b_eq=np.array(exact_rhs), bounds=(0, None), method="highs")
            if low.status == 0 and high.status == 0 and -high.fun - low.fun < 0.5:
                recovered.append(f"{name} is pinned by its bounds to {round(low.fun)}")

print(f"suppressed counts: {suppressed_total}; relations: {len(equations)}")
for r in recovered:
    print("RECOVERED:", r)
if suppressed_total == 0:
    print("FAIL: the report suppresses nothing, so the check proves nothing")
    sys.exit(1)
sys.exit(1 if recovered else 0)
