#!/usr/bin/env python3
"""Mutation score of the tests: apply each mutation of tests/mutants/mutations.txt to a scratch
copy of the source, rebuild incrementally and run the tests until one fails.

Usage (normally through ./plumbline.sh mutants):
    run_mutants.py [--only ID[,ID...]] [--skip REGEX] [--check] [--list FILE] [--work DIR]

--check validates the list against the source (every snippet found exactly once) and stops.
--skip leaves out the ctest entries whose name matches REGEX (say, one that fails on the
unmutated source for a reason being fixed elsewhere); the result file names what was skipped.

The scratch copy (WORK/src) holds the files git lists in the work tree (tracked, and untracked
but not ignored), so uncommitted tests count; it is built once in WORK/build (Release, Ninja,
as ./plumbline.sh configures build/) and then only what a test needs is rebuilt. Each mutant
runs, fast first, and stops at the first failing test:
  1. core_tests without [coverage], [timing] and [slow] (Catch2, stops at the first failure);
  2. every other ctest entry, fastest first, except the golden-file comparison (the program's
     own earlier output is no independent check), packaging, and the [timing] latency check;
  3. only for a mutant still alive: core_tests [slow], then [coverage] (bootstrap coverage).
Before the mutants, every test must pass on the unmutated copy (the baseline), else nothing is
scored. A mutant that does not compile is "build failed", neither killed nor survived; one
whose test runs past its time limit is killed by the timeout.

Needs only the Python standard library (the python3 first on PATH is fine).
"""

from __future__ import annotations

import argparse
import dataclasses
import json
import os
import re
import shutil
import signal
import subprocess
import sys
import time
from pathlib import Path

REPO = Path(__file__).resolve().parents[2]
EXCLUDED_TESTS = [
    re.compile(r"golden files"),      # compares with the program's own earlier output
    re.compile(r"^packaging:"),       # builds a Debian package: no statistic in it
]
CORE_FAST_SPEC = "~[coverage]~[timing]~[slow]"
CORE_SLOW_SPECS = ["[slow]", "[coverage]"]  # about 15 s and 75 s on two idle cores


@dataclasses.dataclass
class Mutation:
    ident: str
    description: str
    file: str
    find: str
    repl: str
    line: int  # line of the [ID] header in the list


@dataclasses.dataclass
class Outcome:
    status: str  # killed, survived, build failed
    by: str = ""
    seconds: float = 0.0


def say(text: str) -> None:
    print(text, flush=True)


def decode(value: str) -> str:
    out, i = [], 0
    while i < len(value):
        if value[i] == "\\" and i + 1 < len(value) and value[i + 1] in "n\\":
            out.append("\n" if value[i + 1] == "n" else "\\")
            i += 2
        else:
            out.append(value[i])
            i += 1
    return "".join(out)


def read_list(path: Path) -> list[Mutation]:
    mutations: list[Mutation] = []
    problems: list[str] = []
    current: dict | None = None

    def close() -> None:
        if current is None:
            return
        missing = [k for k in ("file", "find", "repl") if k not in current]
        if missing:
            problems.append(f"{path.name}:{current['line']}: [{current['ident']}] lacks {', '.join(missing)}")
            return
        mutations.append(Mutation(current["ident"], current["description"], current["file"],
                                  decode(current["find"]), decode(current["repl"]), current["line"]))

    for number, raw in enumerate(path.read_text(encoding="utf-8").splitlines(), 1):
        line = raw.rstrip()
        if not line or line.startswith("#"):
            continue
        header = re.match(r"^\[([A-Za-z0-9_.-]+)\]\s+(.+)$", line)
        if header:
            close()
            current = {"ident": header.group(1), "description": header.group(2), "line": number}
            continue
        field = re.match(r"^(file|find|repl): (.*)$", line)
        if not field or current is None:
            problems.append(f"{path.name}:{number}: not a [ID] line nor file:/find:/repl: of one: {line!r}")
            continue
        if field.group(1) in current:
            problems.append(f"{path.name}:{number}: [{current['ident']}] has two '{field.group(1)}:' lines")
        current[field.group(1)] = field.group(2)
    close()
    seen: set[str] = set()
    for m in mutations:
        if m.ident in seen:
            problems.append(f"{path.name}:{m.line}: the id {m.ident} is used twice")
        seen.add(m.ident)
        if m.find == m.repl:
            problems.append(f"{path.name}:{m.line}: [{m.ident}] find and repl are the same")
    if problems:
        raise SystemExit("mutation list is broken:\n  " + "\n  ".join(problems))
    return mutations


