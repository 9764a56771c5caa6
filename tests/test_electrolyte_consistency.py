"""Thermodynamic consistency of the electrolyte liquid: partial molar enthalpies from one
Gibbs energy (finite differences of the total liquid enthalpy), the implicit-function
derivatives against finite differences, and Gibbs-Duhem."""

import numpy as np
import pytest

from support.electrolyte import ElectrolyteCase

CASES = {
    "sour water": (("NH3", "CO2", "H2S"), [[1.5, 0.4, 0.2], [0.3, 0.2, 0.05]], [300.0, 330.0]),
    "caustic scrubber": (("SO2", "HCl", "NaOH"), [[0.05, 0.1, 0.4], [0.2, 0.3, 0.3]], [295.0, 320.0]),
    "acid wash": (("NH3", "SO2", "HCl"), [[0.8, 0.2, 0.1], [0.01, 0.5, 1.0]], [290.0, 310.0]),
    "everything": (("NH3", "CO2", "H2S", "SO2", "HCl", "NaOH"), [[0.6, 0.2, 0.1, 0.05, 0.05, 0.3]], [305.0]),
    "hydrochloric acid": (("HCl",), [[3.0], [4.8]], [293.15, 313.15]),
}
PRESSURE = 1.2e5


def _setup(name):
    solutes, molalities, t = CASES[name]
    case = ElectrolyteCase(*solutes)
    return case, np.array(t), case.mole_fractions(molalities)


@pytest.mark.parametrize("name", CASES)
def test_partial_molar_enthalpies_are_derivatives_of_the_liquid_enthalpy(name):
    """h_L,i = dH_liquid/dn_i at fixed T and the other amounts, to 1e-6 relative (central
    differences of H = sum n_j h_L,j); h_L,i = h_V,i - R T**2 dlnK_i/dT by construction."""
    case, t, x = _setup(name)
    props = case.properties(t, PRESSURE, x)
    c = x.shape[1]
    for i in range(c):
        step = 1e-6 * x[:, i]
        enthalpies = []
        for sign in (1.0, -1.0):
            n = x.copy()
            n[:, i] += sign * step
            shifted = case.properties(t, PRESSURE, n / n.sum(axis=1, keepdims=True))
            enthalpies.append((shifted.h_liquid * n).sum(axis=1))
        numeric = (enthalpies[0] - enthalpies[1]) / (2.0 * step)
        assert numeric == pytest.approx(props.h_liquid[:, i], rel=1e-6, abs=1e-3), case.components[i].name


@pytest.mark.parametrize("name", CASES)
def test_temperature_derivatives_match_finite_differences(name):
    case, t, x = _setup(name)
    props = case.properties(t, PRESSURE, x)
    up, down = case.properties(t + 0.01, PRESSURE, x), case.properties(t - 0.01, PRESSURE, x)
    volatile = [i for i, s in enumerate(("water",) + case.solutes) if s != "NaOH"]
    with np.errstate(invalid="ignore"):  # NaOH: ln K = -inf on both sides
        numeric = (up.ln_k - down.ln_k) / 0.02
    assert props.dlnk_dt[:, volatile] == pytest.approx(numeric[:, volatile], rel=1e-5, abs=1e-7)
    numeric_h = (up.h_liquid - down.h_liquid) / 0.02
    assert props.dh_liquid_dt == pytest.approx(numeric_h, rel=1e-4, abs=1e-2)


@pytest.mark.parametrize("name", CASES)
def test_composition_derivatives_match_finite_differences(name):
    case, t, x = _setup(name)
    props = case.properties(t, PRESSURE, x)
    volatile = [i for i, s in enumerate(("water",) + case.solutes) if s != "NaOH"]
    for k in range(x.shape[1]):
        step = 1e-6 * x[:, k]
        plus, minus = x.copy(), x.copy()
        plus[:, k] += step
        minus[:, k] -= step
        with np.errstate(invalid="ignore"):  # NaOH: ln K = -inf on both sides
            numeric = (case.properties(t, PRESSURE, plus).ln_k - case.properties(t, PRESSURE, minus).ln_k) / (2.0 * step[:, None])
        assert props.dlnk_dx[:, volatile, k] == pytest.approx(numeric[:, volatile], rel=1e-5, abs=1e-6 / x[:, k].min())


@pytest.mark.parametrize("name", ["sour water", "acid wash", "hydrochloric acid"])
def test_gibbs_duhem(name):
    """sum_i x_i d ln(K_i x_i)/dx_k = 0 over the members (no non-volatile one here)."""
    case, t, x = _setup(name)
    props = case.properties(t, PRESSURE, x)
    c = x.shape[1]
    d_ln_fugacity = props.dlnk_dx + np.eye(c)[None] / x[:, :, None]
    residual = np.einsum("ni,nik->nk", x, d_ln_fugacity)
    assert np.abs(residual).max() < 1e-7 * np.abs(d_ln_fugacity).max()
