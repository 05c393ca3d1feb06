"""ebullio.fit equals `ebullio fit --format json` on the same data; bad input names the row."""

import polars as pl
import pytest

import ebullio
from conftest import DEMO, cli_json, no_nan, uncommented


def test_fit_equals_cli_json_multi_compound(tmp_path):
    path = uncommented(DEMO / "ebulliometer-2026.csv", tmp_path)
    df = pl.read_csv(path)
    r = ebullio.fit(df, at=["20 mbar", "85 degC"])
    expected = cli_json("fit", path, "--at", "20 mbar", "--at", "85 degC")
    expected = expected if isinstance(expected, list) else [expected]
    assert r.to_dict() == expected
    assert [f.compound for f in r] == [e.get("compound") for e in expected]
    no_nan(r.to_polars())
    for f in r:
        no_nan(f.to_polars().select(pl.col(pl.Float64)))


def test_fit_model_auto_and_units_in_headings(tmp_path):
    # t/°C and p/mmHg headings: the units come from the column names, as on the command line.
    path = uncommented(DEMO / "rotavap-log-2026.csv", tmp_path)
    df = pl.read_csv(path)
    r = ebullio.fit(df, model="auto")
    expected = cli_json("fit", path, "--model", "auto")
    assert r.to_dict() == (expected if isinstance(expected, list) else [expected])


def test_fit_of_a_path_equals_cli(tmp_path):
    path = uncommented(DEMO / "ebulliometer-2026.csv", tmp_path)
    expected = cli_json("fit", path, "--robust")
    assert ebullio.fit(str(path), robust=True).to_dict() == (expected if isinstance(expected, list) else [expected])


def test_fit_pandas_input(tmp_path):
    pd = pytest.importorskip("pandas")
    path = uncommented(DEMO / "ebulliometer-2026.csv", tmp_path)
    assert ebullio.fit(pd.read_csv(path)).to_dict() == ebullio.fit(pl.read_csv(path)).to_dict()


def test_fit_summary_and_html():
    df = pl.DataFrame({"T/K": [313.15, 333.15, 353.15, 373.15, 393.15], "p/kPa": [7.88, 18.87, 38.9, 74.4, 131.6]})
    r = ebullio.fit(df)
    row = r.to_polars().row(0, named=True)
    assert row["A"] == r[0].parameters["A"]
    assert row["tb_k"] == r[0].normal_boiling_point_k
    assert "<iframe" in r._repr_html_() and "<svg" in r.report_html()


def test_wrong_dtype_names_the_row():
    df = pl.DataFrame({"t/degC": [40.0, 60.0, 80.0], "p/kPa": ["7.9", "18.9", "lots"]})
    with pytest.raises(ebullio.InputError) as e:
        ebullio.fit(df)
    assert e.value.row == 2 and e.value.column == "p/kPa" and e.value.code == "not-a-number"
    assert "row 2" in str(e.value) and "'lots'" in str(e.value)


def test_nan_and_null_cells_name_the_row():
    df = pl.DataFrame({"t/degC": [40.0, float("nan"), 80.0], "p/kPa": [7.9, 18.9, 38.9]})
    with pytest.raises(ebullio.InputError) as e:
        ebullio.fit(df)
    assert e.value.row == 1 and e.value.column == "t/degC"
    df = pl.DataFrame({"t/degC": [40.0, 60.0, 80.0], "p/kPa": [7.9, None, 38.9]})
    with pytest.raises(ebullio.InputError) as e:
        ebullio.fit(df)
    assert e.value.row == 1 and e.value.code == "empty-cell"


def test_missing_column_and_unknown_unit():
    with pytest.raises(ebullio.InputError) as e:
        ebullio.fit(pl.DataFrame({"t/degC": [40.0, 60.0, 80.0], "pressure": [1.0, 2.0, 3.0]}))
    assert e.value.code in ("no-pressure-column", "heading-unit")
    with pytest.raises(ebullio.InputError) as e:
        ebullio.fit(pl.DataFrame({"t/degC": [40.0, 60.0, 80.0], "p/furlong": [1.0, 2.0, 3.0]}))
    assert e.value.code == "heading-unit" and e.value.column == "p/furlong"
    with pytest.raises(ebullio.InputError, match="at '20 furlongs'"):
        ebullio.fit(pl.DataFrame({"t/degC": [40.0, 60.0, 80.0], "p/kPa": [7.9, 18.9, 38.9]}), at="20 furlongs")
    with pytest.raises(ebullio.InputError, match="model"):
        ebullio.fit(pl.DataFrame({"t/degC": [40.0, 60.0, 80.0], "p/kPa": [7.9, 18.9, 38.9]}), model="spline")


def test_nested_column_and_not_a_frame():
    with pytest.raises(ebullio.InputError) as e:
        ebullio.fit(pl.DataFrame({"t/degC": [[40.0]], "p/kPa": [7.9]}))
    assert e.value.column == "t/degC"
    with pytest.raises(TypeError):
        ebullio.fit(42)


def test_exclude_equals_cli_exclude(tmp_path):
    # One point left out by number and one by temperature, as `--exclude` does; the result
    # records both, and a rule that names no point is refused naming the argument.
    path = uncommented(DEMO / "ebulliometer-2026.csv", tmp_path)
    df = pl.read_csv(path).filter(pl.col("compound") == "1-butanol").drop("compound")
    df.write_csv(tmp_path / "b.csv")
    r = ebullio.fit(df, exclude=[2, "338.11 K"])
    expected = cli_json("fit", tmp_path / "b.csv", "--exclude", "2", "--exclude", "338.11 K")
    assert r.to_dict() == [expected]
    assert len(expected["excluded"]) == 2
    with pytest.raises(ebullio.InputError, match="exclude"):
        ebullio.fit(df, exclude="line x")
    with pytest.raises(ebullio.InputError, match="exclude"):
        ebullio.fit(df, exclude=999)


def test_gauge_pressures_need_barometric(tmp_path):
    # The same points as gauge readings against an invented 1000 mbar site pressure.
    df = pl.DataFrame({"T/K": [313.15, 333.15, 353.15, 373.15, 393.15],
                       "p/kPa": [7.88, 18.87, 38.9, 74.4, 131.6]})
    gauge = df.select("T/K", (pl.col("p/kPa") / 100 - 1.0).alias("p/barg"))
    with pytest.raises(ebullio.InputError, match="barometric"):
        ebullio.fit(gauge)
    a = ebullio.fit(gauge, barometric="1000 mbar").to_dict()[0]
    b = ebullio.fit(df).to_dict()[0]
    assert abs(a["normal_boiling_point_k"]["value"] - b["normal_boiling_point_k"]["value"]) < 1e-6
