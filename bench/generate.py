#!/usr/bin/env python3
"""Seeded generator for the side-by-side benchmark inputs (bench/run calls it).

Writes into OUT (default bench/out/data):
  fit.csv            compound,T/K,p/kPa   -- 10,000 x scale compounds, 8-15 points each,
                                             0.5 % multiplicative noise on p, 2 % of the
                                             sets carry one gross outlier (p x 1.25 or x 0.75)
  fit_truth.csv      compound,tb_true_k   -- the normal boiling point of the generating curve
  smiles_small.csv   smiles               -- small organic molecules assembled from a seeded
                                             grammar of Joback-covered fragments
  smiles_drug.csv    smiles               -- drug-like SMILES: a seeded sample of the MOSES
                                             set shipped in the MIT-licensed `molsets` wheel
                                             when it is installed; otherwise larger molecules
                                             from the same grammar (the source is printed and
                                             written to smiles_drug.source)
  smiles_real.csv    smiles               -- real drug-like molecules: a seeded sample (with
                                             replacement) of the ChEMBL/ZINC SMILES files shipped
                                             inside the RDKit wheel (source in smiles_real.source)
  table.csv          compound,smiles,Tb/K,A,B,C,convention -- 1,000,000 x scale rows,
                                             some with planted slips (see make_table)
  table_nosmiles.csv the same rows without the smiles column

Every random draw comes from numpy.random.default_rng(SEED); the same scale gives
byte-identical files. The curves are invented (Trouton-like enthalpies, Antoine C near
-45 K); they are benchmark inputs, not property data.
"""

import argparse
import csv
import math
import os
import sys

import numpy as np

SEED = 20261202
P_ATM = 101_325.0
R = 8.314462618


def antoine_from_tb(tb, c_k, svap):
    """ln(p/Pa) = A - B/(T/K + C): constants whose curve passes 1 atm at tb with dS = svap."""
    b = svap * tb * (tb + c_k) ** 2 / (R * tb**2)
    a = math.log(P_ATM) + b / (tb + c_k)
    return a, b


def make_fit(rng, n_sets, out):
    truth = []
    with open(os.path.join(out, "fit.csv"), "w", newline="") as f:
        w = csv.writer(f, lineterminator="\n")
        w.writerow(["compound", "T/K", "p/kPa"])
        for i in range(n_sets):
            name = f"HV-{i:06d}"
            tb = rng.uniform(300.0, 520.0)
            c_k = rng.uniform(-60.0, -30.0)
            svap = rng.uniform(80.0, 105.0)
            a, b = antoine_from_tb(tb, c_k, svap)
            # temperatures where p runs from about 2 kPa to 150 kPa
            t_lo = b / (a - math.log(2_000.0)) - c_k
            t_hi = b / (a - math.log(150_000.0)) - c_k
            n = int(rng.integers(8, 16))
            ts = np.sort(rng.uniform(t_lo, t_hi, n))
            ps = np.exp(a - b / (ts + c_k)) * (1.0 + 0.005 * rng.standard_normal(n))
            if rng.random() < 0.02:
                k = int(rng.integers(0, n))
                ps[k] *= 1.25 if rng.random() < 0.5 else 0.75
            for t, p in zip(ts, ps):
                w.writerow([name, f"{t:.3f}", f"{p / 1000.0:.5g}"])
            truth.append((name, tb))
    with open(os.path.join(out, "fit_truth.csv"), "w", newline="") as f:
        w = csv.writer(f, lineterminator="\n")
        w.writerow(["compound", "tb_true_k"])
        for name, tb in truth:
            w.writerow([name, f"{tb:.4f}"])


# Fragment grammar: (smiles, starts_with_heteroatom, ends_with_heteroatom).
# Inner units have one bond in and one out; terminal units one bond in.
INNER = [
    ("C", False, False),
    ("C", False, False),
    ("CC", False, False),
    ("C(C)", False, False),
    ("C(C)(C)", False, False),
    ("C(Cl)", False, False),
    ("C(F)(F)", False, False),
    ("C=C", False, False),
    ("C(=O)", False, False),
    ("C(=O)O", False, True),
    ("O", True, True),
    ("N", True, True),
    ("N(C)", True, True),
    ("S", True, True),
    ("c1ccc(cc1)", False, False),
    ("c1cc(C)c(cc1)", False, False),
    ("C1CCC(CC1)", False, False),
    ("c1ccc(nc1)", False, False),
]
TERMINAL = [
    ("C", False, False),
    ("C", False, False),
    ("CC", False, False),
    ("O", True, True),
    ("N", True, True),
    ("Cl", True, True),
    ("Br", True, True),
    ("F", True, True),
    ("C#N", False, False),
    ("C=O", False, False),
    ("C(=O)O", False, True),
    ("C(=O)C", False, False),
    ("c1ccccc1", False, False),
    ("C1CCCCC1", False, False),
    ("S", True, True),
    ("I", True, True),
]
# A first unit must leave its last atom a free valence (no halogen, nitrile or aldehyde).
FIRST = [u for u in TERMINAL if u[0] not in ("Cl", "Br", "F", "I", "C#N", "C=O")]


