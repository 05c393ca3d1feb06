"""ebullio: vapor-pressure fits, boiling points from structure and property-table checks.

The same Rust library as the ``ebullio`` command, for polars (and pandas) users. Every
function gives the numbers the command gives on the same input; units are in column names
as on the command line (``T/K``, ``t/degC``, ``p/kPa``, ``p/mmHg``); bad input raises
:class:`InputError` naming the row and column. Batch calls release the GIL and run on the
library's thread pool.

>>> import polars as pl, ebullio
>>> est = ebullio.estimate(["CCO", "c1ccccc1"])
>>> est.to_polars().select("smiles", "tb_k").height
2

Estimates, fits and checks are screening aids, not measurements: review them before they
feed a distillation (local codes, process-safety review).
"""

from __future__ import annotations

import json
import os
from typing import Any, Iterable, Optional, Sequence, Tuple, Union

import polars as pl

from . import _ebullio
from ._ebullio import InputError
from ._frames import InputError_from, back, string_series, to_polars
from ._results import BoilResult, CheckResult, Estimates, Fit, FitResult, VleResult

__all__ = [
    "fit", "estimate", "estimate_frame", "check", "boil", "vle", "InputError",
    "Fit", "FitResult", "Estimates", "CheckResult", "BoilResult", "VleResult", "__version__",
]
__version__: str = _ebullio.version()

PathLike = Union[str, "os.PathLike[str]"]


def _strings(v: Union[str, Iterable[str], None]) -> list:
    if v is None:
        return []
    if isinstance(v, str):
        return [v]
    return [str(x) for x in v]


def fit(
    data: Any,
    model: str = "antoine",
    *,
    at: Union[str, Iterable[str]] = (),
    robust: bool = False,
    constants: str = "log10,mmHg,degC",
    tc: Optional[str] = None,
    pc: Optional[str] = None,
    compound: Optional[str] = None,
    smiles: Optional[str] = None,
    t_unit: Optional[str] = None,
    p_unit: Optional[str] = None,
    ref_p_tolerance_pct: float = 2.0,
    ref_tb_tolerance_k: float = 0.5,
    exclude: Union[str, int, Iterable[Union[str, int]]] = (),
    barometric: Optional[str] = None,
) -> FitResult:
    """Fit a vapor-pressure equation to measured (T, p) points, one fit per compound.

    ``data`` is a polars or pandas DataFrame (or a CSV/Parquet path, read as ``ebullio fit``
    reads it) with a temperature and a pressure column whose headings carry the unit
    (``T/K``, ``t/degC``, ``p/kPa``, ``p/mmHg``), optional ``u(T)/K`` and ``u(p)/kPa`` columns
    and an optional ``compound`` column. ``model`` is ``antoine`` (the CLI's default),
    ``clapeyron``, ``riedel``, ``wagner`` (with ``tc`` and ``pc``) or ``auto`` (lowest AICc).
    ``at`` adds predictions: a pressure ("20 mbar") gives a boiling point, a temperature
    ("85 degC") a vapor pressure. ``exclude`` leaves points out, as ``--exclude`` does: by
    number in the points table (``4``), by temperature (``"80 degC"``) or, for a file, by
    line (``"line:5"``); the result records what was left out. ``barometric`` ("1013 mbar")
    makes gauge pressures (``p/barg``) absolute. The other options are the CLI's flags.

    >>> import polars as pl, ebullio
    >>> df = pl.DataFrame({"t/degC": [40.0, 60.0, 80.0, 100.0, 120.0],
    ...                    "p/kPa": [7.88, 18.87, 38.90, 74.40, 131.6]})
    >>> r = ebullio.fit(df)
    >>> r[0].model, r[0].ok
    ('antoine', True)
    >>> 380 < r[0].normal_boiling_point_k < 390  # invented points, a water-like curve
    True
    """
    csv: Optional[bytes] = None
    path: Optional[str] = None
    if isinstance(data, (str, os.PathLike)):
        path = os.fspath(data)
    else:
        df, _ = to_polars(data, "data")
        _plain_columns(df)
        try:
            csv = df.write_csv().encode("utf-8")
        except Exception as e:  # a column polars cannot write as text
            raise InputError(f"DataFrame: cannot be read as a table of values: {e}") from None
    run = _ebullio.fit(
        csv, path, model, _strings(at), robust, constants, tc, pc, compound, smiles,
        t_unit, p_unit, float(ref_p_tolerance_pct), float(ref_tb_tolerance_k),
        _strings([exclude] if isinstance(exclude, int) else exclude), barometric,
    )
    return FitResult(run)


