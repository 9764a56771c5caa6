"""Water as solvent: the property model against IAPWS-95 (via CoolProp) from 0 to 100 degC.

Reference: W. Wagner, A. Pruss, The IAPWS Formulation 1995 for the Thermodynamic Properties of
Ordinary Water Substance for General and Scientific Use, J. Phys. Chem. Ref. Data 31 (2002)
387-535, evaluated with CoolProp (I. H. Bell et al., Ind. Eng. Chem. Res. 53 (2014) 2498).
The model takes water's vapour pressure from IAPWS-IF97 and its liquid enthalpy from the heat of
vaporisation at 25 degC plus the integral of the liquid heat capacity (DESIGN.md section 3).
"""

import numpy as np
import pytest
from CoolProp.CoolProp import PropsSI

from traywise.properties.constants import GAS_CONSTANT, P_STANDARD, ZERO_CELSIUS
from traywise.properties.library import find_component
from traywise.properties.model import PropertyModel

TEMPERATURES = ZERO_CELSIUS + np.array([0.01, 10.0, 20.0, 30.0, 40.0, 50.0, 60.0, 70.0, 80.0, 90.0, 100.0])
MOLAR_MASS = PropsSI("molar_mass", "Water")  # kg/mol, IAPWS-95


@pytest.fixture(scope="module")
def water():
    """Stage properties of pure water (raoult) at the test temperatures and 1 atm."""
    model = PropertyModel([find_component("water")])
    assert model.equilibrium == ("raoult",)
    return model.evaluate(TEMPERATURES, np.full_like(TEMPERATURES, P_STANDARD))


def saturation(output, quality):
    return np.array([PropsSI(output, "T", t, "Q", quality, "Water") for t in TEMPERATURES])


def show(title, deviation):
    print(f"\n{title}")
    for t, d in zip(TEMPERATURES, deviation):
        print(f"  {t - ZERO_CELSIUS:6.2f} degC  {100 * d:+.4f} %")


def test_vapour_pressure_matches_iapws95(water):
    reference = saturation("P", 0)
    deviation = water.k[:, 0] * P_STANDARD / reference - 1.0
    show("water vapour pressure, model (IAPWS-IF97) vs IAPWS-95", deviation)
    # 0.1 % goal; IAPWS R7-97 states IF97's saturation pressure within about 0.025 % of IAPWS-95.
    assert np.max(np.abs(deviation)) < 1e-3


def model_latent_heat(water):
    return water.h_vapour[:, 0] - water.h_liquid[:, 0]


def test_latent_heat_matches_iapws95(water):
    latent = model_latent_heat(water)
    real = MOLAR_MASS * (saturation("H", 1) - saturation("H", 0))
    residual = saturation("HMOLAR_RESIDUAL", 1)  # saturated steam minus ideal gas at the same T [J/mol]
    to_real = latent / real - 1.0
    to_ideal_gas = latent / (real - residual) - 1.0
    show("latent heat h_vapour - h_liquid vs IAPWS-95 (real saturated vapour)", to_real)
    show("latent heat vs IAPWS-95 with ideal-gas vapour (h_ig - h_liquid)", to_ideal_gas)
    # Like for like (ideal-gas vapour): the only difference is the latent heat at the anchor
    # (50 degC) being the real one, i.e. steam's residual enthalpy there (about 0.15 %); 0.2 % bound.
    assert np.max(np.abs(to_ideal_gas)) < 2e-3
    # Against the real latent heat the ideal-gas vapour leaves out the change of saturated steam's
    # residual enthalpy from the anchor: measured -0.11 % to +0.43 % from 0 to 100 degC.
    assert np.max(np.abs(to_real)) < 5e-3  # 0.5 % goal (issue 2)


def test_liquid_heat_capacity_matches_iapws95(water):
    reference = saturation("CPMOLAR", 0)
    deviation = water.dh_liquid_dt[:, 0] / reference - 1.0
    show("liquid Cp, model vs IAPWS-95 saturated liquid", deviation)
    assert np.max(np.abs(deviation)) < 5e-3  # 0.5 % goal (DESIGN.md section 3)


def test_latent_heat_agrees_with_clapeyron_slope(water):
    # Clausius-Clapeyron with ideal vapour and negligible liquid volume: dH = -R dlnPsat/d(1/T)
    # = R T**2 dlnPsat/dT. The model's enthalpies and its K-values are independent correlations;
    # they must agree within the vapour non-ideality (compressibility 0.98 at 100 degC), 2 %.
    clapeyron = GAS_CONSTANT * TEMPERATURES**2 * water.dlnk_dt[:, 0]
    deviation = model_latent_heat(water) / clapeyron - 1.0
    show("latent heat from enthalpies vs Clapeyron slope of the model's Psat", deviation)
    assert np.max(np.abs(deviation)) < 2e-2
