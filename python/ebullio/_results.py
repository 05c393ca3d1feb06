"""Typed results: each keeps the CLI's JSON rows (``to_dict``), gives DataFrames (``to_polars``)
and shows the CLI's HTML report in a notebook (``_repr_html_``)."""

from __future__ import annotations

import copy
import html
import json
from typing import Any, Dict, Iterator, List, Optional, Sequence, Union

import polars as pl

from ._frames import iframe

# The CLI's `fit --format csv` columns, here at full precision.
_FIT_COLUMNS = [
    "compound", "model", "convention", "A", "B", "C", "D", "se_A", "se_B", "se_C", "se_D",
    "n_points", "rms_rel_dev_pct", "tb_k", "tb_ci95_low_k", "tb_ci95_high_k", "flags", "error",
]


def _num(v: Any) -> Optional[float]:
    return float(v) if isinstance(v, (int, float)) and v == v and abs(v) != float("inf") else None


class Fit:
    """One compound's fit: the row ``ebullio fit --format json`` writes for it."""

    def __init__(self, row: Dict[str, Any]):
        self._row = row

    @property
    def ok(self) -> bool:
        """False when this compound could not be fitted (see ``error``)."""
        return "error" not in self._row or "parameters" in self._row

    @property
    def compound(self) -> Optional[str]:
        return self._row.get("compound")

    @property
    def error(self) -> str:
        return "" if self.ok else self._row.get("error", "")

    @property
    def model(self) -> Optional[str]:
        return self._row.get("model")

    @property
    def parameters(self) -> Dict[str, float]:
        """Fitted constants by name (in the reported convention, see ``to_dict()['convention']``)."""
        return {p["name"]: p["value"] for p in self._row.get("parameters", [])}

    @property
    def normal_boiling_point_k(self) -> Optional[float]:
        tb = self._row.get("normal_boiling_point_k")
        return tb["value"] if tb else None

    @property
    def flags(self) -> List[Dict[str, str]]:
        """Findings about the fit: code, severity, message."""
        return list(self._row.get("flags", []))

    def to_dict(self) -> Dict[str, Any]:
        """The CLI's JSON row (a copy)."""
        return copy.deepcopy(self._row)

    def to_polars(self) -> pl.DataFrame:
        """The measured points with their deviations from the fit, one row per point."""
        return pl.DataFrame(self._row.get("points", []))

    def summary_row(self) -> Dict[str, Any]:
        """This fit as one row of the CLI's CSV (full precision)."""
        r = self._row
        out: Dict[str, Any] = {k: None for k in _FIT_COLUMNS}
        out["compound"] = r.get("compound")
        if not self.ok:
            out["error"] = r.get("error", "")
            return out
        out.update(model=r["model"], convention=r["convention"], n_points=r["n_points"],
                   rms_rel_dev_pct=_num(r.get("rms_rel_dev_pct")), error="",
                   flags=";".join(f["code"] for f in r.get("flags", [])))
        for i, p in enumerate(r.get("parameters", [])[:4]):
            out["ABCD"[i]] = _num(p["value"])
            out["se_" + "ABCD"[i]] = _num(p["std_error"])
        tb = r.get("normal_boiling_point_k")
        if tb:
            out.update(tb_k=_num(tb["value"]), tb_ci95_low_k=_num(tb["ci95_low"]),
                       tb_ci95_high_k=_num(tb["ci95_high"]))
        return out

    def __repr__(self) -> str:
        if not self.ok:
            return f"Fit({self.compound!r}: not fitted: {self.error})"
        tb = self.normal_boiling_point_k
        tb_s = f", Tb {tb:.2f} K" if tb is not None else ""
        return f"Fit({self.compound or 'data'}: {self.model}, {self._row['n_points']} points{tb_s})"


