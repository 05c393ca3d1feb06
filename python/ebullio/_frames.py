"""DataFrame plumbing: polars inside; pandas and pyarrow accepted and given back via Arrow."""

from __future__ import annotations

import html
from typing import Any, Tuple

import polars as pl


def to_polars(data: Any, what: str = "data") -> Tuple[pl.DataFrame, str]:
    """(polars DataFrame, kind) where kind is "polars", "pandas" or "arrow" (to give back the same)."""
    if isinstance(data, pl.DataFrame):
        return data, "polars"
    if isinstance(data, pl.LazyFrame):
        return data.collect(), "polars"
    mod = type(data).__module__
    if mod.startswith("pandas"):
        if hasattr(data, "columns"):
            return pl.from_pandas(data), "pandas"
        raise TypeError(f"{what}: expected a DataFrame, not a pandas {type(data).__name__}")
    if hasattr(data, "__arrow_c_stream__") and hasattr(data, "schema"):
        return pl.DataFrame(data), "arrow"
    if isinstance(data, dict):
        return pl.DataFrame(data), "polars"
    raise TypeError(
        f"{what}: expected a polars or pandas DataFrame (or a pyarrow Table), not {type(data).__name__}"
    )


def back(df: pl.DataFrame, kind: str) -> Any:
    """The frame in the caller's kind."""
    if kind == "pandas":
        return df.to_pandas()
    if kind == "arrow":
        return df.to_arrow()
    return df


def string_series(values: Any, what: str) -> pl.Series:
    """A polars String Series from a Series, list, tuple, pandas Series or pyarrow array."""
    if isinstance(values, str):
        values = [values]
    if isinstance(values, pl.Series):
        s = values
    elif type(values).__module__.startswith("pandas"):
        s = pl.from_pandas(values)
    elif hasattr(values, "__arrow_c_stream__") or hasattr(values, "__arrow_c_array__"):
        s = pl.Series(values)
    else:
        values = list(values)
        for i, v in enumerate(values):
            if v is not None and not isinstance(v, str):
                raise InputError_from(
                    f"{what}: row {i} holds {type(v).__name__} ({v!r}); expected text (SMILES strings)",
                    row=i, column=what, code="column-type",
                )
        s = pl.Series(what, values, dtype=pl.String)
    if s.dtype == pl.Null:
        s = s.cast(pl.String)
    if s.dtype not in (pl.String, pl.Categorical, pl.Enum):
        bad = next((i for i, v in enumerate(s.to_list()) if v is not None and not isinstance(v, str)), 0)
        raise InputError_from(
            f"{what}: row {bad} holds {s.dtype} ({s[bad]!r}); expected text (SMILES strings)",
            row=bad,
            column=what,
            code="column-type",
        )
    return s.cast(pl.String)


def InputError_from(message: str, **place: Any) -> Exception:
    """An InputError with place attributes (row, column, code), as the Rust side raises them."""
    from ._ebullio import InputError

    err = InputError(message)
    for key in ("file", "line", "row", "column", "code"):
        setattr(err, key, place.get(key))
    return err


def iframe(document: str, height: int = 600) -> str:
    """A self-contained HTML report shown inside a notebook without its styles leaking out."""
    return (
        f'<iframe srcdoc="{html.escape(document, quote=True)}" '
        f'style="width:100%;height:{height}px;border:1px solid #ccc" sandbox=""></iframe>'
    )
