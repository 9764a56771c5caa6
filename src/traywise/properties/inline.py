"""Components stated in a few plain numbers (plant-fitted or hand data), SI units.

Used by case files for inline definitions and for overriding one property of a library
component (``dataclasses.replace(component, henry_in_water=henry_from_reference(...))``).
"""

from .component import Component, HeatCapacity, HenryConstant, Quantity, VapourPressure
from .constants import GAS_CONSTANT, T_REFERENCE
from .correlations import two_term_intercept

USER = "user"  # source key of values given in a case file
USER_SOURCE = "given in the case file by the user"
WIDE_RANGE = (200.0, 600.0)  # K; nominal validity claimed for user data, reported in warnings


def heat_capacity_from_parameters(value, *, t_range=WIDE_RANGE, source=USER):
    """A constant Cp (float) or a polynomial in T (list, lowest power first, as users write
    Cp = c0 + c1 T + c2 T**2 ...) [J/(mol K)]."""
    coefficients = [value] if isinstance(value, (int, float)) else list(value)
    return HeatCapacity.in_temperature(coefficients[::-1], *t_range, source)


def henry_from_reference(h_reference, t_reference, enthalpy_of_solution, *, t_range=WIDE_RANGE, source=USER):
    """Henry's constant H = p/x [Pa] at t_reference [K] with a constant enthalpy of solution
    [J/mol] (negative when dissolving releases heat): ln H = a + b/T, b = dH_sol/R."""
    b = enthalpy_of_solution / GAS_CONSTANT
    a = two_term_intercept(h_reference, t_reference, b)
    return HenryConstant((a, b, 0.0, 0.0, 0.0, 0.0), *t_range, source)


def vapour_pressure_from_reference(p_reference, t_reference, heat_of_vaporisation, *, t_range=WIDE_RANGE, source=USER):
    """Clausius-Clapeyron vapour pressure through p_reference [Pa] at t_reference [K] with a
    constant heat of vaporisation [J/mol]: ln P = a + b/T, b = -dH_vap/R."""
    b = -heat_of_vaporisation / GAS_CONSTANT
    a = two_term_intercept(p_reference, t_reference, b)
    return VapourPressure("dippr101", *t_range, source, (a, b, 0.0, 0.0, 0.0))


def inline_component(
    name,
    *,
    molar_mass,
    ideal_gas_cp,
    equilibrium,
    henry=None,
    vapour_pressure=None,
    heat_of_vaporisation=None,
    liquid_cp=None,
    formula=None,
):
    """A component from plain parameters (SI).

    Parameters
    ----------
    name : str
    molar_mass : float               [kg/mol]
    ideal_gas_cp : float or list     constant or polynomial (lowest power first) [J/(mol K)]
    equilibrium : str                'henry', 'raoult', 'nonvolatile' or 'insoluble'
    henry : (H_ref [Pa], T_ref [K], dH_solution [J/mol]), optional
    vapour_pressure : (P_ref [Pa], T_ref [K]), optional; uses heat_of_vaporisation [J/mol]
    heat_of_vaporisation : float, optional   at 298.15 K [J/mol]; also the liquid reference
    liquid_cp : float or list, optional      [J/(mol K)]
    """
    latent = Quantity(heat_of_vaporisation, USER, T_REFERENCE) if heat_of_vaporisation is not None else None
    return Component(
        name=name,
        formula=formula or name,
        cas="",
        molar_mass=Quantity(molar_mass, USER),
        ideal_gas_cp=heat_capacity_from_parameters(ideal_gas_cp),
        equilibrium=equilibrium,
        liquid_cp=heat_capacity_from_parameters(liquid_cp) if liquid_cp is not None else None,
        vapour_pressure=(
            vapour_pressure_from_reference(*vapour_pressure, heat_of_vaporisation) if vapour_pressure else None
        ),
        heat_of_vaporisation=latent,
        henry_in_water=henry_from_reference(*henry) if henry else None,
        sources={USER: USER_SOURCE},
        origin="inline",
    )
