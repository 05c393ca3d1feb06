#!/usr/bin/env python3
"""Generates the INVENTED demo data of the fictional Harrow Vale Fine Chemicals site.

Everything this script writes is invented for ebullio's demo: the site, its
intermediates, their names, the "measurements" and the "supplier" table. The
points are drawn from plausible vapor-pressure curves with seeded noise; one
compound (recovered 1-butanol) is drawn from the published Antoine row of
reference-data/antoine-published.csv so that the reference comparison has a
real curve to compare with. Nothing here is a measurement.

Run from the repository root:  python3 reference-data/demo/make_demo.py
Only the Python standard library is used; the seed is fixed, so the output is
reproducible and the committed files are exactly what this script writes.
"""

import csv
import math
import os
import random

HERE = os.path.dirname(os.path.abspath(__file__))
ROOT = os.path.dirname(os.path.dirname(HERE))
SEED = 20261202
MMHG_PA = 133.322387415  # NIST SP 811, conventional millimetre of mercury
R = 8.314462618  # J/(mol K), CODATA 2018
HEADER = "# INVENTED demo data (Harrow Vale Fine Chemicals, a fictional site), written by reference-data/demo/make_demo.py; not measurements.\n"

rng = random.Random(SEED)


def published_row(name):
    """The first ln,kPa,degC row for `name` in the bundled published table."""
    with open(os.path.join(ROOT, "reference-data", "antoine-published.csv"), newline="") as f:
        for row in csv.DictReader(f):
            if row["compound"] == name and row["p_unit"] == "kPa" and row["t_unit"] == "degC":
                return float(row["A"]), float(row["B"]), float(row["C"])
    raise SystemExit(f"{name}: no ln,kPa,degC row in antoine-published.csv")


def invented_antoine(tb_c, trouton, c):
    """Invented ln,kPa,degC constants with normal boiling point tb_c (degC),
    entropy of vaporization `trouton` (J/(mol K)) at Tb and Antoine C.
    From d ln p/dT = B/(t+C)^2 = dHvap/(R Tb^2) with dHvap = trouton * Tb."""
    tb_k = tb_c + 273.15
    slope = trouton * tb_k / (R * tb_k**2)
    b = slope * (tb_c + c) ** 2
    a = math.log(101.325) + b / (tb_c + c)
    return a, b, c


def p_kpa(abc, t_c):
    a, b, c = abc
    return math.exp(a - b / (t_c + c))


def t_c_at(abc, p):
    a, b, c = abc
    return b / (a - math.log(p)) - c


BUTANOL = published_row("1-butanol")
# Invented curves for the invented intermediates (Tb near their Joback estimates).
HV12_KETONE = invented_antoine(183.0, 92.0, 190.0)
HV27_ESTER = invented_antoine(212.0, 95.0, 185.0)
HV40_NITRILE = invented_antoine(176.0, 97.0, 195.0)
HV36_BENZYL = invented_antoine(268.0, 97.0, 170.0)


def write(name, text):
    with open(os.path.join(HERE, name), "w", newline="") as f:
        f.write(text)


def ebulliometer():
    """T/K, p/kPa with standard uncertainties: 1-butanol (wide range) and the
    HV-12 ketone with one gross outlier (a transcription slip)."""
    rows = []
    for t_c in [45, 55, 65, 75, 85, 95, 105, 112, 117]:
        t_k = t_c + 273.15 + rng.gauss(0, 0.03)
        p = p_kpa(BUTANOL, t_k - 273.15) * (1 + rng.gauss(0, 0.003))
        rows.append(("1-butanol", t_k, p, 0.05, 0.003 * p))
    for i, t_c in enumerate([70, 82, 94, 106, 118, 130, 142, 154, 166, 178]):
        t_k = t_c + 273.15 + rng.gauss(0, 0.03)
        p = p_kpa(HV12_KETONE, t_k - 273.15) * (1 + rng.gauss(0, 0.004))
        if i == 5:
            p *= 1.45  # planted gross outlier: the logger's reading was misread
        rows.append(("HV-12 ketone", t_k, p, 0.05, max(0.004 * p, 0.02)))
    out = HEADER + "# Ebulliometer runs, lab B2, 2026: 1-butanol recovered from the HV-12 wash (lot HV-R3) and the HV-12 ketone. u(T), u(p): standard uncertainties.\n"
    out += "compound,T/K,p/kPa,u(T)/K,u(p)/kPa\n"
    for name, t, p, ut, up in rows:
        out += f"{name},{t:.2f},{p:.4g},{ut:.2f},{up:.2g}\n"
    write("ebulliometer-2026.csv", out)


def rotavap_log():
    """t/degC, p/mmHg from rotary-evaporator and short-path logs: the HV-27 ester
    (several decades of pressure) and the HV-40 nitrile over a narrow range."""
    rows = []
    for p_mmhg in [2, 5, 10, 20, 40, 80, 160]:
        t_c = t_c_at(HV27_ESTER, p_mmhg * MMHG_PA / 1000) + rng.gauss(0, 0.3)
        p = p_mmhg * (1 + rng.gauss(0, 0.01))
        rows.append(("HV-27 ester", t_c, p))
    for t_c in [88.0, 90.5, 93.0, 95.5, 98.0, 100.5]:
        t = t_c + rng.gauss(0, 0.1)
        p = p_kpa(HV40_NITRILE, t) * 1000 / MMHG_PA * (1 + rng.gauss(0, 0.008))
        rows.append(("HV-40 nitrile", t, p))
    out = HEADER + "# Rotary-evaporator and short-path distillation logs, pilot bay, 2026. u(T) from the probe's calibration.\n"
    out += "compound,t/°C,p/mmHg,u(T)/K\n"
    for name, t, p in rows:
        out += f"{name},{t:.1f},{p:.3g},0.3\n"
    write("rotavap-log-2026.csv", out)


