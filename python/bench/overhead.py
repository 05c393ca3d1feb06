#!/usr/bin/env python3
"""Cost of the Python package against the CLI on the same 1,000,000 rows, and on Dask.

    python python/bench/overhead.py --ebullio target/release/ebullio [--rows 1000000] [--out DIR]

Run it with a release wheel installed (`pip install ./python`) and a release binary. It writes
seeded SMILES (bench/generate.py's fragment grammar, small molecules) as CSV and as a Parquet
data set, then times, on the same rows:
  cli       `ebullio estimate --input smiles.csv --format csv -o out.csv` (one process)
  python    pl.read_csv -> ebullio.estimate_frame -> write_csv (the same file to file job)
  frame     ebullio.estimate_frame alone on the DataFrame in memory (Arrow in, Arrow out)
  dask      dask.distributed LocalCluster (--workers processes x 1 thread) over the Parquet
            partitions, map_partitions(ebullio.estimate_frame), compared row for row
  per call  ebullio.estimate(["CCO"]) in a loop, against starting `ebullio estimate --smiles CCO`
Prints a Markdown table; wall times by time.perf_counter, CPU of child processes by resource.
"""

import argparse
import json
import os
import resource
import subprocess
import sys
import time
from pathlib import Path

import numpy as np
import polars as pl

import ebullio

ROOT = Path(__file__).resolve().parents[2]
sys.path.insert(0, str(ROOT / "bench"))
import generate  # noqa: E402  (the seeded grammar of bench/run)


def smiles_set(n: int, out: Path) -> Path:
    path = out / f"smiles-{n}.csv"
    if not path.exists():
        rng = np.random.default_rng(generate.SEED + 1)
        with open(path, "w") as f:
            f.write("smiles\n")
            for _ in range(n):
                f.write(generate.grammar_molecule(rng, 0, 4) + "\n")
    return path


def timed(fn):
    t0 = time.perf_counter()
    r = fn()
    return time.perf_counter() - t0, r


def child_cpu() -> float:
    ru = resource.getrusage(resource.RUSAGE_CHILDREN)
    return ru.ru_utime + ru.ru_stime


def main():
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--ebullio", required=True)
    ap.add_argument("--rows", type=int, default=1_000_000)
    ap.add_argument("--out", default=str(ROOT / "target" / "bench-python"))
    ap.add_argument("--workers", type=int, default=2)
    ap.add_argument("--partitions", type=int, default=8)
    ap.add_argument("--no-dask", action="store_true")
    a = ap.parse_args()
    out = Path(a.out)
    out.mkdir(parents=True, exist_ok=True)
    csv = smiles_set(a.rows, out)
    load = os.getloadavg()[0]
    res = {"rows": a.rows, "threads": ebullio.threads(), "load_1min_before": load}

    # CLI, file to file.
    cpu0 = child_cpu()
    t, _ = timed(lambda: subprocess.run([a.ebullio, "estimate", "--input", str(csv), "--format", "csv",
                                         "-o", str(out / "cli.csv")], check=True, capture_output=True))
    res["cli_s"], res["cli_cpu_s"] = t, child_cpu() - cpu0

    # Python, file to file, and the call alone.
    cpu0 = time.process_time()
    t_read, df = timed(lambda: pl.read_csv(csv))
    t_frame, got = timed(lambda: ebullio.estimate_frame(df))
    t_write, _ = timed(lambda: got.write_csv(out / "python.csv"))
    res.update(read_s=t_read, frame_s=t_frame, write_s=t_write, python_s=t_read + t_frame + t_write,
               python_cpu_s=time.process_time() - cpu0,
               python_peak_mib=resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024,
               input_mib=df.estimated_size() / 2**20, output_mib=got.estimated_size() / 2**20)

    # Same numbers as the CLI's CSV (which rounds: compare at its digits).
    cli = pl.read_csv(out / "cli.csv", infer_schema=False)
    assert cli.height == got.height
    same = (cli["tb_k"].fill_null("") == got["tb_k"].map_elements(
        lambda v: f"{v:.2f}", return_dtype=pl.String).fill_null("")).all()
    res["tb_k_equal_to_cli_csv"] = bool(same)

    # Per call.
    n_calls = 2000
    t, _ = timed(lambda: [ebullio.estimate(["CCO"]) for _ in range(n_calls)])
    res["call_us"] = 1e6 * t / n_calls
    t, _ = timed(lambda: [ebullio.estimate_frame(pl.DataFrame({"smiles": ["CCO"]})) for _ in range(n_calls)])
    res["frame_call_us"] = 1e6 * t / n_calls
    n_proc = 50
    t, _ = timed(lambda: [subprocess.run([a.ebullio, "estimate", "--smiles", "CCO", "--format", "json"],
                                         check=True, capture_output=True) for _ in range(n_proc)])
    res["cli_call_ms"] = 1e3 * t / n_proc

    if not a.no_dask:
        import dask.dataframe as dd
        from dask.distributed import Client, LocalCluster

        pq = out / f"smiles-{a.rows}-parquet"
        if not pq.exists():
            pq.mkdir()
            step = -(-df.height // a.partitions)
            for k in range(a.partitions):
                df.slice(k * step, step).write_parquet(pq / f"part-{k:03d}.parquet")
        with LocalCluster(n_workers=a.workers, threads_per_worker=1, processes=True,
                          dashboard_address=None) as cluster, Client(cluster):
            ddf = dd.read_parquet(str(pq))
            meta = ebullio.estimate_frame(ddf._meta)
            t, dres = timed(lambda: ddf.map_partitions(ebullio.estimate_frame, meta=meta).compute())
        res["dask_s"] = t
        res["dask_partitions"] = a.partitions
        res["dask_workers"] = a.workers
        dres = pl.from_pandas(dres.reset_index(drop=True))
        res["dask_equal"] = all(dres[c].to_list() == got[c].to_list() for c in got.columns)

    res["load_1min_after"] = os.getloadavg()[0]
    (out / "overhead.json").write_text(json.dumps(res, indent=1))
    m = a.rows / 1e6
    print(f"| {a.rows:,} SMILES | wall s | per million rows |")
    print("| --- | ---: | ---: |")
    for k, label in [("cli_s", "CLI `estimate --input` CSV to CSV"), ("python_s", "Python read_csv + estimate_frame + write_csv"),
                     ("frame_s", "estimate_frame alone (Arrow in and out)"), ("read_s", "  of which pl.read_csv"),
                     ("write_s", "  of which write_csv"), ("dask_s", f"Dask, {a.workers} worker processes, {a.partitions} partitions")]:
        if k in res:
            print(f"| {label} | {res[k]:.2f} | {res[k] / m:.2f} |")
    print(f"\nper call: ebullio.estimate(['CCO']) {res['call_us']:.0f} µs; estimate_frame of a 1-row frame "
          f"{res['frame_call_us']:.0f} µs; CLI process `estimate --smiles CCO` {res['cli_call_ms']:.1f} ms")
    print(f"CPU: CLI {res['cli_cpu_s']:.1f} s, Python {res['python_cpu_s']:.1f} s; threads {res['threads']}; "
          f"load {res['load_1min_before']:.1f} -> {res['load_1min_after']:.1f}")
    print(f"memory: peak RSS of the Python process {res['python_peak_mib']:.0f} MiB; input frame "
          f"{res['input_mib']:.0f} MiB, output frame {res['output_mib']:.0f} MiB")
    print(f"equal: Tb vs CLI CSV {res['tb_k_equal_to_cli_csv']}; Dask vs single process {res.get('dask_equal')}")


if __name__ == "__main__":
    main()
