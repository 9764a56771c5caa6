"""Transport properties for sizing: component-file curves against their reference library, and
the diffusivity correlations against measured values (each source named beside the value)."""

import numpy as np
import pytest
from CoolProp.CoolProp import PropsSI

from traywise.properties.library import find_component
from traywise.properties.transport import transport_data
from traywise.sizing.diffusion import fuller_gas_diffusivity, wilke_chang_liquid_diffusivity

WATER = transport_data(find_component("water"))


@pytest.mark.parametrize("t_celsius", [1.0, 20.0, 50.0, 80.0, 99.0])
@pytest.mark.parametrize("table, output", [("liquid_density", "D"), ("liquid_viscosity", "V"), ("surface_tension", "I")])
def test_water_liquid_curves_match_iapws(table, output, t_celsius):
    # Reference: the IAPWS formulations in CoolProp (IAPWS-95, IAPWS 2008 viscosity, IAPWS R1-76
    # surface tension); 0.05 % covers the stable-polynomial fit (1e-4 target).
    t = t_celsius + 273.15
    assert getattr(WATER, table)(t) == pytest.approx(PropsSI(output, "T", t, "Q", 0, "Water"), rel=5e-4)


def test_water_vapour_viscosity_matches_iapws_dilute_gas():
    for t in (300.0, 350.0, 450.0):
        assert WATER.gas_viscosity(t) == pytest.approx(PropsSI("V", "T", t, "Dmolar", 1e-3, "Water"), rel=5e-4)


def test_acetone_liquid_density_against_a_second_source():
    # thermo's best-ranked method built the file; CoolProp's reference equation of state for acetone
    # (Lemmon & Span 2006) is a second source; 1 % is typical agreement of liquid-density methods.
    acetone = transport_data(find_component("acetone"))
    for t in (280.0, 300.0, 320.0):
        assert acetone.liquid_density(t) == pytest.approx(PropsSI("D", "T", t, "Q", 0, "Acetone"), rel=0.01)


def test_nitrogen_has_gas_but_no_liquid_data():
    nitrogen = transport_data(find_component("nitrogen"))
    assert nitrogen.gas_viscosity is not None and not nitrogen.has_liquid_data
    assert nitrogen.diffusion_volume == 18.5  # Fuller et al. (1969) special value for N2 (recalled from memory)
    # Nitrogen gas viscosity at 300 K and low pressure: 17.9 uPa s (CoolProp's reference transport
    # model for nitrogen, Lemmon & Jacobsen 2004); 1 % is the spread of correlations.
    assert nitrogen.gas_viscosity(300.0) == pytest.approx(PropsSI("V", "T", 300.0, "P", 1e5, "Nitrogen"), rel=0.01)


# Measured binary gas diffusivities at 1 atm, cm2/s, as tabulated in B. E. Poling, J. M. Prausnitz,
# J. P. O'Connell, The Properties of Gases and Liquids, 5th ed. (2001), Table 11-2 (values recalled
# from memory). Fuller et al. (1966) report an average deviation of about 4-5 % over their data
# set, with few points beyond 10 % (recalled from memory): the tolerance is 10 %.
FULLER_CASES = [
    # T [K], M_A, M_B [g/mol], v_A, v_B (Fuller 1969 volumes), measured D [cm2/s]
    (298.0, 44.01, 28.01, 26.9, 18.5, 0.167),  # CO2-N2
    (273.0, 32.00, 28.01, 16.3, 18.5, 0.181),  # O2-N2
    (298.0, 18.02, 28.96, 13.1, 19.7, 0.260),  # H2O-air
]


@pytest.mark.parametrize("t, m_a, m_b, v_a, v_b, measured", FULLER_CASES)
def test_fuller_against_measured_gas_diffusivities(t, m_a, m_b, v_a, v_b, measured):
    found = fuller_gas_diffusivity(t, 101325.0, m_a / 1e3, m_b / 1e3, v_a, v_b)
    assert found == pytest.approx(measured * 1e-4, rel=0.10)


@pytest.mark.parametrize("t", [298.15, 323.15])
def test_wilke_chang_against_measured_co2_in_water(t):
    # Measured: G. F. Versteeg, W. P. M. van Swaaij, J. Chem. Eng. Data 33 (1988) 29-34, fit of
    # their measurements D = 2.35e-6 exp(-2119/T) m2/s (form and constants recalled from memory).
    # Wilke & Chang (1955) state an average deviation of about 10 % (recalled from memory).
    measured = 2.35e-6 * np.exp(-2119.0 / t)
    co2 = transport_data(find_component("carbon dioxide"))
    viscosity = WATER.liquid_viscosity(t)
    found = wilke_chang_liquid_diffusivity(t, viscosity, 2.6 * 0.018015, co2.boiling_molar_volume)
    assert found == pytest.approx(measured, rel=0.10)


def test_wilke_mixing_over_stages_matches_chemicals():
    # chemicals.Wilke (ChEDL) implements Wilke (1950) per mixture; ours evaluates all stages at once.
    from chemicals import Wilke

    from traywise.sizing.stage_loads import wilke_viscosity

    rng = np.random.default_rng(7)
    y = rng.random((5, 4))
    y /= y.sum(axis=1, keepdims=True)
    mu = rng.uniform(8e-6, 2.5e-5, (5, 4))
    masses = np.array([18.015, 28.014, 44.01, 17.031])
    found = wilke_viscosity(y, mu, masses)
    expected = [Wilke(list(y[j]), list(mu[j]), list(masses)) for j in range(5)]
    assert found == pytest.approx(expected, rel=1e-12)
