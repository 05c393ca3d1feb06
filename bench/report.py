#!/usr/bin/env python3
"""Summarise a bench/run: throughput, ratios, peak memory and agreement, as Markdown.

Reads GNU time reports from OUT/time/*.txt and the outputs in OUT/result/. A command that
failed or was not measured is reported as such; no figure is invented for it.
"""

import argparse
import csv
import datetime
import json
import os
import re


def time_report(out, name):
    path = os.path.join(out, "time", f"{name}.txt")
    if not os.path.exists(path) or os.path.exists(os.path.join(out, "time", f"{name}.failed")):
        return None
    text = open(path).read()
    m = re.search(r"Elapsed \(wall clock\) time \(h:mm:ss or m:ss\): (?:(\d+):)?(\d+):([\d.]+)", text)
    rss = re.search(r"Maximum resident set size \(kbytes\): (\d+)", text)
    user = re.search(r"User time \(seconds\): ([\d.]+)", text)
    sys_ = re.search(r"System time \(seconds\): ([\d.]+)", text)
    if not m:
        return None
    h, mnt, s = m.groups()
    wall = int(h or 0) * 3600 + int(mnt) * 60 + float(s)
    load_path = os.path.join(out, "time", f"{name}.load")
    load = open(load_path).read().split() if os.path.exists(load_path) else []
    return {
        "wall_s": max(wall, 1e-3),
        "rss_mib": int(rss.group(1)) / 1024 if rss else float("nan"),
        "load": " / ".join(load) if load else "?",
        # CPU seconds (user + system): what the run cost, less sensitive than wall time to
        # other work on a shared machine
        "cpu_s": max(float(user.group(1)) + float(sys_.group(1)), 1e-2) if user and sys_ else None,
    }


def rows(path):
    if not os.path.exists(path):
        return []
    with open(path, newline="") as f:
        return list(csv.DictReader(f))


def fnum(x):
    try:
        v = float(x)
    except (TypeError, ValueError):
        return None
    return v if v == v else None


def ebullio_fit_tb(path):
    """compound -> fitted normal boiling point, from `ebullio fit --format csv` (or json)."""
    if not os.path.exists(path):
        return {}
    if path.endswith(".csv"):
        return {x["compound"]: float(x["tb_k"]) for x in rows(path) if fnum(x.get("tb_k")) is not None}
    data = json.load(open(path))
    if isinstance(data, dict):
        data = data.get("results", [data])
    out = {}
    for obj in data:
        tb = obj.get("normal_boiling_point_k")
        if isinstance(tb, dict):
            tb = tb.get("value")
        if obj.get("compound") is not None and fnum(tb) is not None:
            out[obj["compound"]] = float(tb)
    return out