class FitResult(Sequence[Fit]):
    """The fits of one :func:`ebullio.fit` call, one per compound, in order of first appearance."""

    def __init__(self, run: Any):
        self._run = run
        self._rows = json.loads(run.json())
        self.fits = [Fit(r) for r in self._rows]
        self.warnings = [
            {"row": w[0], "code": w[1], "message": w[2]} for w in run.warnings()
        ]

    def __len__(self) -> int:
        return len(self.fits)

    def __getitem__(self, key: Union[int, str]) -> Fit:  # type: ignore[override]
        if isinstance(key, str):
            for f in self.fits:
                if f.compound == key:
                    return f
            raise KeyError(key)
        return self.fits[key]

    def __iter__(self) -> Iterator[Fit]:
        return iter(self.fits)

    def to_dict(self) -> List[Dict[str, Any]]:
        """The CLI's ``--format json`` rows (always a list)."""
        return copy.deepcopy(self._rows)

    def to_polars(self) -> pl.DataFrame:
        """One row per compound: the CLI's ``--format csv`` columns at full precision."""
        return pl.DataFrame([f.summary_row() for f in self.fits],
                            schema={k: (pl.String if k in ("compound", "model", "convention", "flags", "error")
                                        else pl.Int64 if k == "n_points" else pl.Float64)
                                    for k in _FIT_COLUMNS})

    def to_pandas(self) -> Any:
        return self.to_polars().to_pandas()

    def report_html(self) -> str:
        """The self-contained HTML report ``ebullio fit --report`` writes."""
        return self._run.html("ebullio.fit(...)")

    def _repr_html_(self) -> str:
        return iframe(self.report_html(), 900)

    def __repr__(self) -> str:
        return f"FitResult({len(self)} fit(s): " + "; ".join(repr(f) for f in self.fits) + ")"


class Estimates:
    """Structure estimates of :func:`ebullio.estimate`: a DataFrame plus the CLI's JSON rows."""

    def __init__(self, frame: pl.DataFrame, run: Any):
        self.frame = frame
        self._run = run

    def __len__(self) -> int:
        return self.frame.height

    def to_polars(self) -> pl.DataFrame:
        """One row per structure: the CLI's ``--format csv`` columns at full precision."""
        return self.frame

    def to_pandas(self) -> Any:
        return self.frame.to_pandas()

    def to_dict(self) -> List[Dict[str, Any]]:
        """The CLI's ``--format json`` rows (always a list)."""
        return json.loads(self._run.json())

    def report_html(self) -> str:
        """The self-contained HTML report ``ebullio estimate --report`` writes."""
        return self._run.html("ebullio.estimate(...)")

    def _repr_html_(self) -> str:
        return iframe(self.report_html(), 700)

    def __repr__(self) -> str:
        return f"Estimates({len(self)} structure(s))\n{self.frame!r}"


class CheckResult:
    """A checked property table: the table with ``flags``, ``severity``, ``diagnosis`` added."""

    def __init__(self, table: Any, run: Any, worst: int = 10):
        self.table = table
        self._run = run
        self._worst = worst
        self.summary: Dict[str, Any] = json.loads(run.summary_json(worst))

    @property
    def worst_severity(self) -> Optional[str]:
        """"error", "warning", "info", or None for a clean table."""
        return self._run.worst()

    def to_polars(self) -> pl.DataFrame:
        t = self.table
        return t if isinstance(t, pl.DataFrame) else pl.from_pandas(t) if hasattr(t, "iloc") else pl.DataFrame(t)

    def to_dict(self) -> Dict[str, Any]:
        """The summary: rows checked, flagged, counts per code, the worst rows (CLI's summary)."""
        return copy.deepcopy(self.summary)

    def report_html(self) -> str:
        """The self-contained HTML report ``ebullio check --report`` writes."""
        return self._run.html("DataFrame", "ebullio.check(...)")

    def _repr_html_(self) -> str:
        return iframe(self.report_html(), 700)

    def __str__(self) -> str:
        return self._run.summary_text(self._worst)

    def __repr__(self) -> str:
        s = self.summary
        return f"CheckResult({s['rows']} rows, {s['rows_flagged']} flagged: {s['errors']} error, {s['warnings']} warning, {s['infos']} info)"