def check_against(mutations: list[Mutation], source: Path, list_name: str) -> None:
    problems = []
    for m in mutations:
        target = source / m.file
        if not target.is_file():
            problems.append(f"{list_name}:{m.line}: [{m.ident}] {m.file} does not exist")
            continue
        count = target.read_bytes().decode("utf-8").count(m.find)
        if count != 1:
            problems.append(f"{list_name}:{m.line}: [{m.ident}] the snippet occurs {count} times in {m.file} "
                            f"(must be exactly once): {m.find!r}")
    if problems:
        raise SystemExit("mutation list does not match the source:\n  " + "\n  ".join(problems))


def project_files(repo: Path) -> list[str]:
    try:
        out = subprocess.run(["git", "-C", str(repo), "ls-files", "-co", "--exclude-standard", "-z"],
                             check=True, capture_output=True).stdout
        return sorted(p for p in out.decode().split("\0") if p and (repo / p).is_file())
    except (OSError, subprocess.CalledProcessError):
        files = []
        for path in repo.rglob("*"):
            rel = path.relative_to(repo).as_posix()
            if path.is_file() and not re.match(r"^(build[^/]*|\.git|plumbline-output)/", rel):
                files.append(rel)
        return sorted(files)


def write_if_different(path: Path, data: bytes) -> bool:
    """Writes only changed bytes, so an unchanged file keeps its time stamp and is not rebuilt;
    a written file gets a new time stamp, so ninja rebuilds it."""
    if path.is_file() and path.read_bytes() == data:
        return False
    path.parent.mkdir(parents=True, exist_ok=True)
    path.write_bytes(data)
    return True


def sync_source(repo: Path, source: Path) -> int:
    files = project_files(repo)
    changed = 0
    for rel in files:
        changed += write_if_different(source / rel, (repo / rel).read_bytes())
    keep = set(files)
    if source.is_dir():
        for path in sorted(source.rglob("*"), reverse=True):
            rel = path.relative_to(source).as_posix()
            if path.is_file() and rel not in keep:
                path.unlink()
                changed += 1
            elif path.is_dir() and not any(path.iterdir()):
                path.rmdir()
    return changed


def run_logged(command: list[str], log: Path, timeout: float | None = None, cwd: Path | None = None,
               env: dict | None = None) -> tuple[int | None, str, float]:
    """Runs in its own process group; returns (exit status or None on timeout, output, seconds)."""
    started = time.monotonic()
    with open(log, "ab") as sink:
        sink.write(("\n$ " + " ".join(command) + "\n").encode())
        sink.flush()
        process = subprocess.Popen(command, stdout=subprocess.PIPE, stderr=subprocess.STDOUT, cwd=cwd, env=env,
                                   start_new_session=True)
        try:
            output, _ = process.communicate(timeout=timeout)
            status: int | None = process.returncode
        except subprocess.TimeoutExpired:
            os.killpg(process.pid, signal.SIGKILL)
            output, _ = process.communicate()
            status = None
        sink.write(output)
    return status, output.decode(errors="replace"), time.monotonic() - started


@dataclasses.dataclass
class Test:
    name: str
    command: list[str]
    cwd: Path | None
    env: dict
    targets: list[str]
    seconds: float = 0.0
    kind: str = "other"  # core-fast, core-slow, other


