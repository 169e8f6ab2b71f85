"""The monitoring finds the patterns built into the sample cohort (sample-data/README.md), run
through the built program: Linnet Hill's coding shift raises the supplier's predicted risk while
readmissions do not rise, so the coding-shift question is asked there and nowhere else; Saltmarsh's
deterioration (April to July 2025) is signalled by the worse CUSUM of both models, after it began
and not before. The first- and latest-year means are checked against a direct computation on the
CSV in this script (plain Python csv module; the means of the rows the program used)."""
import csv, json, subprocess, sys, tempfile, os

cli, sample = sys.argv[1], sys.argv[2]
cohort = os.path.join(sample, "readmissions.csv")
failures = []

def check(condition, message):
    if not condition:
        failures.append(message)

with tempfile.TemporaryDirectory() as work:
    out = os.path.join(work, "result.json")
    run = subprocess.run([cli, "validate", cohort, "--outcome", "readmitted_30d", "--score", "supplier_score",
                          "--score", "local_score", "--cluster", "hospital", "--period", "discharge_date",
                          "--json", out], capture_output=True, text=True)
    check(run.returncode == 0, f"validate exited {run.returncode}: {run.stderr}")
    monitoring = json.load(open(out))["monitoring"]

scopes = {(s["model"], s["site"]): s for s in monitoring["scopes"]}
check(len(scopes) == 2 * 6, f"expected 2 models x (overall + 5 sites) scopes, got {len(scopes)}")

# The coding shift: asked for the supplier score at Linnet Hill only.
flagged = sorted((m, s) for (m, s), scope in scopes.items() if scope["coding_shift"] and scope["coding_shift"]["flagged"])
check(flagged == [("supplier_score", "Linnet Hill Memorial")], f"coding-shift question asked for {flagged}")
shift = scopes[("supplier_score", "Linnet Hill Memorial")]["coding_shift"]
check("coding or documentation" in shift["question"] and shift["question"].endswith("?"), "the flag is worded as a question")

# Direct computation: mean supplier risk and readmission rate at Linnet Hill, 2024 and 2025, over
# complete rows (both scores numbers in [0, 1], outcome yes/no), as the program's audit keeps them.
def risk(text):
    try:
        value = float(text)
    except ValueError:
        return None
    return value if 0.0 <= value <= 1.0 else None

sums = {}
with open(cohort, newline="") as f:
    for row in csv.DictReader(f):
        supplier, local = risk(row["supplier_score"]), risk(row["local_score"])
        if supplier is None or local is None or row["readmitted_30d"] not in ("yes", "no"):
            continue
        if row["hospital"] != "Linnet Hill Memorial":
            continue
        year = row["discharge_date"][:4]
        n, p, y = sums.get(year, (0, 0.0, 0))
        sums[year] = (n + 1, p + supplier, y + (row["readmitted_30d"] == "yes"))
for label, year in (("first_year", "2024"), ("latest_year", "2025")):
    n, p, y = sums[year]
    check(shift[label]["n"] == n, f"{label}: n {shift[label]['n']} against {n} counted")
    check(abs(shift[label]["mean_predicted"] - p / n) < 1e-12, f"{label}: mean predicted {shift[label]['mean_predicted']} against {p / n}")
    check(abs(shift[label]["observed_rate"] - y / n) < 1e-12, f"{label}: observed {shift[label]['observed_rate']} against {y / n}")
check(sums["2025"][1] / sums["2025"][0] > sums["2024"][1] / sums["2024"][0], "predicted risk rose at Linnet Hill")
check(sums["2025"][2] / sums["2025"][0] <= sums["2024"][2] / sums["2024"][0], "observed rate did not rise at Linnet Hill")

# The deterioration: Saltmarsh's worse CUSUM signals after 2025-04-01 (and within the window's
# first months) for both models, never before.
for model in ("supplier_score", "local_score"):
    worse = next(c for c in scopes[(model, "Saltmarsh District")]["cusum"] if c["chart"] == "worse")
    dates = [s["date"] for s in worse["signals"]]
    check(dates and all(d >= "2025-04-01" for d in dates), f"{model} at Saltmarsh: worse signals on {dates}")
    check(dates and dates[0] <= "2025-07-31", f"{model} at Saltmarsh: first worse signal {dates[:1]} within the deterioration")
    check(all(s["site"] == "Saltmarsh District" for s in worse["signals"]), "signals name their site")

if failures:
    print("\n".join("FAIL: " + f for f in failures))
    sys.exit(1)
print("ok: coding shift asked at Linnet Hill only; Saltmarsh's deterioration signalled after it began")
