#!/usr/bin/env python3
"""Generate ebullio's reference-equation saturation curves.

For every pure fluid of the CoolProp library (MIT licence; an open-source library of
reference equations of state, each published in the primary literature) listed in
names.py, this script:

1. samples the saturation pressure of the fluid's equation of state (liquid side, Q = 0)
   from the triple point (or the lowest temperature the equation solves) to 0.95 Tc;
2. fits ebullio's Wagner 2.5-5 form, ln(p/pc) = (Tc/T)(n1 t + n2 t^1.5 + n3 t^2.5 + n4 t^5),
   t = 1 - T/Tc, with Tc and pc of the equation of state (src/vapor/wagner.rs); if that
   misses the equation by more than 0.003 % in p at any fitted point, the Chebyshev form
   T ln(p/Pa) = sum_{s=0..n} a_s T_s(x), x = (2T - (Tmax + Tmin))/(Tmax - Tmin), of the
   lowest order that does (D. Ambrose, J. F. Counsell and A. J. Davenport, J. Chem.
   Thermodyn. 2, 283-294 (1970), there with log10 and a_0/2; here ln and a_0 whole);
3. writes reference-data/reference-equations.csv (constants, critical point, acentric
   factor, triple point, normal boiling point, CAS, SMILES, the citation of the equation of
   state, the largest deviation of the stored form from the equation, the equation's stated
   uncertainty where recorded) and reference-data/reference-equation-points.csv (200
   check points per fluid, not the points fitted).

Run:  python3 reference-data/gen/generate.py   (creates reference-data/gen/.venv and
installs CoolProp there; CI does not run this script: the generated files are committed).
"""

import csv
import math
import os
import re
import subprocess
import sys

HERE = os.path.dirname(os.path.abspath(__file__))
DATA = os.path.dirname(HERE)
VENV = os.path.join(HERE, ".venv")
COOLPROP_VERSION = "8.0.0"


def ensure_venv():
    py = os.path.join(VENV, "bin", "python")
    if sys.prefix != VENV:
        if not os.path.exists(py):
            subprocess.check_call([sys.executable, "-m", "venv", VENV])
            subprocess.check_call([py, "-m", "pip", "install", "-q",
                                   f"CoolProp=={COOLPROP_VERSION}", "numpy"])
        os.execv(py, [py, os.path.abspath(__file__)] + sys.argv[1:])


ensure_venv()

import numpy as np  # noqa: E402
import CoolProp  # noqa: E402
import CoolProp.CoolProp as CP  # noqa: E402

sys.path.insert(0, HERE)
from names import NAMES  # noqa: E402
from uncertainty import STATED_U_P  # noqa: E402

TARGET = 2e-4  # 0.02 % in p: the largest deviation allowed at any check point
FIT_TOL = 3e-5  # aim of the fit at the fitted points (0.003 %), so IF97 vs IAPWS-95 (<= 0.018 %) plus fit stays inside TARGET
N_FIT = 600
N_CHECK = 200
WAGNER = [1.0, 1.5, 2.5, 5.0]


def cas_ok(cas):
    m = re.fullmatch(r"(\d{2,7})-(\d\d)-(\d)", cas)
    if not m:
        return False
    body = m.group(1) + m.group(2)
    s = sum((i + 1) * int(d) for i, d in enumerate(reversed(body)))
    return s % 10 == int(m.group(3))


# ---------------------------------------------------------------- bibliography
def load_bib():
    path = os.path.join(os.path.dirname(CoolProp.__file__), "CoolPropBibTeXLibrary.bib")
    text = open(path, encoding="utf-8").read()
    entries = {}
    for m in re.finditer(r"@(\w+)\s*\{\s*([^,\s]+)\s*,(.*?)\n\}", text, re.S):
        kind, key, body = m.group(1).lower(), m.group(2), m.group(3)
        fields = {}
        for f in re.finditer(r"(\w+)\s*=\s*\{(.*?)\}\s*,?\s*$", body, re.S | re.M):
            fields[f.group(1).lower()] = f.group(2)
        entries[key] = (kind, fields)
    return entries


ACCENTS = {r'\"a': "ä", r'\"o': "ö", r'\"u': "ü", r"\'e": "é", r"\'a": "á", r"\`e": "è",
           r"\'i": "í", r"\'o": "ó", r"\ss": "ß", r'\"A': "Ä", r'\"O': "Ö", r'\"U': "Ü",
           r"\v{c}": "č", r"\v c": "č", r"\c{c}": "ç"}


def delatex(s):
    s = re.sub(r"\s+", " ", s)
    for k, v in ACCENTS.items():
        s = s.replace("{" + k + "}", v).replace(k, v)
    s = re.sub(r"\\[a-zA-Z]+\s*", "", s)
    return s.replace("{", "").replace("}", "").replace("--", "-").strip()


def authors(a):
    names = [delatex(x).strip() for x in re.split(r"\s+and\s+", a)]
    names = [n for n in names if n]
    if len(names) > 4:
        return names[0] + " et al."
    return ", ".join(names[:-1]) + (" and " if len(names) > 1 else "") + names[-1]