class Harness:
    def __init__(self, work: Path, jobs: int, skip: re.Pattern | None):
        self.skip = skip
        self.work = work
        self.source = work / "src"
        self.build = work / "build"
        self.logs = work / "logs"
        self.jobs = jobs
        self.tests: list[Test] = []

    def configure(self) -> None:
        if not (self.build / "CMakeCache.txt").is_file():
            say("configuring the scratch build (Release, Ninja)")
            status, output, _ = run_logged(["cmake", "-S", str(self.source), "-B", str(self.build), "-G", "Ninja",
                                            "-DCMAKE_BUILD_TYPE=Release"], self.logs / "baseline.log")
            if status != 0:
                raise SystemExit("cmake failed on the unmutated copy; see " + str(self.logs / "baseline.log"))

    def ninja(self, targets: list[str], log: Path) -> bool:
        status, _, _ = run_logged(["cmake", "--build", str(self.build), "--parallel", str(self.jobs), "--target",
                                   *targets], log)
        return status == 0

    def discover(self) -> None:
        status, output, _ = run_logged(["ctest", "--test-dir", str(self.build), "--show-only=json-v1"],
                                       self.logs / "baseline.log")
        if status != 0:
            raise SystemExit("ctest could not list the tests")
        built = str(self.build) + os.sep
        core = str(self.build / "tests" / "core_tests")
        self.tests = [Test("core_tests " + CORE_FAST_SPEC, [core, CORE_FAST_SPEC], self.build / "tests", {},
                           ["core_tests"], kind="core-fast")]
        for entry in json.loads(output)["tests"]:
            name, command = entry["name"], entry.get("command", [])
            if not command or any(p.search(name) for p in EXCLUDED_TESTS):
                continue
            if self.skip and self.skip.search(name):
                say(f"skipped as asked (--skip): {name}")
                continue
            if Path(command[0]).name == "core_tests":
                continue  # the Catch2 cases run as one process above; [slow] and [coverage] below
            props = {p["name"]: p["value"] for p in entry.get("properties", [])}
            env = dict(e.split("=", 1) for e in props.get("ENVIRONMENT", []))
            # Executables the test runs from the build tree (core_tests, plumbline-cli, ui_tests ...)
            # are named after their targets.
            targets = sorted({Path(arg).name for arg in command if arg.startswith(built)})
            cwd = Path(props["WORKING_DIRECTORY"]) if "WORKING_DIRECTORY" in props else self.build
            self.tests.append(Test(name, command, cwd, env, targets))
        for spec in CORE_SLOW_SPECS:
            self.tests.append(Test("core_tests " + spec, [core, spec], self.build / "tests", {}, ["core_tests"],
                                   kind="core-slow"))

    def all_targets(self) -> list[str]:
        return sorted({t for test in self.tests for t in test.targets})

    def run_test(self, test: Test, log: Path, timeout: float | None) -> tuple[bool, str]:
        """(passed, what failed) for one test."""
        env = dict(os.environ, **test.env)
        command = list(test.command)
        if test.kind.startswith("core"):
            command += ["--abort", "--reporter", "xml", "--durations", "no"]
        status, output, seconds = run_logged(command, log, timeout, test.cwd, env)
        if status == 0:
            return True, ""
        if status is None:
            return False, f"timeout after {seconds:.0f} s: {test.name}"
        if not test.kind.startswith("core"):
            return False, test.name
        # The first Catch2 case that failed (or the one running when the process died).
        failed, crashed = None, False
        for case in re.finditer(r'<TestCase name="([^"]*)"(.*?)(?:</TestCase>|\Z)', output, re.S):
            if 'success="false"' in case.group(2) or "</TestCase>" not in case.group(0):
                failed = case.group(1)
                crashed = "</TestCase>" not in case.group(0)
                break
        if failed is None:
            return False, f"core_tests (exit {status})"
        name = failed.replace("&quot;", '"').replace("&amp;", "&").replace("&lt;", "<").replace("&gt;", ">")
        return False, f"core: {name}" + (" (crashed)" if crashed or status < 0 else "")

    def baseline(self) -> None:
        log = self.logs / "baseline.log"
        say("building the unmutated copy (targets the tests need)")
        # core_tests first: ctest lists its Catch2 cases only once it is built.
        if not self.ninja(["core_tests"], log):
            raise SystemExit("the unmutated copy does not build; see " + str(log))
        self.discover()
        if not self.ninja(self.all_targets(), log):
            raise SystemExit("the unmutated copy does not build; see " + str(log))
        say(f"baseline: {len(self.tests)} test runs on the unmutated copy")
        for test in self.tests:
            started = time.monotonic()
            passed, what = self.run_test(test, log, None)
            test.seconds = time.monotonic() - started
            say(f"  {'pass' if passed else 'FAIL'} {test.seconds:6.1f} s  {test.name}")
            if not passed:
                raise SystemExit(f"the unmutated copy fails {what}: fix the tests first (log: {log})")
        middle = [t for t in self.tests if t.kind == "other"]
        middle.sort(key=lambda t: t.seconds)
        self.tests = [t for t in self.tests if t.kind == "core-fast"] + middle + [t for t in self.tests if t.kind == "core-slow"]

    def timeout(self, test: Test) -> float:
        return max(120.0, 5.0 * test.seconds)

    def mutant(self, m: Mutation) -> Outcome:
        log = self.logs / f"{m.ident}.log"
        log.write_text(f"{m.ident}: {m.description}\n{m.file}\n- {m.find}\n+ {m.repl}\n")
        target = self.source / m.file
        original = target.read_bytes().decode("utf-8")  # bytes as they are: no newline translation
        if original.count(m.find) != 1:
            raise SystemExit(f"[{m.ident}] the snippet is not found exactly once in {m.file}")
        started = time.monotonic()
        target.write_bytes(original.replace(m.find, m.repl).encode("utf-8"))
        try:
            built: set[str] = set()
            for test in self.tests:
                wanted = [t for t in test.targets if t not in built]
                if wanted:
                    if not self.ninja(wanted, log):
                        return Outcome("build failed", "", time.monotonic() - started)
                    built.update(wanted)
                passed, what = self.run_test(test, log, self.timeout(test))
                if not passed:
                    return Outcome("killed", what, time.monotonic() - started)
            return Outcome("survived", "", time.monotonic() - started)
        finally:
            target.write_bytes(original.encode("utf-8"))