def grammar_molecule(rng, n_inner_lo, n_inner_hi):
    """One molecule: a first unit, 0..n inner units, a terminal unit; no two heteroatoms bonded."""
    while True:
        first = FIRST[int(rng.integers(0, len(FIRST)))]
        parts = [first[0]]
        last_hetero = first[2]
        ok = True
        for _ in range(int(rng.integers(n_inner_lo, n_inner_hi + 1))):
            for _try in range(8):
                u = INNER[int(rng.integers(0, len(INNER)))]
                if not (last_hetero and u[1]):
                    break
            else:
                ok = False
                break
            parts.append(u[0])
            last_hetero = u[2]
        if not ok:
            continue
        for _try in range(8):
            u = TERMINAL[int(rng.integers(0, len(TERMINAL)))]
            if not (last_hetero and u[1]):
                break
        else:
            continue
        parts.append(u[0])
        # a heteroatom first unit written as "O..." is a valid hydroxy/amino end
        return "".join(parts)


def make_smiles_small(rng, n, out):
    with open(os.path.join(out, "smiles_small.csv"), "w", newline="") as f:
        f.write("smiles\n")
        for _ in range(n):
            f.write(grammar_molecule(rng, 0, 4) + "\n")


def molsets_smiles():
    """The MOSES SMILES shipped in the molsets wheel, or None when it is not installed."""
    try:
        import importlib.util

        spec = importlib.util.find_spec("moses")
    except Exception:
        return None
    if spec is None or not spec.submodule_search_locations:
        return None
    base = list(spec.submodule_search_locations)[0]
    for root, _dirs, files in os.walk(base):
        for name in sorted(files):
            if name.endswith(".csv.gz") or name.endswith(".csv"):
                if "train" in name or "test" in name or "dataset" in name:
                    return os.path.join(root, name)
    return None


# Drug-like SMILES files shipped inside the RDKit wheel (BSD-licensed package; the molecules
# are ChEMBL and ZINC medicinal-chemistry compounds): real structures, read where pip put them.
RDKIT_DRUG_FILES = (
    "Contrib/FreeWilson/data/CHEMBL2321810.smi",
    "Contrib/fraggle/data/ChEMBL_11265_actives.smi",
    "Contrib/Fastcluster/cdk2.smi",
    "Contrib/mmpa/data/sample.smi",
)


def rdkit_drug_smiles():
    """(smiles list, file names) from the drug-like sets in the installed RDKit wheel, or None."""
    try:
        import importlib.util

        spec = importlib.util.find_spec("rdkit")
    except Exception:
        return None
    if spec is None or not spec.submodule_search_locations:
        return None
    base = list(spec.submodule_search_locations)[0]
    smiles, names = [], []
    for rel in RDKIT_DRUG_FILES:
        path = os.path.join(base, rel)
        if not os.path.exists(path):
            continue
        with open(path) as f:
            for line in f:
                parts = line.split()
                # cdk2.smi puts the id first; the others put the SMILES first
                if parts:
                    smi = parts[1] if parts[0].startswith("ZINC") and len(parts) > 1 else parts[0]
                    if smi.upper() != "SMILES":
                        smiles.append(smi)
        names.append(os.path.basename(rel))
    return (smiles, names) if smiles else None


def make_smiles_drug(rng, n, out):
    path = molsets_smiles()
    smiles = []
    source = ""
    if path is not None:
        import gzip

        opener = gzip.open if path.endswith(".gz") else open
        with opener(path, "rt") as f:
            rows = csv.reader(f)
            header = next(rows)
            col = header.index("SMILES") if "SMILES" in header else 0
            all_smiles = [r[col] for r in rows if r]
        idx = rng.choice(len(all_smiles), size=min(n, len(all_smiles)), replace=False)
        smiles = [all_smiles[i] for i in sorted(idx)]
        source = f"MOSES set from the molsets wheel (MIT): {os.path.basename(path)}, seeded sample"
    if len(smiles) < n:
        extra = n - len(smiles)
        smiles += [grammar_molecule(rng, 4, 9) for _ in range(extra)]
        if not source:
            source = "generated: drug-sized molecules (5-11 fragments) from bench/generate.py's grammar; molsets not installed"
    with open(os.path.join(out, "smiles_drug.csv"), "w", newline="") as f:
        f.write("smiles\n")
        for s in smiles:
            f.write(s + "\n")
    with open(os.path.join(out, "smiles_drug.source"), "w") as f:
        f.write(source + "\n")
    return source


