#!/usr/bin/env python3
"""Peer for the structure benchmark: RDKit parsing SMILES and counting Joback groups by SMARTS.

The SMARTS below are written for this benchmark, one single-atom (recursive) pattern per group
id of reference-data/joback-groups.csv, so each atom is counted at most once per group.
Tb = 198 K + sum of the Tb contributions (Joback & Reid 1987). Writes smiles, tb_joback_k,
groups (id:count;...) and error per input row.
Usage: peer_smarts.py IN.csv OUT.csv [GROUPS.csv]
"""

import csv
import os
import sys
import time

from rdkit import Chem, RDLogger

RDLogger.DisableLog("rdApp.*")

NOT_CARBONYL = "!$([#6]=O)"
NOT_ACYL_O = "!$([#6]-[OX2])"
# Single-atom groups use recursive SMARTS (the match is the one atom); multi-atom groups
# (carbonyl, acid, ester, nitrile, nitro) match all their heavy atoms, so every heavy atom of
# a fully described molecule is covered exactly once.
SMARTS = {
    "ch3": "[CX4H3]",
    "ch2_chain": "[CX4H2;!R]",
    "ch_chain": "[CX4H1;!R]",
    "c_chain": "[CX4H0;!R]",
    "eq_ch2": "[CX3H2;$(*=*)]",
    "eq_ch_chain": f"[CX3H1;!R;{NOT_CARBONYL};$(*=*)]",
    "eq_c_chain": f"[CX3H0;!R;{NOT_CARBONYL};$(*=*)]",
    "eq_c_eq": "[CX2H0;$(*(=*)=*)]",
    "tr_ch": "[CX2H1;$(*#*)]",
    "tr_c": "[CX2H0;$(*#[#6])]",
    "ch2_ring": "[CX4H2;R]",
    "ch_ring": "[CX4H1;R]",
    "c_ring": "[CX4H0;R]",
    "eq_ch_ring": f"[#6X3H1;R;{NOT_CARBONYL}]",
    "eq_c_ring": f"[#6X3H0;R;{NOT_CARBONYL}]",
    "f": "[F]",
    "cl": "[Cl]",
    "br": "[Br]",
    "i": "[I]",
    "oh_alcohol": "[OX2H1;$(O-[#6;!a;!$([#6]=O)])]",
    "oh_phenol": "[OX2H1;$(O-a)]",
    "o_chain": "[OX2H0;!R;!$(O-[#6]=O)]",
    "o_ring": "[#8X2H0;R;!$([#8]-[#6]=O)]",
    "co_chain": f"[CX3H0;!R;{NOT_ACYL_O}]=[OX1]",
    "co_ring": f"[CX3H0;R;{NOT_ACYL_O}]=[OX1]",
    "cho": f"[CX3H1;{NOT_ACYL_O}]=[OX1]",
    "cooh": "[CX3](=[OX1])-[OX2H1]",
    "coo": "[CX3](=[OX1])-[OX2H0]",
    "eq_o": "[OX1;$(O=[!#6;!#7])]",
    "nh2": "[NX3H2]",
    "nh_chain": "[NX3H1;!R]",
    "nh_ring": "[#7X3H1;R]",
    "n_chain": "[NX3H0;!R;!$([#7]~[OX1])]",
    "eq_n_chain": "[NX2H0;!R;$(*=*)]",
    "eq_n_ring": "[#7X2H0;R]",
    "eq_nh": "[NX2H1;$(*=*)]",
    "cn": "[CX2]#[NX1]",
    "no2": "[#7;$([NX3](=O)=O),$([NX3+](=O)[O-])](~[OX1])~[OX1]",
    "sh": "[SX2H1]",
    "s_chain": "[SX2H0;!R]",
    "s_ring": "[#16X2H0;R]",
}


def main():
    src, dst = sys.argv[1], sys.argv[2]
    groups_csv = sys.argv[3] if len(sys.argv) > 3 else os.path.join(
        os.path.dirname(__file__), "..", "reference-data", "joback-groups.csv"
    )
    tb = {r["id"]: float(r["Tb"]) for r in csv.DictReader(open(groups_csv, encoding="utf-8"))}
    missing = set(tb) - set(SMARTS)
    if missing:
        sys.exit(f"no SMARTS for groups {sorted(missing)}")
    patterns = [(gid, Chem.MolFromSmarts(s), tb[gid]) for gid, s in SMARTS.items()]
    t0 = time.perf_counter()
    with open(src, newline="") as f:
        rows = csv.reader(f)
        header = next(rows)
        col = header.index("smiles")
        smiles = [r[col] for r in rows if r]
    out = []
    bad = 0
    t1 = time.perf_counter()
    for s in smiles:
        mol = Chem.MolFromSmiles(s)
        if mol is None:
            bad += 1
            out.append((s, "", "", "could not parse"))
            continue
        total = 198.0
        counts = []
        seen = set()
        overlap = False
        for gid, patt, dtb in patterns:
            matches = mol.GetSubstructMatches(patt, uniquify=True)
            if matches:
                total += len(matches) * dtb
                counts.append(f"{gid}:{len(matches)}")
                for m in matches:
                    for a in m:
                        overlap |= a in seen
                        seen.add(a)
        if overlap or len(seen) != mol.GetNumHeavyAtoms():
            bad += 1
            out.append((s, "", ";".join(counts), "atoms not covered by exactly one Joback group"))
        else:
            out.append((s, f"{total:.2f}", ";".join(counts), ""))
    t2 = time.perf_counter()
    with open(dst, "w", newline="") as f:
        w = csv.writer(f, lineterminator="\n")
        w.writerow(["smiles", "tb_joback_k", "groups", "error"])
        w.writerows(out)
    t3 = time.perf_counter()
    n = len(smiles)
    print(
        f"peer_smarts: {n} SMILES, {bad} unparsed or not fully described by Joback groups; read {t1 - t0:.2f} s, "
        f"parse+count {t2 - t1:.2f} s ({n / (t2 - t1):.0f} molecules/s in the loop), write {t3 - t2:.2f} s",
        file=sys.stderr,
    )


if __name__ == "__main__":
    main()