def quantiles(xs):
    if not xs:
        return "n/a"
    xs = sorted(xs)
    med = xs[len(xs) // 2]
    p99 = xs[min(len(xs) - 1, int(0.99 * len(xs)))]
    return f"median {med:.3g} K, 99th percentile {p99:.3g} K, max {xs[-1]:.3g} K"


def fmt_cpu(t):
    return "?" if t.get("cpu_s") is None else f"{t['cpu_s']:.2f}"


def cpu_ratio(peer, ours):
    """Peer CPU seconds over ebullio's for the same work: the per-core ratio, less skewed by load."""
    if not peer or not ours or peer.get("cpu_s") is None or ours.get("cpu_s") is None:
        return None
    return peer["cpu_s"] / ours["cpu_s"]


def fmt_rate(r):
    return "not measured" if r is None else f"{r:,.0f}/s"


def ratio(a, b):
    return None if a is None or b is None or b == 0 else a / b


def fmt_ratio(x):
    return "n/a" if x is None else f"{x:.1f}x"


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument("--out", default="bench/out")
    ap.add_argument("--threads", default="1 2")
    args = ap.parse_args()
    out = args.out
    threads = args.threads.split()
    d = os.path.join(out, "data")
    r = os.path.join(out, "result")
    lines = [f"# ebullio side-by-side benchmark, {datetime.datetime.now(datetime.timezone.utc).strftime('%Y-%m-%d %H:%M UTC')}", ""]
    lines.append(f"CPU cores: {os.cpu_count()}. Absolute times vary by machine and load; the ratios are the point.")
    lines.append("Rates are end to end (process start, reading the CSV, computing, writing the output).")
    lines.append("")

    # (a) fitting
    n_sets = len(rows(os.path.join(d, "fit_truth.csv")))
    truth = {x["compound"]: float(x["tb_true_k"]) for x in rows(os.path.join(d, "fit_truth.csv"))}
    peer = {x["compound"]: fnum(x["tb_k"]) for x in rows(os.path.join(r, "peer_fit.csv"))}
    tp = time_report(out, "peer_fit")
    peer_rate = n_sets / tp["wall_s"] if tp else None
    lines += ["## (a) fitting", "", f"{n_sets} compounds, 8-15 points each, 0.5 % noise, 2 % with one gross outlier.", ""]
    lines += ["| tool | threads | fits/s | peak MiB | CPU s | load avg before / after |", "| --- | --- | --- | --- | --- | --- |"]
    lines.append(f"| scipy curve_fit script | 1 | {fmt_rate(peer_rate)} | {tp['rss_mib']:.0f} | {fmt_cpu(tp)} | {tp['load']} |" if tp else "| scipy curve_fit script | 1 | not measured | |")
    fit_rates = {}
    for t in threads:
        te = time_report(out, f"ebullio_fit_t{t}")
        fit_rates[t] = n_sets / te["wall_s"] if te else None
        lines.append(f"| ebullio fit | {t} | {fmt_rate(fit_rates[t])} | {te['rss_mib']:.0f} | {fmt_cpu(te)} | {te['load']} |" if te else f"| ebullio fit | {t} | not measured | |")
    fit_ratio = ratio(fit_rates.get("1"), peer_rate)
    eb = ebullio_fit_tb(os.path.join(r, f"ebullio_fit_t{threads[0]}.csv"))
    both = [k for k in eb if peer.get(k) is not None]
    fit_cpu_ratio = cpu_ratio(tp, time_report(out, "ebullio_fit_t1"))
    lines += ["", f"Ratio (1 thread each): **{fmt_ratio(fit_ratio)}** by wall time, {fmt_ratio(fit_cpu_ratio)} by CPU time."]
    if both:
        lines.append(f"Fitted Tb, ebullio vs scipy on {len(both)} common fits: {quantiles([abs(eb[k] - peer[k]) for k in both])}.")
        lines.append(f"Fitted Tb vs the generating curve: ebullio {quantiles([abs(eb[k] - truth[k]) for k in eb if k in truth])}; "
                     f"scipy {quantiles([abs(v - truth[k]) for k, v in peer.items() if v is not None and k in truth])}.")
    lines.append("")

    # (b) structure
    lines += ["## (b) structure (Joback groups from SMILES)", ""]
    lines += ["| set | tool | threads | molecules/s | peak MiB | CPU s | load avg before / after |", "| --- | --- | --- | --- | --- | --- | --- |"]
    struct_ratios = {}
    struct_cpu = {}
    agree_lines = []
    for s in ("small", "drug", "real"):
        if not os.path.exists(os.path.join(d, f"smiles_{s}.csv")):
            continue
        n = len(rows(os.path.join(d, f"smiles_{s}.csv")))
        tp = time_report(out, f"peer_smarts_{s}")
        pr = n / tp["wall_s"] if tp else None
        lines.append(f"| {s} ({n}) | RDKit + SMARTS | 1 | {fmt_rate(pr)} | {tp['rss_mib']:.0f} | {fmt_cpu(tp)} | {tp['load']} |" if tp else f"| {s} | RDKit + SMARTS | 1 | not measured | |")
        for t in threads:
            te = time_report(out, f"ebullio_estimate_{s}_t{t}")
            er = n / te["wall_s"] if te else None
            if t == "1":
                struct_ratios[s] = ratio(er, pr)
                struct_cpu[s] = cpu_ratio(tp, te)
            lines.append(f"| {s} ({n}) | ebullio estimate | {t} | {fmt_rate(er)} | {te['rss_mib']:.0f} | {fmt_cpu(te)} | {te['load']} |" if te else f"| {s} | ebullio estimate | {t} | not measured | |")
        pe = rows(os.path.join(r, f"peer_smarts_{s}.csv"))
        ee = rows(os.path.join(r, f"ebullio_estimate_{s}_t{threads[0]}.csv"))
        if pe and ee and len(pe) == len(ee):
            pv = [fnum(x.get("tb_joback_k")) for x in pe]
            ev = [fnum(x.get("tb_joback_k")) for x in ee]
            common = [(a, b) for a, b in zip(pv, ev) if a is not None and b is not None]
            same = sum(1 for a, b in common if abs(a - b) < 0.01)
            agree_lines.append(f"{s}: RDKit script gave a Joback Tb for {sum(v is not None for v in pv)}, ebullio for "
                               f"{sum(v is not None for v in ev)} of {n}; of {len(common)} given by both, {same} agree within 0.01 K.")
    src = os.path.join(d, "smiles_drug.source")
    lines += ["", "Ratios (1 thread each, wall time): " + ", ".join(f"{s} **{fmt_ratio(v)}**" for s, v in struct_ratios.items())
              + "; by CPU time: " + ", ".join(f"{s} {fmt_ratio(v)}" for s, v in struct_cpu.items()) + "."]
    if os.path.exists(src):
        lines.append(f"Drug-sized set: {open(src).read().strip()}.")
    src = os.path.join(d, "smiles_real.source")
    if os.path.exists(src):
        lines.append(f"Real set: {open(src).read().strip()}.")
    lines += agree_lines + [""]

    # (c) tables: with SMILES (every check) and without (the columns the polars pipeline reads)
    lines += ["## (c) tables", ""]
    table_rates = {}
    table_ratios = {}
    table_cpus = {}
    tmax = threads[-1]
    for tab, what in (("table", "compound, smiles, Tb/K, A, B, C, convention: every check, structure estimates included"),
                      ("table_nosmiles", "the same rows without smiles: both tools check Tb against the Antoine constants")):
        if not os.path.exists(os.path.join(d, f"{tab}.csv")):
            continue
        n = len(rows(os.path.join(d, f"{tab}.csv")))
        lines += [f"`{tab}.csv`, {n} rows ({what}).", ""]
        lines += ["| tool | threads | rows/s | peak MiB | CPU s | load avg before / after |", "| --- | --- | --- | --- | --- | --- |"]
        for t in threads:
            for tool, name in (("polars pipeline", f"peer_{tab}_t{t}"), ("ebullio check", f"ebullio_check_{tab}_t{t}")):
                tr = time_report(out, name)
                table_rates[name] = n / tr["wall_s"] if tr else None
                lines.append(f"| {tool} | {t} | {fmt_rate(table_rates[name])} | {tr['rss_mib']:.0f} | {fmt_cpu(tr)} | {tr['load']} |" if tr else f"| {tool} | {t} | not measured | |")
        table_ratios[tab] = ratio(table_rates.get(f"ebullio_check_{tab}_t{tmax}"), table_rates.get(f"peer_{tab}_t{tmax}"))
        table_cpus[tab] = cpu_ratio(time_report(out, f"peer_{tab}_t{tmax}"), time_report(out, f"ebullio_check_{tab}_t{tmax}"))
        lines += ["", f"Ratio ebullio/polars ({tmax} threads each; above 1 means ebullio is faster): **{fmt_ratio(table_ratios[tab])}** "
                  f"({fmt_ratio(table_cpus[tab])} by CPU time)."]
        pe = rows(os.path.join(r, f"peer_{tab}_t{tmax}.csv"))
        ee = rows(os.path.join(r, f"ebullio_check_{tab}_t{tmax}.csv"))
        if pe and ee and len(pe) == len(ee):
            pf = sum(1 for x in pe if x.get("flags"))
            ef = sum(1 for x in ee if x.get("flags"))
            lines.append(f"Rows flagged: polars pipeline {pf}, ebullio check {ef}.")
        lines.append("")
    table_ratio = table_ratios.get("table")
    table_cpu = table_cpus.get("table")
    lines += ["", "## ratios", ""]
    lines.append("By wall time: ")
    lines[-1] += (f"fitting {fmt_ratio(fit_ratio)}; structure small {fmt_ratio(struct_ratios.get('small'))}, "
                 f"drug-sized {fmt_ratio(struct_ratios.get('drug'))}, real drug-like {fmt_ratio(struct_ratios.get('real'))}; tables {fmt_ratio(table_ratio)} "
                 f"(without SMILES {fmt_ratio(table_ratios.get('table_nosmiles'))}).")
    lines.append(f"By CPU time: fitting {fmt_ratio(fit_cpu_ratio)}; structure small {fmt_ratio(struct_cpu.get('small'))}, "
                 f"drug-sized {fmt_ratio(struct_cpu.get('drug'))}, real drug-like {fmt_ratio(struct_cpu.get('real'))}; "
                 f"tables {fmt_ratio(table_cpu)} (without SMILES {fmt_ratio(table_cpus.get('table_nosmiles'))}).")
    if len(threads) > 1:
        t0, t1 = threads[0], threads[-1]
        scal = []
        for label, a, b in (
            ("ebullio fit", fit_rates.get(t0), fit_rates.get(t1)),
            ("ebullio check", table_rates.get(f"ebullio_check_table_t{t0}"), table_rates.get(f"ebullio_check_table_t{t1}")),
            ("polars pipeline", table_rates.get(f"peer_table_t{t0}"), table_rates.get(f"peer_table_t{t1}")),
            ("ebullio check without SMILES", table_rates.get(f"ebullio_check_table_nosmiles_t{t0}"),
             table_rates.get(f"ebullio_check_table_nosmiles_t{t1}")),
        ):
            scal.append(f"{label} {fmt_ratio(ratio(b, a))}")
        for st in ("small", "drug", "real"):
            a, b = time_report(out, f"ebullio_estimate_{st}_t{t0}"), time_report(out, f"ebullio_estimate_{st}_t{t1}")
            scal.append(f"ebullio estimate ({st}) {fmt_ratio(ratio(a['wall_s'], b['wall_s']) if a and b else None)}")
        lines.append("")
        lines.append(f"Throughput at {t1} threads over {t0}: " + "; ".join(scal) + ".")
    lines.append("")
    lines.append(f"Load average of the machine (1 min) was {load_now()} when the summary was written; "
                 "each run's load before and after is in its table.")
    print("\n".join(lines))


def load_now():
    try:
        return " ".join(open("/proc/loadavg").read().split()[:3])
    except OSError:
        return "unknown"


if __name__ == "__main__":
    main()