def citation(bib, keys):
    out = []
    for key in keys.split(","):
        key = key.strip()
        if key not in bib:
            raise SystemExit(f"no bibliography entry {key}")
        kind, f = bib[key]
        g = lambda k: delatex(f.get(k, ""))  # noqa: E731
        parts = [authors(f.get("author", "")), g("title")]
        if kind == "article":
            j = g("journal")
            vol = g("volume")
            pages = g("pages")
            parts.append(" ".join(x for x in [j, vol] if x) + (f", {pages}" if pages else ""))
        elif kind == "book":
            parts.append(g("publisher"))
        elif kind == "phdthesis":
            parts.append("PhD thesis, " + g("school"))
        else:
            parts.append(g("journal") or g("booktitle") or g("publisher") or g("school")
                         or g("institution") or g("note"))
        parts.append(g("year"))
        text = ", ".join(p for p in parts if p)
        if re.search(r"http|www\.|doi", text, re.I):
            raise SystemExit(f"address left in citation {key}: {text}")
        out.append(text)
    return "; ".join(out)


# ---------------------------------------------------------------- sampling and fit
def psat(fluid, t):
    try:
        p = CP.PropsSI("P", "T", t, "Q", 0, fluid)
    except ValueError:
        return None
    return p if p > 0 and math.isfinite(p) else None


def clapeyron_ok(fluid, t):
    """The saturation state at t is trusted when d ln p/dT by finite difference agrees within
    0.1 % with the Clapeyron equation from the same equation of state's phase properties."""
    try:
        p = psat(fluid, t)
        h = 1e-4 * t
        pm, pp = psat(fluid, t - h), psat(fluid, t + h)
        if not (p and pm and pp):
            return False
        hl = CP.PropsSI("Hmolar", "T", t, "Q", 0, fluid)
        hv = CP.PropsSI("Hmolar", "T", t, "Q", 1, fluid)
        dl = CP.PropsSI("Dmolar", "T", t, "Q", 0, fluid)
        dv = CP.PropsSI("Dmolar", "T", t, "Q", 1, fluid)
    except ValueError:
        return False
    fd = (math.log(pp) - math.log(pm)) / (2 * h)
    cl = (hv - hl) / (t * (1 / dv - 1 / dl) * p)
    return abs(fd / cl - 1) < 1e-3


def lowest_t(fluid, t_tr, tc):
    """The triple point, or above it the lowest temperature from which every scanned
    saturation state (120 steps to 0.95 Tc) passes the Clapeyron check."""
    grid = np.linspace(t_tr, 0.95 * tc, 121)
    bad = [i for i, t in enumerate(grid) if not clapeyron_ok(fluid, t)]
    if not bad:
        return t_tr
    if bad[-1] >= 60:
        raise SystemExit(f"{fluid}: saturation states fail the Clapeyron check up to {grid[bad[-1]]:.1f} K")
    return float(grid[bad[-1] + 1])


def wagner_design(t, tc):
    tau = 1.0 - t / tc
    return np.stack([(tc / t) * tau ** k for k in WAGNER], axis=1)


def wagner_fit(t, lnp, tc, pc):
    """Least squares in ln p (relative error in p), Tc and pc fixed."""
    n, *_ = np.linalg.lstsq(wagner_design(t, tc), lnp - math.log(pc), rcond=None)
    return n


def wagner_ln_p(n, t, tc, pc):
    return math.log(pc) + wagner_design(t, tc) @ n


def cheb_x(t, lo, hi):
    return (2.0 * t - (hi + lo)) / (hi - lo)


def cheb_fit(t, lnp, lo, hi, order):
    """T ln(p/Pa) = sum a_s T_s(x), weighted so the residual is in ln p."""
    return np.polynomial.chebyshev.chebfit(cheb_x(t, lo, hi), t * lnp, order, w=1.0 / t)


def cheb_ln_p(a, t, lo, hi):
    return np.polynomial.chebyshev.chebval(cheb_x(t, lo, hi), a) / t


def fit(t, lnp, tc, pc, lo, hi):
    """The project's Wagner 2.5-5 form when it meets FIT_TOL on the fitted points, else the
    Chebyshev form of lowest order that does (orders 4 to 30; the best if none does)."""
    n = wagner_fit(t, lnp, tc, pc)
    if np.max(np.abs(wagner_ln_p(n, t, tc, pc) - lnp)) <= FIT_TOL:
        return "wagner-2.5-5", n, lambda x: wagner_ln_p(n, x, tc, pc)
    best = None
    for order in range(4, 31):
        a = cheb_fit(t, lnp, lo, hi, order)
        m = np.max(np.abs(cheb_ln_p(a, t, lo, hi) - lnp))
        if best is None or m < best[0]:
            best = (m, a)
        if m <= FIT_TOL:
            break
    a = best[1]
    return "chebyshev", a, lambda x: cheb_ln_p(a, x, lo, hi)


def fmt(x):
    return repr(float(x))


