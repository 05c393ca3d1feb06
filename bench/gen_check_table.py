#!/usr/bin/env python3
"""Generate a large property table for benchmarking `ebullio check`.

Seeded (random.Random(20261202)), so every run writes the same file. Rows are
invented Harrow Vale Fine Chemicals lot entries built on the published rows
of reference-data/antoine-published.csv (ln/kPa/degC Smith, Van Ness & Abbott
rows with a stated range) and the SMILES of
reference-data/normal-boiling-points-dev.csv; about 1 row in 50 carries a
planted slip so the slow path (diagnosis) is exercised too.

usage: gen_check_table.py ROWS OUT.csv [--smiles]
       gen_check_table.py ROWS OUT.parquet [--smiles]   (needs polars: bench/out/venv)
"""
import csv
import math
import random
import sys

def main():
    n = int(sys.argv[1])
    out = sys.argv[2]
    with_smiles = "--smiles" in sys.argv
    if out.endswith(".parquet"):
        # written as CSV, then converted by polars in a streaming pass (bounded memory)
        import os
        import polars as pl
        tmp = out + ".csv"
        write_csv(n, tmp, with_smiles)
        pl.scan_csv(tmp).sink_parquet(out)
        os.remove(tmp)
        return
    write_csv(n, out, with_smiles)


def write_csv(n, out, with_smiles):
    rng = random.Random(20261202)
    here = __file__.rsplit("/", 2)[0]
    base = []
    with open(f"{here}/reference-data/antoine-published.csv") as f:
        for r in csv.DictReader(f):
            if r["log_base"] == "e" and r["p_unit"] == "kPa" and r["t_min"]:
                base.append(r)
    smiles = {}
    with open(f"{here}/reference-data/normal-boiling-points-dev.csv") as f:
        for r in csv.DictReader(f):
            smiles[r["compound"]] = r["smiles"]
    with open(out, "w", newline="") as f:
        w = csv.writer(f)
        w.writerow(["compound", "smiles", "Tb/K", "A", "B", "C", "convention",
                    "Tmin/°C", "Tmax/°C", "lot", "supplier"])
        for i in range(n):
            r = rng.choice(base)
            a, b, c = float(r["A"]), float(r["B"]), float(r["C"])
            y0 = math.log(101.325)
            tb = b / (a - y0) - c + 273.15
            conv = "ln,kPa,degC"
            if rng.random() < 0.02:
                conv = "ln,mmHg,degC"  # planted pressure-unit slip
            listed = round(tb + rng.uniform(-0.3, 0.3), 2)
            s = smiles.get(r["compound"], "") if with_smiles else ""
            w.writerow([f"HV-{i:07d} {r['compound']}", s, listed, a, b, c, conv,
                        r["t_min"], r["t_max"], f"L{rng.randrange(10**6):06d}",
                        rng.choice(["Aldwick", "Brennock", "Calder", "Dunmore"])])

if __name__ == "__main__":
    main()
