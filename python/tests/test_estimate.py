"""ebullio.estimate / estimate_frame equal `ebullio estimate --format json`; bad input is named."""

import math

import polars as pl
import pytest

import ebullio
from conftest import DEMO, ROOT, cli_json, no_nan, uncommented

DEV = ROOT / "reference-data" / "normal-boiling-points-dev.csv"

# Columns of the frame that the JSON row carries under the same name.
SAME = ["tb_k", "tb_pi90_low_k", "tb_pi90_high_k", "tb_typical_error_k", "tb_joback_k",
        "tb_stein_brown_k", "tm_k", "tc_k", "pc_bar", "vc_cm3_mol", "hf_kj_mol", "gf_kj_mol",
        "hvap_tb_kj_mol", "hfus_kj_mol", "omega", "formula", "error", "compound"]


def assert_frame_matches_json(frame: pl.DataFrame, rows):
    assert frame.height == len(rows)
    for got, exp in zip(frame.iter_rows(named=True), rows):
        for k in SAME:
            if k in got:
                e = exp.get(k)
                if isinstance(e, float) and not math.isfinite(e):
                    e = None
                assert got[k] == (e if e is not None or k not in ("error",) else ""), (k, got[k], e)
        for i, a in enumerate(exp.get("at", [])):
            p = a["p_pa"]
            p = int(p) if p == int(p) else p  # the column is named as Rust prints the number
            assert got[f"t_k_at_{p}_pa"] == a["t_k"]
        if exp.get("groups"):
            assert got["groups"] == ";".join(f"{k}={v}" for k, v in exp["groups"].items())


def test_estimate_list_equals_cli_json():
    smiles = ["CCO", "c1ccccc1", "CCOC(C)=O", "C1CC1(", "CC(C)(C)O", "OCCO"]
    est = ebullio.estimate(smiles, at=["20 mbar", "1 atm"])
    args = [a for s in smiles for a in ("--smiles", s)]
    expected = cli_json("estimate", *args, "--at", "20 mbar", "--at", "1 atm")
    assert est.to_dict() == expected
    assert_frame_matches_json(est.to_polars(), expected)
    no_nan(est.to_polars())


def test_estimate_with_measured_anchor_equals_cli():
    est = ebullio.estimate(["COc1ccc(CCO)cc1"], measured="95 degC at 0.5 mmHg", at="10 mbar")
    expected = cli_json("estimate", "--smiles", "COc1ccc(CCO)cc1", "--measured", "95 degC at 0.5 mmHg",
                        "--at", "10 mbar")
    assert est.to_dict() == [expected]
    assert est.to_polars()["anchored_tb_k"][0] == expected["anchored"]["tb_k"]


def test_estimate_frame_equals_cli_input_file(tmp_path):
    path = uncommented(DEMO / "new-structures.csv", tmp_path)
    df = pl.read_csv(path, infer_schema=False)
    out = ebullio.estimate_frame(df, at="20 mbar")
    expected = cli_json("estimate", "--input", path, "--at", "20 mbar")
    assert out.columns[: len(df.columns)] == df.columns
    assert_frame_matches_json(out, expected)
    # The dev set: 63 structures, same numbers again.
    dev = pl.read_csv(DEV).select("compound", "smiles", "source")  # measured tb_k, tc_k would clash
    out = ebullio.estimate_frame(dev)
    assert_frame_matches_json(out, cli_json("estimate", "--input", DEV))
    no_nan(out)


def test_pandas_and_pyarrow_inputs_agree():
    pd = pytest.importorskip("pandas")
    pa = pytest.importorskip("pyarrow")
    dev = pl.read_csv(DEV).select("compound", "smiles", "source")
    ref = ebullio.estimate_frame(dev)
    pdf = dev.to_pandas()
    pdf.index = pdf.index + 100
    got = ebullio.estimate_frame(pdf)
    assert isinstance(got, pd.DataFrame) and list(got.index) == list(pdf.index)
    assert pl.from_pandas(got).equals(ref)
    by_arrow = ebullio.estimate(pa.array(dev["smiles"].to_list())).to_polars()
    by_list = ebullio.estimate(dev["smiles"].to_list()).to_polars()
    assert by_arrow.equals(by_list)
    assert ebullio.estimate_frame(dev.to_arrow()).num_rows == dev.height


def test_bad_rows_do_not_stop_the_batch():
    out = ebullio.estimate(["CCO", "", None, "C1CC1(", "CCC"]).to_polars()
    assert out["error"].to_list()[0] == "" and out["error"].to_list()[4] == ""
    assert all(e != "" for e in out["error"].to_list()[1:4])


def test_wrong_dtype_missing_column_unknown_unit():
    with pytest.raises(ebullio.InputError) as e:
        ebullio.estimate_frame(pl.DataFrame({"smiles": [1, 2]}))
    assert e.value.column == "smiles" and e.value.row == 0
    with pytest.raises(ebullio.InputError) as e:
        ebullio.estimate(["CCO", 5])
    assert e.value.row == 1
    with pytest.raises(ebullio.InputError) as e:
        ebullio.estimate_frame(pl.DataFrame({"structure": ["CCO"]}))
    assert "no column 'smiles'" in str(e.value) and "structure" in str(e.value)
    with pytest.raises(ebullio.InputError, match="20 furlongs"):
        ebullio.estimate(["CCO"], at="20 furlongs")
    with pytest.raises(ebullio.InputError, match="TEMPERATURE at PRESSURE"):
        ebullio.estimate(["CCO"], measured="95 degC")
    with pytest.raises(ebullio.InputError, match="already has"):
        ebullio.estimate_frame(pl.DataFrame({"smiles": ["CCO"], "tb_k": [1.0]}))


def test_report_html():
    est = ebullio.estimate(["CCO"])
    assert "<iframe" in est._repr_html_() and "CCO" in est.report_html()