def main():
    bib = load_bib()
    eq_rows, pt_rows = [], []
    for fluid in sorted(CP.get_global_param_string("FluidsList").split(","), key=str.lower):
        if fluid not in NAMES:
            continue
        name, syn, smiles_own = NAMES[fluid]
        g = lambda k: CP.get_fluid_param_string(fluid, k)  # noqa: E731
        cas = g("CAS")
        if not cas_ok(cas):
            raise SystemExit(f"{fluid}: CAS {cas} fails its check digit")
        smiles = smiles_own or g("SMILES")
        if smiles in ("", "?", "N/A"):
            raise SystemExit(f"{fluid}: no SMILES")
        tc = CP.PropsSI("Tcrit", fluid)
        pc = CP.PropsSI("pcrit", fluid)
        t_tr = CP.PropsSI("Ttriple", fluid)
        t_lo = lowest_t(fluid, max(t_tr, CP.PropsSI("Tmin", fluid)), tc)
        if t_lo > t_tr + 1e-9:
            print(f"{fluid}: starts at {t_lo:.2f} K, above the triple point {t_tr:.2f} K", file=sys.stderr)
        t_hi = round(0.95 * tc, 6)  # as stored
        # Fit points: dense, denser at both ends; check points: a different grid.
        u = (1 - np.cos(np.linspace(0, math.pi, N_FIT))) / 2
        tf = t_lo + (t_hi - t_lo) * u
        pf = [psat(fluid, x) for x in tf]
        keep = [i for i, p in enumerate(pf) if p is not None]
        tf = tf[keep]
        lnp = np.log(np.array([pf[i] for i in keep]))
        form, coef, ln_p_of = fit(tf, lnp, tc, pc, t_lo, t_hi)
        # Check points: evenly spaced, offset half a step from the ends.
        tcheck = t_lo + (t_hi - t_lo) * (np.arange(N_CHECK) + 0.5) / N_CHECK
        tcheck = np.concatenate([[t_lo], tcheck[1:-1], [t_hi]])
        pcheck = [psat(fluid, x) for x in tcheck]
        worst = 0.0
        for x, p in zip(tcheck, pcheck):
            if p is None:
                continue
            xs, ps = f"{x:.10g}", f"{p:.10g}"  # as stored, so the test sees the same figure
            x, p = float(xs), float(ps)
            worst = max(worst, abs(math.exp(float(ln_p_of(np.array([x]))[0])) / p - 1.0))
            pt_rows.append([name, xs, ps])
        try:
            tb = CP.PropsSI("T", "P", 101325.0, "Q", 0, fluid)
            tb = fmt(round(tb, 4)) if t_lo <= tb <= t_hi else ""  # only inside the fitted range
        except ValueError:
            tb = ""  # no liquid at 1 atm (sublimes, or supercritical)
        p_tr = psat(fluid, t_tr)
        key = g("BibTeX-EOS")
        u_stated, u_note = STATED_U_P.get(key.split(",")[0], ("", ""))
        eq_rows.append({
            "compound": name,
            "synonyms": "; ".join(syn),
            "cas": cas,
            "smiles": smiles,
            "tc_k": fmt(tc),
            "pc_pa": fmt(pc),
            "omega": fmt(round(CP.PropsSI("acentric", fluid), 6)),
            "t_triple_k": fmt(t_tr),
            "p_triple_pa": fmt(p_tr) if p_tr else "",
            "tb_k": tb,
            "t_min_k": fmt(t_lo),
            "t_max_k": fmt(t_hi),
            "range_note": ("starts above the triple point: below it the equation's saturation "
                           "states fail a Clapeyron consistency check" if t_lo > t_tr + 1e-9 else ""),
            "form": form,
            "coefficients": ";".join(fmt(c) for c in coef),
            "max_dev_pct": f"{math.ceil(worst * 1e8) / 1e6:.6f}",
            "eos_u_p_pct": u_stated,
            "eos_u_note": u_note,
            "eos_citation": citation(bib, key),
        })
        if worst > TARGET:
            raise SystemExit(f"{name}: {100 * worst:.4f} % exceeds the 0.02 % target")
        print(f"{name:45} {form:14} {len(coef)} terms  max dev {100 * worst:.5f} %", file=sys.stderr)
    head = (f"# GENERATED by reference-data/gen/generate.py with CoolProp {CoolProp.__version__} "
            "(MIT licence). Do not edit by hand; rerun the script.\n")
    cols = list(eq_rows[0].keys())
    with open(os.path.join(DATA, "reference-equations.csv"), "w", newline="", encoding="utf-8") as f:
        f.write(head)
        w = csv.DictWriter(f, fieldnames=cols, lineterminator="\n")
        w.writeheader()
        w.writerows(eq_rows)
    with open(os.path.join(DATA, "reference-equation-points.csv"), "w", newline="", encoding="utf-8") as f:
        f.write(head)
        w = csv.writer(f, lineterminator="\n")
        w.writerow(["compound", "t_k", "p_pa"])
        w.writerows(pt_rows)
    print(f"{len(eq_rows)} fluids; largest deviation "
          f"{max(float(r['max_dev_pct']) for r in eq_rows):.5f} %", file=sys.stderr)


if __name__ == "__main__":
    main()
