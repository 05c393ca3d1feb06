"""ebullio.boil equals `ebullio boil --format json` for each kind of source."""

import polars as pl
import pytest

import ebullio
from conftest import DEMO, cli_json, no_nan, uncommented


def test_boil_reference_compound_equals_cli():
    b = ebullio.boil("toluene", pressure=["15 mbar", "100 mbar", "1 atm"])
    expected = cli_json("boil", "--compound", "toluene", "-p", "15 mbar", "-p", "100 mbar", "-p", "1 atm")
    assert b.to_dict() == expected
    no_nan(b.to_polars())
    assert b.cautions  # vacuum cautions at 15 mbar


def test_boil_vapor_pressure_from_smiles_equals_cli():
    b = ebullio.boil(smiles="CCOC(C)=O", temperature=["50 degC", "70 degC"])
    expected = cli_json("boil", "--smiles", "CCOC(C)=O", "-t", "50 degC", "-t", "70 degC")
    assert b.to_dict() == expected
    assert b.mode == "vapor-pressure"


def test_boil_ranges_equal_cli():
    b = ebullio.boil(smiles="CCOC(C)=O", pressure_range="0.1 mmHg..1 atm", steps=7)
    assert b.to_dict() == cli_json("boil", "--smiles", "CCOC(C)=O", "--pressure-range", "0.1 mmHg..1 atm",
                                   "--steps", "7")
    b = ebullio.boil("toluene", temperature_range="20 degC..110 degC", steps=5)
    assert b.to_dict() == cli_json("boil", "--compound", "toluene", "--temperature-range", "20 degC..110 degC",
                                   "--steps", "5")


def test_boil_antoine_equals_cli():
    # Toluene, log10 mmHg degC constants as written in supplier-properties.csv (invented demo row).
    b = ebullio.boil(antoine=(6.92569, 1327.62, 217.625), constants="log10,mmHg,degC",
                     range="6 degC..137 degC", pressure="20 mbar")
    expected = cli_json("boil", "--antoine", "6.92569,1327.62,217.625", "--constants", "log10,mmHg,degC",
                        "--range", "6 degC..137 degC", "-p", "20 mbar")
    assert b.to_dict() == expected


def test_boil_from_a_fit_equals_cli_from_fit_file(tmp_path):
    path = uncommented(DEMO / "ebulliometer-2026.csv", tmp_path)
    fits = ebullio.fit(pl.read_csv(path))
    fit_json = tmp_path / "fit.json"
    import json
    fit_json.write_text(json.dumps(fits.to_dict()))
    name = fits[0].compound
    b = ebullio.boil(fit=fits[0], pressure="20 mbar")
    expected = cli_json("boil", "--from", fit_json, "--compound", name, "-p", "20 mbar")
    assert b.to_dict()["results"] == expected["results"]


def test_boil_bad_input():
    with pytest.raises(ebullio.InputError, match="exactly one source"):
        ebullio.boil(pressure="1 atm")
    with pytest.raises(ebullio.InputError, match="pressure"):
        ebullio.boil("toluene", pressure="1 furlong")
    with pytest.raises(ebullio.InputError):
        ebullio.boil("no-such-compound-xyz", pressure="1 atm")
    with pytest.raises(ebullio.InputError, match="not both"):
        ebullio.boil("toluene", pressure="1 atm", temperature="50 degC")


def test_boil_gauge_pressure_with_barometric_equals_cli():
    with pytest.raises(ebullio.InputError, match="barometric"):
        ebullio.boil("water", pressure="0 barg")
    b = ebullio.boil("water", pressure="0 barg", barometric="1013.25 mbar")
    assert b.to_dict() == cli_json("boil", "--compound", "water", "--pressure", "0 barg",
                                   "--barometric", "1013.25 mbar")
    # IAPWS-IF97: water boils at 373.124 K at 101.325 kPa.
    assert abs(b.to_polars()["t_k"][0] - 373.124) < 0.01