def table(mutations: list[Mutation], outcomes: dict[str, Outcome]) -> str:
    width = max(len(m.ident) for m in mutations)
    rows = [f"{'id':<{width}}  {'result':<12}  {'s':>4}  killed by / description"]
    for m in mutations:
        o = outcomes.get(m.ident)
        if o is None:
            continue
        rows.append(f"{m.ident:<{width}}  {o.status:<12}  {o.seconds:4.0f}  {o.by or '-'}")
        rows.append(f"{'':<{width}}  {'':<12}  {'':>4}  ({m.file}: {m.description})")
    return "\n".join(rows)


def summary(outcomes: dict[str, Outcome]) -> str:
    killed = sum(o.status == "killed" for o in outcomes.values())
    survived = sum(o.status == "survived" for o in outcomes.values())
    failed = sum(o.status == "build failed" for o in outcomes.values())
    score = 100.0 * killed / (killed + survived) if killed + survived else 0.0
    return (f"killed {killed}, survived {survived}, build failed {failed} (not counted); "
            f"score killed / (killed + survived) = {killed}/{killed + survived} = {score:.1f} %")


def main() -> int:
    parser = argparse.ArgumentParser(description=__doc__, formatter_class=argparse.RawDescriptionHelpFormatter)
    parser.add_argument("--list", type=Path, default=REPO / "tests" / "mutants" / "mutations.txt")
    parser.add_argument("--work", type=Path, default=REPO / "build-mutants")
    parser.add_argument("--only", default="", help="comma-separated ids to run (default: all)")
    parser.add_argument("--skip", default="", help="regular expression: ctest entries to leave out")
    parser.add_argument("--check", action="store_true", help="only check the list against the source")
    parser.add_argument("--jobs", type=int, default=os.cpu_count() or 2)
    args = parser.parse_args()

    mutations = read_list(args.list)
    if args.only:
        wanted = [w.strip() for w in args.only.split(",") if w.strip()]
        unknown = [w for w in wanted if w not in {m.ident for m in mutations}]
        if unknown:
            raise SystemExit("unknown mutation ids: " + ", ".join(unknown))
        mutations = [m for m in mutations if m.ident in wanted]
    if args.check:
        check_against(mutations, REPO, args.list.name)
        say(f"{len(mutations)} mutations, every snippet found exactly once")
        return 0

    started = time.monotonic()
    harness = Harness(args.work.resolve(), args.jobs, re.compile(args.skip) if args.skip else None)
    harness.logs.mkdir(parents=True, exist_ok=True)
    for old in harness.logs.glob("*.log"):
        old.unlink()
    changed = sync_source(REPO, harness.source)
    say(f"scratch copy {harness.source}: {changed} files written")
    check_against(mutations, harness.source, args.list.name)
    harness.configure()
    harness.baseline()

    # Mutants of one file run one after another (fewer recompilations); reported in list order.
    order = sorted(range(len(mutations)), key=lambda i: (mutations[i].file, i))
    outcomes: dict[str, Outcome] = {}
    for done, i in enumerate(order, 1):
        m = mutations[i]
        outcome = harness.mutant(m)
        outcomes[m.ident] = outcome
        say(f"[{done}/{len(mutations)}] {m.ident}: {outcome.status}{' by ' + outcome.by if outcome.by else ''} "
            f"({outcome.seconds:.0f} s)")
    # The copy is back to the unmutated source; rebuilding it now keeps the next run's start short.
    harness.ninja(harness.all_targets(), harness.logs / "baseline.log")

    minutes = (time.monotonic() - started) / 60.0
    commit = subprocess.run(["git", "-C", str(REPO), "describe", "--always", "--dirty"], capture_output=True,
                            text=True).stdout.strip() or "unknown"
    report = "\n".join([
        f"Mutation run of {commit}, {time.strftime('%Y-%m-%d %H:%M')}, {len(mutations)} mutations from {args.list.name}",
        "Tests: core_tests (fast cases), then the other ctest entries fastest first, then core_tests [slow] and "
        "[coverage]; not run: the golden-file comparison, packaging, the [timing] latency check, fuzzing, sanitizers"
        + (f", and (--skip) every ctest entry matching {args.skip!r}." if args.skip else "."),
        "",
        table(mutations, outcomes),
        "",
        summary(outcomes),
        f"wall time {minutes:.1f} min; logs in {harness.logs}",
    ])
    say("\n" + report)
    result = harness.work / "mutants-result.txt"
    result.write_text(report + "\n", encoding="utf-8")
    say(f"written to {result}")
    return 0


if __name__ == "__main__":
    sys.exit(main())