def _plain_columns(df: pl.DataFrame) -> None:
    """Refuse nested columns (lists, structs) up front, naming the column."""
    for name, dtype in df.schema.items():
        if dtype.is_nested() or dtype == pl.Object:
            raise InputError_from(
                f"DataFrame, column '{name}': holds {dtype}; expected numbers or text",
                column=name, code="column-type",
            )


def estimate(
    smiles: Union[str, Iterable[str], pl.Series, Any],
    *,
    at: Union[str, Iterable[str]] = (),
    measured: Union[str, Iterable[str]] = (),
    names: Optional[Union[Iterable[str], pl.Series, Any]] = None,
) -> Estimates:
    """Estimate normal boiling points (Joback, Stein-Brown), critical constants and a
    Lee-Kesler vapor-pressure curve from structures (SMILES), as ``ebullio estimate`` does.

    ``smiles`` is a polars/pandas Series, a pyarrow array (crosses as Arrow, not copied) or a
    list. ``at`` adds boiling points at pressures ("20 mbar"); ``measured`` ("95 degC at
    0.5 mmHg", one or two) anchors the curve. A structure that cannot be read gives a row
    with ``error`` set; the batch never stops on one bad row. Each boiling point carries a
    calibrated 90 % interval (``tb_pi90_low_k``, ``tb_pi90_high_k``).

    >>> import ebullio
    >>> e = ebullio.estimate(["CCOC(C)=O", "C1CC1(", "CCO"], at="20 mbar")
    >>> e.to_polars()["error"].to_list()[1] != ""
    True
    >>> [c for c in e.to_polars().columns if c.startswith("t_k_at")]
    ['t_k_at_2000_pa']
    """
    s = string_series(smiles, "smiles")
    n = None if names is None else string_series(names, "names")
    stream, run = _ebullio.estimate(s, n, _strings(at), _strings(measured), True)
    return Estimates(pl.DataFrame(stream), run)


def estimate_frame(
    df: Any,
    smiles_column: str = "smiles",
    *,
    at: Union[str, Iterable[str]] = (),
    measured: Union[str, Iterable[str]] = (),
) -> Any:
    """The DataFrame with estimate columns appended (``formula``, ``tb_k`` ... ``error``, the
    CLI's CSV columns at full precision); polars in, polars out; pandas in, pandas out (same
    index). Built for ``dask.dataframe.map_partitions`` and Spark's ``mapInArrow``: no state
    is kept between calls, and the result depends on each row alone.

    >>> import polars as pl, ebullio
    >>> out = ebullio.estimate_frame(pl.DataFrame({"id": [1, 2], "smiles": ["CCO", "CCCO"]}))
    >>> out.columns[:4]
    ['id', 'smiles', 'formula', 'tb_k']
    """
    frame, kind = to_polars(df, "df")
    if smiles_column not in frame.columns:
        raise InputError_from(
            f"DataFrame: no column '{smiles_column}' (columns: {', '.join(frame.columns) or 'none'}); "
            "choose the structure column with smiles_column=",
            column=smiles_column, code="missing-column",
        )
    s = string_series(frame[smiles_column], smiles_column)
    stream, _ = _ebullio.estimate(s, None, _strings(at), _strings(measured), False)
    added = pl.DataFrame(stream).drop("smiles")
    clash = [c for c in added.columns if c in frame.columns]
    if clash:
        raise InputError_from(
            f"DataFrame: already has column(s) {', '.join(clash)}, which the estimate adds; rename them first",
            column=clash[0], code="column-clash",
        )
    out = pl.concat([frame, added], how="horizontal")
    result = back(out, kind)
    if kind == "pandas":
        result.index = df.index
    return result


def check(
    table: Any,
    *,
    constants: Optional[str] = None,
    tolerance: float = 1.0,
    reference_table: Optional[PathLike] = None,
    bundled_reference: bool = True,
    structure: bool = True,
    worst: int = 10,
) -> CheckResult:
    """Screen a property table for slips and outliers, as ``ebullio check`` does.

    The table (polars or pandas; columns cross as Arrow) keeps every row and column and gets
    ``flags`` (``;``-separated codes), ``severity`` (worst) and ``diagnosis``. Findings name
    rows by the line the row would have in the table's CSV (row index + 2), as the CLI does.
    ``constants`` is the convention of A, B, C when the table has no convention column.

    >>> import polars as pl, ebullio
    >>> t = pl.DataFrame({"compound": ["toluene", "ethanol"], "tb/degC": [110.6, 7.83]})
    >>> r = ebullio.check(t)
    >>> r.table["flags"].to_list()[0]
    ''
    >>> r.worst_severity in ("warning", "error")
    True
    """
    frame, kind = to_polars(table, "table")
    _plain_columns(frame)
    cols = [(name, frame[name]) for name in frame.columns]
    stream, run = _ebullio.check(
        cols, constants, float(tolerance),
        None if reference_table is None else os.fspath(reference_table),
        bundled_reference, structure,
    )
    added = pl.DataFrame(stream)
    out = pl.concat([frame, added], how="horizontal") if frame.height else frame.with_columns(
        [pl.Series(c, [], dtype=pl.String) for c in added.columns])
    result = back(out, kind)
    if kind == "pandas":
        result.index = table.index
    return CheckResult(result, run, worst)