def make_smiles_real(rng, n, out):
    found = rdkit_drug_smiles()
    if found is None:
        print("RDKit not installed: no smiles_real.csv", file=sys.stderr)
        return None
    pool, names = found
    idx = rng.integers(0, len(pool), size=n)
    with open(os.path.join(out, "smiles_real.csv"), "w", newline="") as f:
        f.write("smiles\n")
        for i in idx:
            f.write(pool[i] + "\n")
    source = (f"{len(set(pool))} distinct ChEMBL/ZINC drug-like molecules shipped in the RDKit wheel "
              f"({', '.join(names)}), sampled with replacement to {n}")
    with open(os.path.join(out, "smiles_real.source"), "w") as f:
        f.write(source + "\n")
    return source


def make_table(rng, n, out):
    """Property table: Antoine constants (log10, mmHg, degC or ln, kPa, degC) and a listed Tb.

    About 90 % of rows are consistent; the rest carry planted slips: Tb written in degC under
    a kelvin heading (4 %), constants for kPa labelled mmHg (3 %), Tb off by 5-40 K (3 %).
    """
    pool = [grammar_molecule(rng, 0, 3) for _ in range(5000)]
    mmhg_pa = 133.322387415
    with open(os.path.join(out, "table.csv"), "w", newline="") as f, open(
        os.path.join(out, "table_nosmiles.csv"), "w", newline=""
    ) as f2:
        w = csv.writer(f, lineterminator="\n")
        w2 = csv.writer(f2, lineterminator="\n")
        w.writerow(["compound", "smiles", "Tb/K", "A", "B", "C", "convention"])
        w2.writerow(["compound", "Tb/K", "A", "B", "C", "convention"])
        for i in range(n):
            tb = rng.uniform(300.0, 520.0)
            c_k = rng.uniform(-60.0, -30.0)
            svap = rng.uniform(80.0, 105.0)
            a_ln_pa, b = antoine_from_tb(tb, c_k, svap)
            c_deg = c_k + 273.15
            listed_tb = tb
            slip = rng.random()
            if rng.random() < 0.5:
                conv = "log10,mmHg,degC"
                a = (a_ln_pa - math.log(mmhg_pa)) / math.log(10.0)
                bb = b / math.log(10.0)
                if 0.04 <= slip < 0.07:  # kPa constants under a mmHg label
                    a = (a_ln_pa - math.log(1000.0)) / math.log(10.0)
            else:
                conv = "ln,kPa,degC"
                a = a_ln_pa - math.log(1000.0)
                bb = b
            if slip < 0.04:
                listed_tb = tb - 273.15
            elif 0.07 <= slip < 0.10:
                listed_tb = tb + rng.choice([-1.0, 1.0]) * rng.uniform(5.0, 40.0)
            smi = pool[int(rng.integers(0, len(pool)))]
            w.writerow(
                [f"HV-{i:07d}", smi, f"{listed_tb:.2f}", f"{a:.6f}", f"{bb:.4f}", f"{c_deg:.4f}", conv]
            )
            w2.writerow([f"HV-{i:07d}", f"{listed_tb:.2f}", f"{a:.6f}", f"{bb:.4f}", f"{c_deg:.4f}", conv])


def main():
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--out", default="bench/out/data")
    ap.add_argument("--scale", type=float, default=float(os.environ.get("BENCH_SCALE", "1")))
    args = ap.parse_args()
    os.makedirs(args.out, exist_ok=True)
    s = args.scale
    rng = np.random.default_rng(SEED)
    make_fit(rng, max(10, int(10_000 * s)), args.out)
    make_smiles_small(np.random.default_rng(SEED + 1), max(100, int(100_000 * s)), args.out)
    src = make_smiles_drug(np.random.default_rng(SEED + 2), max(100, int(100_000 * s)), args.out)
    make_table(np.random.default_rng(SEED + 3), max(1000, int(1_000_000 * s)), args.out)
    make_smiles_real(np.random.default_rng(SEED + 4), max(100, int(100_000 * s)), args.out)
    print(f"generated inputs at scale {s} in {args.out}; drug-like set: {src}", file=sys.stderr)


if __name__ == "__main__":
    main()
