#!/usr/bin/env python3
"""Peer for the fitting benchmark: what a careful practitioner writes with scipy.

Reads fit.csv (compound, T/K, p/kPa), fits ln(p/Pa) = A - B/(T/K + C) per compound with
scipy.optimize.curve_fit (starting values from the linearized Antoine form solved by linear
least squares, analytic Jacobian, parameter standard errors from pcov), and writes one CSV row
per compound with A, B, C, their standard errors and the normal boiling point.
Usage: peer_fit.py IN.csv OUT.csv
"""

import csv
import math
import sys
import time

import numpy as np
from scipy.optimize import curve_fit

LN_ATM = math.log(101_325.0)


def antoine(t, a, b, c):
    return a - b / (t + c)


def jac(t, a, b, c):
    d = t + c
    return np.column_stack((np.ones_like(t), -1.0 / d, b / d**2))


def start(t, y):
    # T ln p = A T + (A C - B) - C ln p: linear in (A, A C - B, C)
    m = np.column_stack((t, np.ones_like(t), -y))
    x, *_ = np.linalg.lstsq(m, t * y, rcond=None)
    a, k, c = x
    return a, a * c - k, c


def fit_one(t, y):
    p0 = start(t, y)
    popt, pcov = curve_fit(antoine, t, y, p0=p0, jac=jac, maxfev=2000)
    se = np.sqrt(np.diag(pcov))
    a, b, c = popt
    tb = b / (a - LN_ATM) - c
    return popt, se, tb


def main():
    src, dst = sys.argv[1], sys.argv[2]
    t0 = time.perf_counter()
    groups = {}
    with open(src, newline="") as f:
        rows = csv.reader(f)
        header = next(rows)
        ic, it, ip = header.index("compound"), header.index("T/K"), header.index("p/kPa")
        for r in rows:
            groups.setdefault(r[ic], ([], []))
            groups[r[ic]][0].append(float(r[it]))
            groups[r[ic]][1].append(math.log(float(r[ip]) * 1000.0))
    t1 = time.perf_counter()
    out = []
    failures = 0
    for name, (ts, ys) in groups.items():
        t = np.asarray(ts)
        y = np.asarray(ys)
        try:
            popt, se, tb = fit_one(t, y)
            out.append([name, *popt, *se, tb, ""])
        except (RuntimeError, ValueError, np.linalg.LinAlgError) as e:
            failures += 1
            out.append([name, "", "", "", "", "", "", "", str(e)])
    t2 = time.perf_counter()
    with open(dst, "w", newline="") as f:
        w = csv.writer(f, lineterminator="\n")
        w.writerow(["compound", "A", "B", "C", "se_A", "se_B", "se_C", "tb_k", "error"])
        w.writerows(out)
    t3 = time.perf_counter()
    print(
        f"peer_fit: {len(groups)} sets, {failures} failed; read {t1 - t0:.2f} s, "
        f"fit {t2 - t1:.2f} s ({len(groups) / (t2 - t1):.0f} fits/s in the loop), write {t3 - t2:.2f} s",
        file=sys.stderr,
    )


if __name__ == "__main__":
    main()
