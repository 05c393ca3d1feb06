"""ebullio.check adds the same flags, severity and diagnosis as `ebullio check` on the same table."""

import io

import polars as pl
import pytest

import ebullio
from conftest import DEMO, ROOT, cli, uncommented


def cli_checked(path) -> pl.DataFrame:
    out = cli("check", path, ok=(0, 1))
    return pl.read_csv(io.StringIO(out), infer_schema=False)


@pytest.mark.parametrize("name", ["supplier-properties.csv"])
def test_check_equals_cli(tmp_path, name):
    path = uncommented(DEMO / name, tmp_path)
    expected = cli_checked(path).select("flags", "severity", "diagnosis").fill_null("")
    # As text, the way the CLI reads a CSV ...
    got = ebullio.check(pl.read_csv(path, infer_schema=False))
    assert got.table.select("flags", "severity", "diagnosis").equals(expected)
    # ... and with the numbers typed, as a DataFrame usually is.
    typed = ebullio.check(pl.read_csv(path))
    assert typed.table.select("flags", "severity", "diagnosis").equals(expected)
    assert typed.summary["rows"] == got.table.height
    assert typed.summary["rows_flagged"] == (expected["flags"] != "").sum()


def test_check_solvent_sheet_equals_cli():
    path = ROOT / "examples" / "harrow-vale-solvent-sheet.csv"
    if path.read_text(encoding="utf-8").startswith("#"):
        pytest.skip("sheet has comment lines")
    expected = cli_checked(path).select("flags", "severity", "diagnosis").fill_null("")
    got = ebullio.check(pl.read_csv(path, infer_schema=False), constants=None)
    assert got.table.select("flags", "severity", "diagnosis").equals(expected)


def test_check_pandas_keeps_index_and_columns(tmp_path):
    pd = pytest.importorskip("pandas")
    path = uncommented(DEMO / "supplier-properties.csv", tmp_path)
    pdf = pd.read_csv(path)
    pdf.index = [f"r{i}" for i in range(len(pdf))]
    got = ebullio.check(pdf)
    assert isinstance(got.table, pd.DataFrame)
    assert list(got.table.index) == list(pdf.index)
    assert list(got.table.columns) == list(pdf.columns) + ["flags", "severity", "diagnosis"]
    assert "<iframe" in got._repr_html_()
    assert "checked" in str(got)


def test_check_bad_input():
    with pytest.raises(ebullio.InputError, match="constants"):
        ebullio.check(pl.DataFrame({"compound": ["x"], "A": [1.0], "B": [2.0], "C": [3.0]}), constants="log7,furlong,degC")
    with pytest.raises(ebullio.InputError, match="tolerance"):
        ebullio.check(pl.DataFrame({"compound": ["x"]}), tolerance=-1)
    with pytest.raises(ebullio.InputError) as e:
        ebullio.check(pl.DataFrame({"compound": ["x"], "Tb/K": [[1.0]]}))
    assert e.value.column == "Tb/K"
    # A cell that is not a number is a finding on its row, not an exception: the batch goes on.
    got = ebullio.check(pl.DataFrame({"compound": ["toluene", "ethanol"], "Tb/K": ["383.75", "hot"]}))
    assert got.table["flags"][0] == "" and got.table["flags"][1] != ""
