"""The electrolyte data file: each equilibrium constant at 25 degC against a second source
(named in the data file beside the check value), the standard enthalpies they imply, the
Debye-Hueckel constant, and Pitzer's g function."""

import numpy as np
import pytest

from traywise.properties.constants import GAS_CONSTANT
from traywise.properties.electrolyte.data import a_phi, coefficient_terms, electrolyte_data, van_t_hoff_coefficients
from traywise.properties.electrolyte.pitzer import pitzer_h

DATA = electrolyte_data()
# how close each constant must come to its second source at 25 degC (relative)
TOLERANCE = {"carbamate": 0.1, "sulfur_dioxide_1": 0.08}


@pytest.mark.parametrize("name", list(DATA.reactions))
def test_constant_at_25C_agrees_with_a_second_source(name):
    reaction = DATA.reactions[name]
    value = float(np.exp(reaction.ln_k(298.15)[0]))
    assert value == pytest.approx(reaction.check_25C, rel=TOLERANCE.get(name, 0.03)), reaction.check_source


@pytest.mark.parametrize("solute", list(DATA.henry))
def test_henry_constant_at_25C_agrees_with_a_second_source(solute):
    constant = DATA.henry[solute]
    value = float(np.exp(constant.ln_k(298.15)[0]))
    assert value == pytest.approx(constant.check_25C, rel=0.07), constant.check_source


def test_first_dissociation_constant_of_sulfur_dioxide_falls_with_temperature():
    """K1 = 1.3e-2 mol/kg at 25 degC (Seinfeld & Pandis 2006, Table 7.4, dH/R = -1960 K; recalled
    from memory): dissociation releases heat, so K1 at 40 degC is below K1 at 20 degC."""
    reaction = DATA.reactions["sulfur_dioxide_1"]
    k20, k40 = (float(np.exp(reaction.ln_k(t)[0])) for t in (293.15, 313.15))
    assert 1.2e-2 < float(np.exp(reaction.ln_k(298.15)[0])) < 1.5e-2
    assert k40 < k20
    expected = 1.3e-2 * np.exp(1960.0 * (1.0 / 313.15 - 1.0 / 298.15))  # Seinfeld & Pandis, recalled from memory
    assert k40 == pytest.approx(expected, rel=0.1)


def test_ionisation_of_water_implies_the_heat_of_neutralisation():
    """d ln Kw/dT gives dH(H2O = H+ + OH-) = 55.8 kJ/mol at 25 degC (NBS tables: dfH H2O(l)
    -285.830, OH- -230.015 kJ/mol; recalled from memory), within 1 %."""
    _, slope, _ = DATA.reactions["water"].ln_k(298.15)
    assert GAS_CONSTANT * 298.15**2 * float(slope) == pytest.approx(55815.0, rel=0.01)


def test_hydrogen_chloride_constant_implies_its_heat_of_solution():
    """dH(HCl(g) = H+ + Cl-) = -74.85 kJ/mol at 25 degC (NBS tables, recalled from memory)."""
    _, slope, _ = DATA.reactions["hydrogen_chloride"].ln_k(298.15)
    assert GAS_CONSTANT * 298.15**2 * float(slope) == pytest.approx(-74852.0, rel=1e-6)


def test_van_t_hoff_form_reproduces_its_reference_values():
    a, b, c, d = van_t_hoff_coefficients(1.39e-2, -17800.0, -272.0, 298.15)
    terms = coefficient_terms(np.array([298.15]))[0]
    ln_k, slope, curvature = terms @ np.array([a, b, c, d])
    assert np.exp(ln_k) == pytest.approx(1.39e-2, rel=1e-12)
    assert GAS_CONSTANT * 298.15**2 * slope == pytest.approx(-17800.0, rel=1e-9)
    # dCp = d(dH)/dT = R d(T**2 dlnK/dT)/dT
    assert GAS_CONSTANT * (2.0 * 298.15 * slope + 298.15**2 * curvature) == pytest.approx(-272.0, rel=1e-9)


def test_debye_hueckel_constant():
    """A_phi = 0.3915 kg^0.5 mol^-0.5 at 25 degC (Archer & Wang 1990; recalled from memory),
    within 0.5 %; and 0.4102 at 50 degC (same source, recalled from memory) within 1 %."""
    assert float(a_phi(298.15, DATA.a_phi_coefficients)[0]) == pytest.approx(0.3915, rel=0.005)
    assert float(a_phi(323.15, DATA.a_phi_coefficients)[0]) == pytest.approx(0.4102, rel=0.01)


def test_a_phi_derivatives_match_finite_differences():
    t = np.array([280.0, 330.0])
    value, first, second = a_phi(t, DATA.a_phi_coefficients)
    up, down = a_phi(t + 1e-3, DATA.a_phi_coefficients), a_phi(t - 1e-3, DATA.a_phi_coefficients)
    assert first == pytest.approx((up[0] - down[0]) / 2e-3, rel=1e-7)
    assert second == pytest.approx((up[1] - down[1]) / 2e-3, rel=1e-6)


def test_pitzer_g_function_and_its_derivatives():
    """Against the closed form (large x), its Taylor series 1 - 2x/3 + x**2/4 - x**3/15 (small x)
    and finite differences."""
    x = np.array([0.009, 0.011, 0.1, 0.59, 0.61, 1.0, 3.0, 8.0])
    h, h1, h2 = pitzer_h(x)
    assert h == pytest.approx(2.0 * (1.0 - (1.0 + x) * np.exp(-x)) / x**2, rel=1e-11)
    step = 1e-5
    up, down = pitzer_h(x + step), pitzer_h(x - step)
    assert h1 == pytest.approx((up[0] - down[0]) / (2 * step), rel=1e-7)
    assert h2 == pytest.approx((up[1] - down[1]) / (2 * step), rel=1e-6)
    small = np.array([1e-4, 1e-3, 1e-2])
    h, h1, h2 = pitzer_h(small)
    assert h == pytest.approx(1 - 2 * small / 3 + small**2 / 4 - small**3 / 15 + small**4 / 72, rel=1e-12)
    assert h1 == pytest.approx(-2 / 3 + small / 2 - small**2 / 5 + small**3 / 18, rel=1e-9)
    assert h2 == pytest.approx(0.5 - 2 * small / 5 + small**2 / 6, rel=1e-6)
    assert [float(v[0]) for v in pitzer_h(np.array([0.0]))] == [1.0, -2.0 / 3.0, 0.5]
