#!/usr/bin/env python3
"""Peer for the table benchmark: a hand-written polars pipeline.

Reads the property table (compound, smiles, Tb/K, A, B, C, convention), computes the normal
boiling point implied by the Antoine constants in each row's convention (log10 or ln;
Pa, kPa, bar, mmHg, Torr, atm; degC or K), flags rows whose listed Tb disagrees by more than
5 K (warning) or 15 K (error) or whose constants give no boiling point, and writes the table
back with `tb_antoine_k`, `flags` and `severity` columns.
Usage: peer_table.py IN.csv OUT.csv
"""

import math
import sys
import time

import polars as pl

PA_PER = {"Pa": 1.0, "kPa": 1e3, "MPa": 1e6, "bar": 1e5, "mbar": 100.0,
          "mmHg": 133.322387415, "Torr": 101_325.0 / 760.0, "atm": 101_325.0}


def main():
    src, dst = sys.argv[1], sys.argv[2]
    t0 = time.perf_counter()
    df = pl.read_csv(src, schema_overrides={"Tb/K": pl.Float64, "A": pl.Float64,
                                            "B": pl.Float64, "C": pl.Float64})
    t1 = time.perf_counter()
    parts = pl.col("convention").str.split_exact(",", 2)
    base = parts.struct.field("field_0").str.strip_chars()
    punit = parts.struct.field("field_1").str.strip_chars()
    tunit = parts.struct.field("field_2").str.strip_chars()
    ln_base = pl.when(base == "log10").then(math.log(10.0)).when(base == "ln").then(1.0).otherwise(None)
    pa_per = punit.replace_strict(PA_PER, default=None, return_dtype=pl.Float64)
    t_off = pl.when(tunit.is_in(["degC", "°C", "C"])).then(273.15).when(tunit == "K").then(0.0).otherwise(None)
    y_atm = (pl.lit(101_325.0) / pa_per).log() / ln_base
    denom = pl.col("A") - y_atm
    t_own = pl.col("B") / denom - pl.col("C")
    out = (
        df.lazy()
        .with_columns(
            pl.when(denom > 0).then(t_own + t_off).otherwise(None).alias("tb_antoine_k")
        )
        .with_columns((pl.col("Tb/K") - pl.col("tb_antoine_k")).abs().alias("_d"))
        .with_columns(
            pl.when(pl.col("tb_antoine_k").is_null() | (pl.col("tb_antoine_k") <= 0))
            .then(pl.lit("antoine-no-boiling-point"))
            .when(pl.col("_d") > 15.0).then(pl.lit("tb-antoine-disagree"))
            .when(pl.col("_d") > 5.0).then(pl.lit("tb-antoine-differ"))
            .otherwise(pl.lit("")).alias("flags"),
        )
        .with_columns(
            pl.when(pl.col("flags") == "").then(pl.lit(""))
            .when(pl.col("flags") == "tb-antoine-differ").then(pl.lit("warning"))
            .otherwise(pl.lit("error")).alias("severity")
        )
        .drop("_d")
        .collect()
    )
    t2 = time.perf_counter()
    out.write_csv(dst)
    t3 = time.perf_counter()
    n = out.height
    flagged = out.filter(pl.col("flags") != "").height
    print(
        f"peer_table: {n} rows, {flagged} flagged; read {t1 - t0:.2f} s, compute {t2 - t1:.2f} s, "
        f"write {t3 - t2:.2f} s ({n / (t3 - t0):.0f} rows/s end to end)",
        file=sys.stderr,
    )


if __name__ == "__main__":
    main()
