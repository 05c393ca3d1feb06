#!/usr/bin/env python3
"""Fail if a committed notebook holds outputs; `--strip` removes them in place.

Notebooks are kept without outputs so diffs stay readable and no machine-specific paths or
figures land in the repository. Standard library only, so it runs before any venv exists.

    python3 notebooks/check_stripped.py          # check; exit 1 and name each offending cell
    python3 notebooks/check_stripped.py --strip  # clear outputs and execution counts
"""

import json
import os
import subprocess
import sys
import tempfile
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent


def notebooks():
    """Tracked .ipynb files (git), else every .ipynb under notebooks/."""
    try:
        out = subprocess.run(["git", "ls-files", "-z", "*.ipynb"], cwd=ROOT, capture_output=True,
                             check=True, text=True).stdout
        files = [ROOT / f for f in out.split("\0") if f]
    except (OSError, subprocess.CalledProcessError):
        files = []
    return sorted(set(files) | set((ROOT / "notebooks").glob("*.ipynb")))


def problems(nb):
    """(cell number, what) for every cell that carries outputs or an execution count."""
    found = []
    for i, cell in enumerate(nb.get("cells", []), start=1):
        if cell.get("cell_type") != "code":
            continue
        if cell.get("outputs"):
            found.append((i, f"{len(cell['outputs'])} output(s)"))
        if cell.get("execution_count") is not None:
            found.append((i, f"execution_count {cell['execution_count']}"))
    return found


def strip(nb):
    for cell in nb.get("cells", []):
        if cell.get("cell_type") == "code":
            cell["outputs"] = []
            cell["execution_count"] = None
        cell.get("metadata", {}).pop("execution", None)  # nbclient's timestamps


def write_atomic(path, nb):
    text = json.dumps(nb, indent=1, sort_keys=True, ensure_ascii=False) + "\n"
    fd, tmp = tempfile.mkstemp(dir=path.parent, prefix=f".{path.name}.")
    with os.fdopen(fd, "w", encoding="utf-8") as f:
        f.write(text)
    os.replace(tmp, path)


def main(argv):
    fix = "--strip" in argv
    files = notebooks()
    if not files:
        print("no notebooks found", file=sys.stderr)
        return 1
    bad = 0
    for path in files:
        rel = path.relative_to(ROOT)
        try:
            nb = json.loads(path.read_text(encoding="utf-8"))
        except (OSError, ValueError) as e:
            print(f"{rel}: cannot read as a notebook: {e}", file=sys.stderr)
            bad += 1
            continue
        found = problems(nb)
        if found and fix:
            strip(nb)
            write_atomic(path, nb)
            print(f"{rel}: stripped {len(found)} item(s)")
        elif found:
            bad += 1
            for cell, what in found:
                print(f"{rel}: cell {cell}: {what}", file=sys.stderr)
    if bad:
        print(f"{bad} notebook(s) hold outputs: run `python3 notebooks/check_stripped.py --strip`",
              file=sys.stderr)
        return 1
    print(f"{len(files)} notebook(s) stripped of outputs")
    return 0


if __name__ == "__main__":
    sys.exit(main(sys.argv[1:]))
