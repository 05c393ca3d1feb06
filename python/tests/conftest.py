"""Shared fixtures: the repository, the CLI binary to compare with, and data without comment lines."""

import json
import os
import subprocess
from pathlib import Path

import polars as pl
import pytest

ROOT = Path(__file__).resolve().parents[2]
DEMO = ROOT / "reference-data" / "demo"


def ebullio_bin() -> Path:
    """$EBULLIO, else target/debug/ebullio (CI builds it before the Python tests)."""
    env = os.environ.get("EBULLIO")
    p = Path(env) if env else ROOT / "target" / "debug" / "ebullio"
    if not p.is_file():
        if os.environ.get("EBULLIO_REQUIRED"):
            pytest.fail(f"no ebullio binary at {p} (CI sets EBULLIO_REQUIRED: the comparisons must run)")
        pytest.skip(f"no ebullio binary at {p}: run `cargo build` or set EBULLIO")
    return p


def cli(*args, ok=(0,)) -> str:
    """stdout of `ebullio ARGS`; fails the test on an unexpected exit code."""
    proc = subprocess.run([str(ebullio_bin()), *map(str, args)], capture_output=True, text=True)
    assert proc.returncode in ok, f"ebullio {' '.join(map(str, args))}: exit {proc.returncode}\n{proc.stderr}"
    return proc.stdout


def cli_json(*args):
    """The CLI's JSON output, parsed."""
    return json.loads(cli(*args, "--format", "json"))


def uncommented(src: Path, tmp_path: Path) -> Path:
    """A copy of a demo CSV without its '#' provenance lines (so line numbers agree)."""
    dest = tmp_path / src.name
    dest.write_text("".join(l for l in src.read_text(encoding="utf-8").splitlines(keepends=True)
                            if not l.startswith("#")), encoding="utf-8")
    return dest


def no_nan(df: pl.DataFrame) -> None:
    """No NaN or infinity in any float column."""
    for name, dtype in df.schema.items():
        if dtype.is_float():
            col = df[name].drop_nulls()
            assert col.is_finite().all(), f"column {name} holds NaN or infinity"
