"""The [gas_model] table: the ideal gas warned about at pressure, the real gas attached to the
property model, its dense-gas and near-critical warnings, and clear errors."""

from pathlib import Path

import numpy as np
import pytest

from traywise.case.load import parse_case
from traywise.errors import CaseError

CASES = Path(__file__).resolve().parents[1] / "cases"
SOUR = (CASES / "sour-gas-water-wash.toml").read_text(encoding="utf-8")
OIL = (CASES / "lean-oil-absorber.toml").read_text(encoding="utf-8")


def without_gas_model(text):
    return text.replace('[gas_model]\nmodel = "peng_robinson"\n', "")


def test_ideal_gas_at_20_bar_is_warned_about():
    case = parse_case(without_gas_model(SOUR), "sour.toml")
    assert case.model.gas_phase is None
    assert any("treated as ideal" in w and "peng_robinson" in w for w in case.warnings)


def test_real_gas_is_attached_and_echoed():
    case = parse_case(SOUR, "sour.toml")
    assert case.model.gas_phase is not None and case.echo["gas_model"]["model"] == "peng_robinson"
    phi = case.model.gas_phase.fugacity_coefficients(np.array([303.15]), np.array([20e5]))[0]
    # CO2 and H2S about 0.91 and 0.89 in the 30 % CO2 feed gas (Peng-Robinson, E-PPR78 k_ij)
    assert 0.88 < phi[1] < 0.94 and 0.85 < phi[2] < 0.92
    assert not any("treated as ideal" in w for w in case.warnings)


def test_eos_liquid_needs_the_real_gas():
    with pytest.raises(CaseError, match="peng_robinson"):
        parse_case(without_gas_model(OIL), "oil.toml")


def test_unknown_gas_model_is_refused_with_the_choices():
    with pytest.raises(CaseError, match="ideal.*peng_robinson|peng_robinson.*ideal"):
        parse_case(SOUR.replace('model = "peng_robinson"', 'model = "virial"'), "sour.toml")


def test_dense_gas_is_warned_about():
    dense = SOUR.replace('top_pressure = "20 bar"', 'top_pressure = "120 bar"')
    case = parse_case(dense, "sour.toml")
    assert any("the gas is dense" in w for w in case.warnings)


def test_liquid_near_its_critical_point_is_warned_about():
    case = parse_case(SOUR, "sour.toml")
    # water's critical temperature is 647.1 K: 0.85 of it is 550 K
    assert case.model.range_warnings(np.array([300.0, 560.0])) and any(
        "critical temperature" in w for w in case.model.range_warnings(np.array([300.0, 560.0])))
    assert not any("critical temperature" in w for w in case.model.range_warnings(np.array([300.0, 320.0])))
