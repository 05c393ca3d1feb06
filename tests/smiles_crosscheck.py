#!/usr/bin/env python3
"""Cross-check ebullio's SMILES reader against RDKit (PyPI `rdkit`, pinned in
tests/requirements-crosscheck.txt).

For every SMILES that RDKit accepts, the molecular formula and the total
hydrogen count on every heavy atom (input order) must be identical.

SMILES sources:
  1. 3,000 small molecules generated here with a seeded random generator
     (seed 20261202): chains, branches, rings, double/triple bonds, aromatic
     rings (benzene, pyridine, pyrrole, furan, thiophene, fused), charged
     nitro/carboxylate/ammonium groups, halogens, Kekulé rings.
  2. The first-5,000 extract of the NCI open database that the RDKit wheel
     ships as rdkit/Data/NCI/first_5K.smi (structures whose atoms are all
     within what ebullio reads; isotopes and explicit [H] atoms skipped).
  3. Every structure of reference-data/tb-calibration.csv (the boiling-point
     calibration set: amides, lactams, carbamates, ureas, sulfoxides, sulfones,
     ring tertiary amines, pyrrole-type N-H, fused aromatics among them) and the
     lab structures the estimate tests name.

Usage: python3 tests/smiles_crosscheck.py [path/to/smiles_info binary]
The binary is built from examples/smiles_info.rs (cargo build --example smiles_info).
Exit 0 when all agree; 1 with the mismatches listed.
"""
import os
import random
import subprocess
import sys

from rdkit import Chem, RDLogger
from rdkit.Chem import rdMolDescriptors

RDLogger.DisableLog("rdApp.*")

SEED = 20261202
N_GENERATED = 3000

ATOMS = ["C"] * 10 + ["N", "O", "S", "F", "Cl", "Br", "I", "P", "B"]
RINGS = ["c1ccccc1", "c1ccncc1", "c1cc[nH]c1", "c1ccoc1", "c1ccsc1",
         "c1ccc2ccccc2c1", "C1=CC=CC=C1", "C1CCCCC1", "C1CCOC1", "c1cn[nH]c1",
         "c1ncncc1", "O=c1cc[nH]cc1", "c1ccc2[nH]ccc2c1", "C1=CCC=C1", "n1ccccc1"]
GROUPS = ["[N+](=O)[O-]", "C(=O)[O-]", "[NH3+]", "C(=O)O", "C#N", "C=O", "OC",
          "N(C)C", "S(=O)(=O)C", "[O-]", "C(F)(F)F", "[Si](C)(C)C", "[Se]", "[2H]"]


def gen(rng, depth=0):
    """A random small molecule as SMILES text (may be chemically invalid;
    RDKit decides which ones are kept)."""
    parts = []
    n = rng.randint(1, 6)
    ring_open = None
    for i in range(n):
        r = rng.random()
        if r < 0.15 and depth < 2:
            tok = rng.choice(RINGS)
        elif r < 0.25:
            tok = rng.choice(GROUPS)
        else:
            tok = rng.choice(ATOMS)
        if i > 0 and tok[0] not in "[c" and rng.random() < 0.25:
            tok = rng.choice(["=", "#", "-"]) + tok
        parts.append(tok)
        if ring_open is None and rng.random() < 0.1 and tok[-1].isalpha():
            parts.append("9")
            ring_open = len(parts)
        elif ring_open is not None and len(parts) > ring_open + 2 and rng.random() < 0.5 and tok[-1].isalpha():
            parts.append("9")
            ring_open = -1
        if rng.random() < 0.2 and depth < 2:
            parts.append("(" + gen(rng, depth + 1) + ")")
    s = "".join(parts)
    if ring_open is not None and ring_open != -1:
        s = s.replace("9", "", 1)
    return s


def normal_formula(f):
    """Element counts in a fixed order: RDKit writes H first for carbon-free
    formulas, ebullio uses strict Hill order (alphabetical without carbon)."""
    import re
    charge = ""
    m = re.search(r"([+-]\d*)$", f)
    if m:
        charge = m.group(1)
        f = f[: m.start()]
    counts = {}
    for el, n in re.findall(r"([A-Z][a-z]?)(\d*)", f):
        counts[el] = counts.get(el, 0) + (int(n) if n else 1)
    return " ".join("%s%d" % (k, counts[k]) for k in sorted(counts)) + charge


