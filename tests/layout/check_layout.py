#!/usr/bin/env python3
"""The layout rule of core/ and ui/ (DEVELOPERS.md, Layout), checked on the source text.

    check_layout.py [ROOT]      ROOT: the source tree (default: two folders up from here)

Fails, naming file, line and include, when
  - a file under core/ or ui/ lies outside the folders (core/<stage>/, ui/<folder>/; only
    CMakeLists.txt and ui's main_window files sit at the top);
  - an include of the project does not name its folder ("metrics/discrimination.hpp"), or names
    a file that is not there;
  - a core stage includes a later stage, core includes ui, or a ui folder includes a later one;
  - tests/core or tests/ui holds a folder that mirrors none of core/ or ui/ (or support/).
The compiler sees none of these: a header in the same folder is found without its folder name,
and one target compiles every stage. Standard library only (no numpy on some python3s).
"""
import re
import sys
from pathlib import Path

# The order data travel in; a stage includes only itself and earlier stages.
CORE_STAGES = ["intake", "metrics", "resampling", "analyses", "reporting", "files"]
# The ui's folders, most basic first; the window at the top of ui/ may include them all.
UI_FOLDERS = ["run", "widgets", "charts", "models", "panels", "dialogs", "report"]
UI_TOP = "main_window"
UI_TOP_FILE = re.compile(r"main_window\w*\.(hpp|cpp)")
# Files that Qt's tools generate in the build folder, included by their bare name.
GENERATED = re.compile(r".*\.moc|moc_\w+\.cpp|ui_\w+\.h")
INCLUDE = re.compile(r'^\s*#\s*include\s*(?:"([^"]+)"|<([^>]+)>)')
SOURCE = re.compile(r".*\.(hpp|cpp|h|hpp\.in)")


def order(root: str) -> list[str]:
    return CORE_STAGES if root == "core" else UI_FOLDERS + [UI_TOP]


def place(relative: Path) -> str | None:
    """The folder (stage) of a file under core/ or ui/; None when it lies outside them."""
    root, *rest = relative.parts
    if len(rest) == 1 and root == "ui" and UI_TOP_FILE.fullmatch(rest[0]):
        return UI_TOP
    if len(rest) == 2 and rest[0] in order(root) and rest[0] != UI_TOP:
        return rest[0]
    return None


def target(tree: Path, name: str) -> tuple[str, str] | None:
    """(root, folder) of the file an include names; None when it names no file of core/ or ui/."""
    parts = name.split("/")
    if len(parts) == 1:
        return ("ui", UI_TOP) if UI_TOP_FILE.fullmatch(name) and (tree / "ui" / name).is_file() else None
    for root in ("core", "ui"):
        if len(parts) == 2 and parts[0] in order(root) and parts[0] != UI_TOP:
            # A configured header (files/version.hpp) is in the tree as its template.
            there = (tree / root / name).is_file() or (tree / root / (name + ".in")).is_file()
            return (root, parts[0]) if there else None
    return None


def include_problem(tree: Path, root: str, folder: str, name: str) -> str | None:
    found = target(tree, name)
    if found is None:
        if name.split("/")[0] in CORE_STAGES + UI_FOLDERS:
            return "no such file in core/ or ui/"
        return 'names no folder: write it from core/ or ui/, as in "metrics/discrimination.hpp"'
    to_root, to_folder = found
    if root == "core" and to_root == "ui":
        return "core includes ui/: the core knows nothing of the window"
    if root != to_root:
        return None  # ui may include every stage of the core
    stages = order(root)
    if stages.index(to_folder) > stages.index(folder):
        allowed = ", ".join(stages[: stages.index(folder) + 1])
        return f"{to_folder} comes after {folder} ({folder} may include {allowed})"
    return None


def check_sources(tree: Path) -> list[str]:
    problems = []
    for root in ("core", "ui"):
        for path in sorted(p for p in (tree / root).rglob("*") if p.is_file()):
            relative = path.relative_to(tree)
            if relative.parts[1:] == ("CMakeLists.txt",):
                continue
            folder = place(relative)
            if folder is None:
                within = ", ".join(f"{root}/{f}/" for f in order(root) if f != UI_TOP)
                problems.append(f"{relative}: lies outside the folders ({within})")
                continue
            if not SOURCE.fullmatch(path.name):
                continue
            for number, line in enumerate(path.read_text(encoding="utf-8", errors="replace").splitlines(), 1):
                match = INCLUDE.match(line)
                if not match:
                    continue
                quoted, angled = match.groups()
                name = quoted or angled
                if GENERATED.fullmatch(name.split("/")[-1]):
                    continue
                # <...> is a library's header, unless it names one of our folders.
                if angled and name.split("/")[0] not in CORE_STAGES + UI_FOLDERS:
                    continue
                problem = include_problem(tree, root, folder, name)
                if problem:
                    spelled = f'"{name}"' if quoted else f"<{name}>"
                    problems.append(f"{relative}:{number}: #include {spelled}: {problem}")
    return problems


def check_test_folders(tree: Path) -> list[str]:
    """tests/core and tests/ui hold one folder per folder of core/ and ui/ (and support/)."""
    problems = []
    for root in ("core", "ui"):
        tests = tree / "tests" / root
        if not tests.is_dir():
            continue
        mirrors = [f for f in order(root) if f != UI_TOP] + ["support"]
        for path in sorted(tests.iterdir()):
            relative = path.relative_to(tree)
            if path.is_dir() and path.name not in mirrors:
                problems.append(f"{relative}/: mirrors no folder of {root}/ ({', '.join(mirrors)})")
            # The window's own tests sit at the top of tests/ui, as main_window does in ui/.
            elif path.is_file() and root == "core":
                problems.append(f"{relative}: lies outside the folders of tests/core ({', '.join(mirrors)})")
    return problems


def main() -> int:
    tree = Path(sys.argv[1]) if len(sys.argv) > 1 else Path(__file__).resolve().parents[2]
    if not (tree / "core").is_dir() or not (tree / "ui").is_dir():
        print(f"{tree}: no core/ and ui/ here", file=sys.stderr)
        return 2
    problems = check_sources(tree) + check_test_folders(tree)
    for problem in problems:
        print(problem)
    if problems:
        print(f"layout: {len(problems)} problem(s); see DEVELOPERS.md, Layout")
        return 1
    print(f"layout: every file in its folder; core {' < '.join(CORE_STAGES)}; ui {' < '.join(order('ui'))}")
    return 0


if __name__ == "__main__":
    sys.exit(main())