def log10_mmhg(abc):
    """ln,kPa,degC -> log10,mmHg,degC (exact)."""
    a, b, c = abc
    ln10 = math.log(10)
    return a / ln10 - math.log10(MMHG_PA / 1000), b / ln10, c


def tb_k(abc):
    return t_c_at(abc, 101.325) + 273.15


def supplier_table():
    """Property table 'collected from suppliers', with planted faults (see README.md)."""
    conv = "log10,mmHg,degC"

    def row(compound, smiles, cas, tb, abc, convention, tmin, tmax):
        a, b, c = abc
        return [compound, smiles, cas, f"{tb:.2f}" if tb is not None else "", f"{a:.5f}", f"{b:.2f}",
                f"{c:.3f}", convention, f"{tmin:g}", f"{tmax:g}"]

    def pub(name):
        return log10_mmhg(published_row(name))

    acetone_log10_kpa = tuple(v / math.log(10) if i < 2 else v for i, v in enumerate(published_row("acetone")))
    cyclohexane = pub("cyclohexane")
    rows = [
        # clean rows
        row("toluene", "Cc1ccccc1", "108-88-3", tb_k(published_row("toluene")), pub("toluene"), conv, 6, 137),
        row("ethanol", "CCO", "64-17-5", tb_k(published_row("ethanol")), pub("ethanol"), conv, 3, 96),
        row("2-butanone", "CCC(C)=O", "78-93-3", tb_k(published_row("2-butanone")), pub("2-butanone"), conv, -8, 103),
        # fault 1: log10 kPa constants labelled mmHg
        row("acetone", "CC(C)=O", "67-64-1", 329.35, acetone_log10_kpa, conv, -26, 77),
        # fault 2: Celsius boiling point in the kelvin column
        row("1-butanol", "CCCCO", "71-36-3", 117.6, pub("1-butanol"), conv, 37, 138),
        # fault 3: A and B swapped
        row("cyclohexane", "C1CCCCC1", "110-82-7", 353.85, (cyclohexane[1], cyclohexane[0], cyclohexane[2]), conv, 9, 105),
        # fault 4: natural-log constants labelled log10
        row("methanol", "CO", "67-56-1", tb_k(published_row("methanol")), published_row("methanol"), "log10,kPa,degC", -11, 83),
        # fault 5: a duplicate that disagrees (second supplier's Tb 12 K high)
        row("acetonitrile", "CC#N", "75-05-8", 354.75, pub("acetonitrile"), conv, -27, 81),
        row("acetonitrile", "CC#N", "75-05-8", 366.80, pub("acetonitrile"), conv, -27, 81),
        # fault 6: bad CAS check digit (the real one ends in -2)
        row("dichloromethane", "ClCCl", "75-09-3", 312.85, pub("dichloromethane"), conv, -38, 60),
        # the site's own intermediates (invented), from the in-house curves
        row("HV-12 ketone", "COCCOCCC(C)=O", "", tb_k(HV12_KETONE), log10_mmhg(HV12_KETONE), conv, 70, 180),
        row("HV-27 ester", "COC(=O)CCC1CCCO1", "", tb_k(HV27_ESTER), log10_mmhg(HV27_ESTER), conv, 60, 160),
    ]
    out = HEADER + "# 'Supplier' property table as collected by the site's data steward; planted faults are listed in README.md.\n"
    out += "compound,smiles,cas,Tb/K,A,B,C,convention,Tmin/°C,Tmax/°C\n"
    for r in rows:
        out += ",".join(f'"{v}"' if "," in v else v for v in r) + "\n"
    write("supplier-properties.csv", out)


def new_structures():
    out = HEADER + "# New structures from route scouting: no measured data. One has a literature-style boiling point at reduced pressure.\n"
    out += "compound,smiles,reported_bp\n"
    bp36 = t_c_at(HV36_BENZYL, 0.5 * MMHG_PA / 1000)
    entries = [
        ("HV-31 aryl ethanol", "COc1ccc(CCO)cc1", ""),
        ("HV-32 methoxy amide", "CCN(CC)C(=O)COC", ""),
        ("HV-33 furyl ketone", "CC(=O)Cc1ccco1", ""),
        ("HV-34 chloro anisole", "Clc1ccc(C)c(OC)c1", ""),
        ("HV-36 benzyloxy acetate", "CC(=O)OCCOCc1ccccc1", f"{round(bp36)} degC at 0.5 mmHg"),
    ]
    for name, smi, bp in entries:
        out += f"{name},{smi},{bp}\n"
    write("new-structures.csv", out)


def plan():
    out = (
        "{\n"
        '  "_comment": "INVENTED demo plan (Harrow Vale Fine Chemicals, fictional); written by make_demo.py",\n'
        '  "vacuum": "20 mbar",\n'
        '  "max_pot_temperature": "140 degC",\n'
        '  "separation": {"components": ["1-butanol", "HV-12 ketone"], "pressure": "20 mbar"}\n'
        "}\n"
    )
    write("plan.json", out)


if __name__ == "__main__":
    ebulliometer()
    rotavap_log()
    supplier_table()
    new_structures()
    plan()
    print("wrote invented demo data to", HERE)