def rdkit_view(smi):
    m = Chem.MolFromSmiles(smi)
    if m is None:
        return None
    if any(a.GetIsotope() or a.GetAtomicNum() == 1 for a in m.GetAtoms()):
        return None  # isotopes and kept [H] atoms: out of scope
    if any(a.GetNumRadicalElectrons() for a in m.GetAtoms()):
        return None  # RDKit assigns radicals to odd bracket atoms; we do not model them
    for a in m.GetAtoms():
        # OpenSMILES gives organic-subset halogens valence 1 only; RDKit also
        # accepts hypervalent iodine. Such strings are outside the comparison.
        if a.GetSymbol() in ("F", "Cl", "Br", "I") and a.GetTotalValence() > 1:
            return None
    f = normal_formula(rdMolDescriptors.CalcMolFormula(m))
    h = ",".join(str(a.GetTotalNumHs()) for a in m.GetAtoms())
    return f, h


def main():
    root = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
    binary = sys.argv[1] if len(sys.argv) > 1 else os.path.join(root, "target", "debug", "examples", "smiles_info")
    rng = random.Random(SEED)
    cases = []
    seen = set()
    tries = 0
    while sum(1 for c in cases if c[0] == "generated") < N_GENERATED and tries < 200_000:
        tries += 1
        s = gen(rng)
        if s in seen:
            continue
        seen.add(s)
        v = rdkit_view(s)
        if v is not None:
            cases.append(("generated", s, v))
    nci = os.path.join(os.path.dirname(Chem.__file__), "..", "Data", "NCI", "first_5K.smi")
    n_nci = 0
    if os.path.exists(nci):
        with open(nci) as fh:
            for line in fh:
                s = line.split()[0] if line.split() else ""
                if not s or s in seen:
                    continue
                seen.add(s)
                v = rdkit_view(s)
                if v is not None:
                    cases.append(("nci-first-5k", s, v))
                    n_nci += 1
    import csv
    n_cal = 0
    extra = ["CC(C)(C)OC(=O)N1CCCCC1", "COC(=O)CNC(=O)OC(C)(C)C", "CN(C)S(C)(=O)=O"]
    with open(os.path.join(root, "reference-data", "tb-calibration.csv")) as fh:
        rows = csv.reader(line for line in fh if not line.startswith("#"))
        next(rows)
        extra += [r[1] for r in rows]
    for s in extra:
        if s in seen:
            continue
        seen.add(s)
        v = rdkit_view(s)
        if v is not None:
            cases.append(("tb-calibration", s, v))
            n_cal += 1
    text = "\n".join(c[1] for c in cases) + "\n"
    out = subprocess.run([binary], input=text, capture_output=True, text=True, check=True).stdout
    ours = {}
    for line in out.splitlines():
        f = line.split("\t")
        ours[f[0]] = f
    bad = []
    for src, s, (formula, hs) in cases:
        o = ours.get(s)
        if o is None:
            bad.append((src, s, "no output", formula, hs))
        elif o[1] == "ERROR":
            bad.append((src, s, "ours: " + o[2], formula, hs))
        elif normal_formula(o[1]) != formula or o[2] != hs:
            bad.append((src, s, "ours: %s [%s]" % (o[1], o[2]), formula, hs))
    n = len(cases)
    print("smiles cross-check against RDKit %s: %d SMILES (%d generated, seed %d; %d from rdkit/Data/NCI/first_5K.smi; %d calibration and lab structures)"
          % (Chem.rdBase.rdkitVersion, n, n - n_nci - n_cal, SEED, n_nci, n_cal))
    print("agree on formula and per-heavy-atom H count: %d; disagree or refused: %d" % (n - len(bad), len(bad)))
    for b in bad[:40]:
        print("  [%s] %s -> %s; rdkit: %s [%s]" % b)
    return 0 if not bad and n >= 2000 else 1


if __name__ == "__main__":
    sys.exit(main())
