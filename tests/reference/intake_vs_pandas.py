"""Cross-check of the intake against pandas (Debian python3-pandas 1.5, under /usr/bin/python3).

pandas.read_csv parses the bundled sample files independently of our reader; the documented
intake rules (missing tokens, numbers, the probability range, complete cases, the join) are
applied here in plain Python, and every count must equal what plumbline-cli wrote to its JSON.
Tolerance: exact (counts).
"""
import sys

import pandas as pd

from reference_rows import is_missing, run_cli as run_full, score_status

cli, samples = sys.argv[1], sys.argv[2]


def run_cli(args):
    return run_full(cli, args + ["--bootstrap", "0"])["cohort"]


def expected_single(frame, scores):
    counts, used, events = {}, 0, 0
    for _, row in frame.iterrows():
        if is_missing(row["readmitted_30d"]):
            key = ("missing outcome", "readmitted_30d")
        else:
            key = None
            for column in scores:
                status = score_status(row[column])
                if status:
                    key = (status, column)
                    break
        if key:
            counts[key] = counts.get(key, 0) + 1
        else:
            used += 1
            events += row["readmitted_30d"].strip().lower() == "yes"
    return counts, used, events


def tallies(cohort):
    return {(e["reason"], e["column"]): e["rows"] for e in cohort["exclusions"]}


failures = 0


def check(label, got, want):
    global failures
    if got != want:
        failures += 1
        print(f"FAIL {label}: plumbline {got} vs pandas {want}")
    else:
        print(f"ok {label}: {got}")


# One file, two scores.
frame = pd.read_csv(f"{samples}/readmissions.csv", dtype=str, keep_default_na=False)
scores = ["supplier_score", "local_score"]
want_counts, want_used, want_events = expected_single(frame, scores)
cohort = run_cli([f"{samples}/readmissions.csv", "--outcome", "readmitted_30d", "--score", scores[0], "--score", scores[1]])
check("rows read", cohort["rows_read"], len(frame))
check("rows used", cohort["rows_used"], want_used)
check("events", cohort["events"], int(want_events))
check("exclusions by reason and column", tallies(cohort), want_counts)

# Two files joined on the id: pandas merge on the trimmed id, duplicates dropped whole.
score_frame = pd.read_csv(f"{samples}/readmission-scores.csv", dtype=str, keep_default_na=False,
                          on_bad_lines="skip", engine="python")
outcome_frame = pd.read_csv(f"{samples}/readmission-outcomes.csv", dtype=str, keep_default_na=False,
                            on_bad_lines="skip", engine="python")
# Rows too short are padded by pandas (with None) rather than skipped: drop them as we do.
score_frame = score_frame[score_frame["discharge_date"].notna()]
score_frame["encounter_id"] = score_frame["encounter_id"].str.strip()
outcome_frame["encounter_id"] = outcome_frame["encounter_id"].str.strip()
score_unique = score_frame[~score_frame["encounter_id"].duplicated(keep=False)]
outcome_unique = outcome_frame[~outcome_frame["encounter_id"].duplicated(keep=False)]
merged = score_unique.merge(outcome_unique, on="encounter_id", how="inner")
_, joined_used, joined_events = expected_single(merged, ["supplier_score"])
joined = run_cli([f"{samples}/readmission-scores.csv", "--outcomes", f"{samples}/readmission-outcomes.csv",
                  "--id", "encounter_id", "--outcome", "readmitted_30d", "--score", "supplier_score"])
check("join matched", joined["join"]["matched"], len(merged))
check("join rows used", joined["rows_used"], joined_used)
check("join events", joined["events"], int(joined_events))
check("scores without outcome", joined["join"]["scores_without_outcome"],
      int((~score_unique["encounter_id"].isin(outcome_frame["encounter_id"])).sum()))

print(f"{failures} failure(s)")
sys.exit(1 if failures else 0)