class BoilResult:
    """Boiling temperatures at pressures (or vapor pressures at temperatures) from one source."""

    def __init__(self, report: Dict[str, Any]):
        self._report = report

    @property
    def source(self) -> str:
        return self._report["source"]

    @property
    def mode(self) -> str:
        """"boiling-temperature" or "vapor-pressure"."""
        return self._report["mode"]

    @property
    def notes(self) -> List[str]:
        return list(self._report["notes"])

    @property
    def cautions(self) -> List[str]:
        return list(self._report["cautions"])

    def to_dict(self) -> Dict[str, Any]:
        """The CLI's ``--format json`` report."""
        return copy.deepcopy(self._report)

    def to_polars(self) -> pl.DataFrame:
        """One row per pressure (or temperature): p/Pa, T/K, the 95 % interval, flags."""
        cols = {"p_pa": pl.Float64, "t_k": pl.Float64, "ci95_low_k": pl.Float64, "ci95_high_k": pl.Float64,
                "ci95_low_pa": pl.Float64, "ci95_high_pa": pl.Float64, "extrapolated": pl.Boolean,
                "error": pl.String}
        rows = [{k: r.get(k, "" if k == "error" else None) for k in cols} for r in self._report["results"]]
        return pl.DataFrame(rows, schema=cols)

    def _repr_html_(self) -> str:
        df = self.to_polars()
        head = "".join(f"<th>{html.escape(c)}</th>" for c in ("p / mbar", "t / °C", "95 % interval / °C", "note"))
        body = []
        for r in df.iter_rows(named=True):
            t = "" if r["t_k"] is None else f"{r['t_k'] - 273.15:.2f}"
            ci = ""
            if r["ci95_low_k"] is not None and r["ci95_high_k"] is not None:
                ci = f"{r['ci95_low_k'] - 273.15:.2f} .. {r['ci95_high_k'] - 273.15:.2f}"
            note = r["error"] or ("extrapolated" if r["extrapolated"] else "")
            p = "" if r["p_pa"] is None else f"{r['p_pa'] / 100:.3f}"
            body.append(f"<tr><td>{p}</td><td>{t}</td><td>{ci}</td><td>{html.escape(note)}</td></tr>")
        notes = "".join(f"<li>{html.escape(n)}</li>" for n in self.notes + self.cautions)
        return (f"<p><b>Source:</b> {html.escape(self.source)}</p><table><tr>{head}</tr>{''.join(body)}</table>"
                f"<ul>{notes}</ul>")

    def __repr__(self) -> str:
        return f"BoilResult({self.mode}, {len(self._report['results'])} point(s); source: {self.source})"


class VleResult:
    """A binary's vapor-liquid equilibrium: diagram, azeotropes, liquid split, flags."""

    def __init__(self, study: Dict[str, Any]):
        self._study = study

    @property
    def activity_model(self) -> str:
        return self._study["activity_model"]

    @property
    def azeotropes(self) -> List[Dict[str, Any]]:
        return copy.deepcopy(self._study.get("azeotropes", []))

    @property
    def flags(self) -> List[Dict[str, Any]]:
        return copy.deepcopy(self._study.get("flags", []))

    def to_dict(self) -> Dict[str, Any]:
        """The CLI's ``--format json`` study (without ``at_x1``)."""
        return copy.deepcopy(self._study)

    def to_polars(self) -> pl.DataFrame:
        """The diagram: one row per liquid composition x1 (bubble point, vapor y1, activity coefficients)."""
        return pl.DataFrame(self._study["diagram"])

    def _repr_html_(self) -> str:
        names = " / ".join(html.escape(c["name"]) for c in self._study["components"])
        az = "".join(f"<li>{html.escape(json.dumps(a))}</li>" for a in self.azeotropes) or "<li>none found</li>"
        fl = "".join(f"<li>[{html.escape(f['severity'])}] {html.escape(f['code'])}: {html.escape(f['message'])}</li>"
                     for f in self.flags)
        return (f"<p><b>VLE {names}</b> ({html.escape(self.activity_model)})</p><p>Azeotropes:</p><ul>{az}</ul>"
                f"<ul>{fl}</ul>" + self.to_polars()._repr_html_())

    def __repr__(self) -> str:
        names = " / ".join(c["name"] for c in self._study["components"])
        return f"VleResult({names}, {self.activity_model}, {len(self.azeotropes)} azeotrope(s))"
