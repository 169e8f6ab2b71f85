#!/usr/bin/env python3
"""The layout check is honest: on a copy of the tree it passes, and each way of breaking the
layout, made in a fresh copy, fails it with the file, the line and the include named.

    check_layout_test.py ROOT
"""
import shutil
import subprocess
import sys
import tempfile
from pathlib import Path

ROOT = Path(sys.argv[1]) if len(sys.argv) > 1 else Path(__file__).resolve().parents[2]
CHECK = Path(__file__).resolve().parent / "check_layout.py"


def copy_of_tree(work: Path) -> Path:
    tree = work / "tree"
    for part in ("core", "ui", "tests/core", "tests/ui"):
        shutil.copytree(ROOT / part, tree / part)
    return tree


def insert_line(path: Path, number: int, text: str) -> None:
    lines = path.read_text(encoding="utf-8").split("\n")
    lines.insert(number - 1, text)
    path.write_text("\n".join(lines), encoding="utf-8")


def run_check(tree: Path) -> tuple[int, str]:
    done = subprocess.run([sys.executable, str(CHECK), str(tree)], capture_output=True, text=True)
    return done.returncode, done.stdout + done.stderr


# Breakages by a line inserted as line 2 of a file: what it breaks, the file, the line, and what
# the report must say.
INCLUDES = [
    ("a metric includes an analysis", "core/metrics/discrimination.cpp", '#include "analyses/validation.hpp"',
     "analyses comes after metrics"),
    ("an include without its folder", "core/intake/cohort_assembler.cpp", '#include "staged_rows.hpp"', "names no folder"),
    ("a later stage in angle brackets", "core/intake/csv_scanner.hpp", "#include <metrics/estimate.hpp>",
     "metrics comes after intake"),
    ("the core includes the ui", "core/files/result_json.cpp", '#include "run/analysis_snapshot.hpp"', "core includes ui/"),
    ("intake includes files", "core/intake/intake.cpp", '#include "files/atomic_file.hpp"', "files comes after intake"),
    ("a chart includes a panel", "ui/charts/roc_chart_view.cpp", '#include "panels/overview_panel.hpp"',
     "panels comes after charts"),
    ("a ui folder includes the window", "ui/report/report_charts.cpp", '#include "main_window.hpp"',
     "main_window comes after report"),
    ("an include of a file that is not there", "core/analyses/validation.cpp", '#include "metrics/validation.hpp"',
     "no such file"),
]
# Breakages by a new file: what it breaks, the file, and what the report must say.
NEW_FILES = [
    ("a source file at the top of core", "core/helpers.cpp", "lies outside the folders"),
    ("a ui file in an unknown folder", "ui/misc/tool_view.hpp", "lies outside the folders"),
    ("a test folder that mirrors nothing", "tests/core/statistics/x_tests.cpp", "mirrors no folder"),
]


def cases():
    """(what, breakage, the line the report must hold) for every case."""
    for what, path, line, problem in INCLUDES:
        yield what, lambda tree, path=path, line=line: insert_line(tree / path, 2, line), f"{path}:2: {line}: {problem}"
    for what, path, problem in NEW_FILES:
        def add(tree, path=path):
            (tree / path).parent.mkdir(parents=True, exist_ok=True)
            (tree / path).write_text('#include "intake/cohort.hpp"\n', encoding="utf-8")
        shown = path if not path.startswith("tests/") else path.rsplit("/", 1)[0] + "/"
        yield what, add, f"{shown}: {problem}"


def main() -> int:
    failures = 0
    with tempfile.TemporaryDirectory() as temporary:
        status, report = run_check(copy_of_tree(Path(temporary) / "clean"))
        if status != 0:
            print(f"FAIL: the unchanged copy does not pass (exit {status}):\n{report}")
            return 1
        all_cases = list(cases())
        for index, (what, breakage, expected) in enumerate(all_cases):
            tree = copy_of_tree(Path(temporary) / f"case{index}")
            breakage(tree)
            status, report = run_check(tree)
            if status != 1 or expected not in report:
                failures += 1
                print(f"FAIL: {what}: exit {status}, expected 1 and the line\n  {expected}\ngot:\n{report}")
            else:
                print(f"ok: {what}")
    print(f"{failures} failure(s) of {len(all_cases)} cases")
    return 1 if failures else 0


if __name__ == "__main__":
    sys.exit(main())
