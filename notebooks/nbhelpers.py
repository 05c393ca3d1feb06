"""Small helpers shared by the ebullio notebooks: find the binary, run it, keep outputs out of the repo."""

import os
import subprocess
import tempfile
from pathlib import Path

import polars as pl


def repo_root() -> Path:
    """The ebullio checkout: the first parent of the working directory holding Cargo.toml and reference-data/."""
    here = Path.cwd().resolve()
    for d in [here, *here.parents]:
        if (d / "Cargo.toml").is_file() and (d / "reference-data").is_dir():
            return d
    raise RuntimeError(f"no ebullio checkout above {here}: start Jupyter inside the repository")


def ebullio_path() -> Path:
    """$EBULLIO if set (relative paths taken from the repo root), else target/release, else target/debug."""
    root = repo_root()
    env = os.environ.get("EBULLIO")
    if env:
        p = Path(env)
        if not p.is_absolute() and not p.exists():
            p = root / p
        if not p.is_file():
            raise RuntimeError(f"EBULLIO={env} is not a file")
        return p.resolve()
    for p in (root / "target/release/ebullio", root / "target/debug/ebullio"):
        if p.is_file():
            return p
    raise RuntimeError("no ebullio binary: run `cargo build` (or set EBULLIO=/path/to/ebullio)")


def out_dir() -> Path:
    """A fresh temporary folder for everything a notebook writes (never the repository)."""
    return Path(tempfile.mkdtemp(prefix="ebullio-notebook-"))


def run(*args, ok_codes=(0,)) -> subprocess.CompletedProcess:
    """Run `ebullio ARGS...`; raise with its stderr if the exit code is not in ok_codes."""
    cmd = [str(ebullio_path()), *map(str, args)]
    proc = subprocess.run(cmd, capture_output=True, text=True)
    if proc.returncode not in ok_codes:
        raise RuntimeError(f"{' '.join(cmd)} exited {proc.returncode}:\n{proc.stderr}")
    return proc


def without_comments(src: Path, dest_dir: Path) -> Path:
    """Copy a CSV without its leading '#' comment lines, for readers that take a plain header.

    Line numbers in messages then count from the copy's header, not the original file's.
    """
    lines = Path(src).read_text(encoding="utf-8").splitlines(keepends=True)
    dest = Path(dest_dir) / Path(src).name
    dest.write_text("".join(l for l in lines if not l.startswith("#")), encoding="utf-8")
    return dest


def read_demo_csv(path: Path) -> pl.DataFrame:
    """Read one of the demo CSVs, skipping its '#' comment lines."""
    return pl.read_csv(path, comment_prefix="#")