def boil(
    compound: Optional[str] = None,
    *,
    pressure: Union[str, Iterable[str]] = (),
    temperature: Union[str, Iterable[str]] = (),
    smiles: Optional[str] = None,
    antoine: Optional[Tuple[float, float, float]] = None,
    constants: Optional[str] = None,
    range: Optional[str] = None,
    fit: Optional[Fit] = None,
    reference_table: Optional[PathLike] = None,
    pressure_range: Optional[str] = None,
    temperature_range: Optional[str] = None,
    steps: int = 10,
    barometric: Optional[str] = None,
) -> BoilResult:
    """Boiling temperature at pressures (or vapor pressure at temperatures), as ``ebullio boil``.

    The source is one of: a bundled reference ``compound`` (name, synonym or CAS; or from your
    own ``reference_table``), ``smiles`` (structure estimate), ``antoine=(A, B, C)`` with
    ``constants`` (and optionally ``range="20 degC..110 degC"``), or a :class:`Fit`.
    Quantities carry their unit: ``pressure="15 mbar"``, ``temperature=["85 degC", "90 degC"]``;
    ``pressure_range="1 mbar..1 atm"`` (log-spaced) or ``temperature_range="20 degC..110 degC"``
    (evenly spaced) add ``steps`` points. Gauge pressures (``"-0.98 barg"``) need the site's
    ``barometric`` pressure (``"1013 mbar"``).

    >>> import ebullio
    >>> b = ebullio.boil("toluene", pressure="1 atm")
    >>> 383 < b.to_polars()["t_k"][0] < 384
    True
    """
    fit_json = None
    if fit is not None:
        if not isinstance(fit, Fit):
            raise TypeError("fit: expected an ebullio.Fit (an element of ebullio.fit(...))")
        if not fit.ok:
            raise InputError(f"fit: {fit.compound or 'data'} was not fitted: {fit.error}")
        fit_json = json.dumps(fit.to_dict())
    report = _ebullio.boil(
        _strings(pressure), _strings(temperature),
        None if antoine is None else tuple(float(x) for x in antoine),
        constants, range, compound,
        None if reference_table is None else os.fspath(reference_table),
        fit_json, smiles, pressure_range, temperature_range, int(steps), barometric,
    )
    return BoilResult(json.loads(report))


def vle(
    *compounds: str,
    smiles: Union[str, Iterable[str]] = (),
    pressure: Optional[str] = None,
    temperature: Optional[str] = None,
    model: Optional[str] = None,
    wilson: Optional[Sequence[float]] = None,
    nrtl: Optional[Tuple[float, float, float]] = None,
    points: int = 101,
    barometric: Optional[str] = None,
) -> VleResult:
    """Vapor-liquid equilibrium of a binary, as ``ebullio vle``: the T-x-y diagram at a
    pressure (default 1 atm) or p-x-y at a ``temperature``, every azeotrope, and whether the
    liquid splits. Components are bundled reference ``compounds`` (names, synonyms, CAS) then
    ``smiles`` ("SMILES name"), two in all. ``model`` is ``unifac`` (default when both
    structures are known), ``wilson`` (``wilson=(a12, a21[, v1, v2])``, K), ``nrtl``
    (``nrtl=(b12, b21, alpha)``, K) or ``ideal``. Predicted azeotropes must be confirmed with
    measured mixture data.

    >>> import ebullio
    >>> v = ebullio.vle("ethanol", "water", pressure="1 atm")
    >>> v.to_polars().height, v.activity_model
    (101, 'unifac')
    """
    report = _ebullio.vle(list(compounds), _strings(smiles), pressure, temperature, model,
                          None if wilson is None else [float(x) for x in wilson],
                          None if nrtl is None else [float(x) for x in nrtl], int(points),
                          barometric)
    return VleResult(json.loads(report))


def threads() -> int:
    """Threads of the Rust pool batch calls run on (set RAYON_NUM_THREADS before import to change)."""
    return _ebullio.threads()
