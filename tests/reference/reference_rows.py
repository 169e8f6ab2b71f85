"""The intake's documented row rules, written independently in Python for the cross-checks.

Used by the reference tests to find the rows Plumbline should use, from pandas' own parse of the
file (Debian python3-pandas 1.5 under /usr/bin/python3)."""
import json
import subprocess
import tempfile

MISSING = {"", "na", "n/a", "null", ".", "nan"}


def is_missing(value):
    return value is None or value.strip().lower() in MISSING


def score_status(value):
    """None when the value is a usable probability, else the exclusion reason."""
    if is_missing(value):
        return "missing score"
    try:
        x = float(value.strip())
    except ValueError:
        return "score is not a number"
    if x != x or x in (float("inf"), float("-inf")):
        return "score is not finite"
    return "score outside the scale's range" if not 0.0 <= x <= 1.0 else None


def run_cli(cli, args):
    """Runs plumbline-cli validate with --json and returns the parsed result."""
    with tempfile.NamedTemporaryFile(suffix=".json") as out:
        subprocess.run([cli, "validate", *args, "--json", out.name], check=True, capture_output=True)
        with open(out.name) as handle:
            return json.load(handle)
