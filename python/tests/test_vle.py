"""ebullio.vle equals `ebullio vle --format json` on the same binary."""

import pytest

import ebullio
from conftest import cli_json, no_nan


def test_vle_reference_pair_equals_cli():
    v = ebullio.vle("ethanol", "water", pressure="1 atm")
    assert v.to_dict() == cli_json("vle", "--compound", "ethanol", "--compound", "water", "--pressure", "1 atm")
    no_nan(v.to_polars())


def test_vle_structures_isothermal_and_models_equal_cli():
    v = ebullio.vle(smiles=["CC(C)=O acetone", "CO methanol"], temperature="50 degC", points=21)
    assert v.to_dict() == cli_json("vle", "--smiles", "CC(C)=O acetone", "--smiles", "CO methanol",
                                   "--temperature", "50 degC", "--points", "21")
    v = ebullio.vle("ethanol", "water", wilson=(300.0, 900.0), points=11)
    assert v.to_dict() == cli_json("vle", "--compound", "ethanol", "--compound", "water",
                                   "--wilson", "300,900", "--points", "11")
    v = ebullio.vle("ethanol", "water", nrtl=(-50.0, 700.0, 0.3), points=11)
    assert v.to_dict() == cli_json("vle", "--compound", "ethanol", "--compound", "water",
                                   "--nrtl", "-50,700,0.3", "--points", "11")


def test_vle_bad_input():
    with pytest.raises(ebullio.InputError, match="exactly two"):
        ebullio.vle("ethanol")
    with pytest.raises(ebullio.InputError, match="pressure"):
        ebullio.vle("ethanol", "water", pressure="1 furlong")
    with pytest.raises(ebullio.InputError, match="model"):
        ebullio.vle("ethanol", "water", model="magic")
    with pytest.raises(ebullio.InputError, match="points"):
        ebullio.vle("ethanol", "water", points=3)
