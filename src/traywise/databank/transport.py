"""Transport and volumetric tables of a component file, for column sizing (not for the solver).

One function per table; each looks the data up (water: the IAPWS formulations via CoolProp;
other components: thermo's best-ranked method), fits a stable polynomial in T over a stated
range with ``fits.fit_stable_polynomial`` and returns a ``tables.Table``:

- ``liquid_density`` [kg/m3], ``liquid_viscosity`` [Pa s], ``surface_tension`` [N/m] of the
  saturated liquid, for components that are liquid at 25 degC;
- ``gas_viscosity`` [Pa s] of the dilute (low-pressure) gas, for every component;
- ``diffusion_volume`` [-]: Fuller's diffusion volume (special-molecule value or sum of atomic
  increments) for the Fuller-Schettler-Giddings gas diffusivity;
- ``boiling_molar_volume`` [m3/mol]: molar volume of the liquid at the normal boiling point
  by Tyn and Calus from the critical volume, for the Wilke-Chang liquid diffusivity.
"""

import re

from chemicals import MW, Vc
from CoolProp import CoolProp as coolprop
from thermo import SurfaceTension, ViscosityGas, ViscosityLiquid, VolumeLiquid

from . import citations
from .fits import fit_stable_polynomial
from .tables import Table

WATER = "7732-18-5"
LIQUID_RANGE = (273.15, 373.15)  # K; absorber liquids, freezing to boiling water (common practice)
GAS_RANGE = (250.0, 600.0)  # K; absorber gases, with margin (common practice)
RANGE_NOTE = "t_min/t_max: the absorber range (common practice), clipped to the source's own range."
TABLE_ORDER = ("liquid_density", "liquid_viscosity", "surface_tension", "gas_viscosity", "diffusion_volume",
               "boiling_molar_volume")

# (thermo class, CoolProp output, unit, what) per temperature-dependent table.
PROPERTIES = {
    "liquid_density": (VolumeLiquid, "D", "kg/m3", "saturated-liquid density"),
    "liquid_viscosity": (ViscosityLiquid, "V", "Pa s", "saturated-liquid viscosity"),
    "surface_tension": (SurfaceTension, "I", "N/m", "surface tension against its own vapour"),
    "gas_viscosity": (ViscosityGas, "V", "Pa s", "dilute-gas viscosity"),
}
IAPWS_TRANSPORT = (
    "water by the IAPWS formulations as implemented in CoolProp {version}: density IAPWS-95 (W. Wagner, "
    "A. Pruss, J. Phys. Chem. Ref. Data 31 (2002) 387-535); viscosity IAPWS 2008 (M. L. Huber et al., "
    "J. Phys. Chem. Ref. Data 38 (2009) 101-125); surface tension IAPWS R1-76(2014) (N. B. Vargaftik, "
    "B. N. Volkov, L. D. Voljak, J. Phys. Chem. Ref. Data 12 (1983) 817-820)"
)
# Fuller's diffusion volumes: special molecules and atomic increments, from E. N. Fuller, K. Ensley,
# J. C. Giddings, J. Phys. Chem. 73 (1969) 3679-3685, as tabulated in B. E. Poling, J. M. Prausnitz,
# J. P. O'Connell, The Properties of Gases and Liquids, 5th ed. (2001), Table 11-1 (values recalled
# from memory; the 1969 table revises the 1966 one of Fuller, Schettler and Giddings).
FULLER_SPECIAL = {
    "7727-37-9": 18.5, "7782-44-7": 16.3, "7440-37-1": 16.2, "124-38-9": 26.9, "7446-09-5": 41.8,
    "7664-41-7": 20.7, "7732-18-5": 13.1, "630-08-0": 18.0, "1333-74-0": 6.12, "7440-59-7": 2.67,
    "7782-50-5": 38.4, "10024-97-2": 35.9,
}
FULLER_ATOMS = {"C": 15.9, "H": 2.31, "O": 6.11, "N": 4.54, "F": 14.7, "Cl": 21.0, "Br": 21.9, "I": 29.8, "S": 22.9}
FULLER_CITATION = (
    "E. N. Fuller, P. D. Schettler, J. C. Giddings, Ind. Eng. Chem. 58(5) (1966) 18-27, with the diffusion "
    "volumes revised by E. N. Fuller, K. Ensley, J. C. Giddings, J. Phys. Chem. 73 (1969) 3679-3685, as "
    "tabulated in B. E. Poling, J. M. Prausnitz, J. P. O'Connell, The Properties of Gases and Liquids, 5th ed. "
    "(2001), Table 11-1 (values recalled from memory)"
)
TYN_CALUS_CITATION = (
    "M. T. Tyn, W. F. Calus, Processing 21(4) (1975) 16-17: V_b = 0.285 V_c^1.048 (cm3/mol), average error "
    "about 3 % (Poling et al., The Properties of Gases and Liquids, 5th ed. (2001), section 11-10); critical "
    "volume from chemicals (C. Bell et al.), function Vc"
)


def transport_tables(cas, formula, liquid):
    """{table name: Table} of the transport tables this component gets (``liquid``: it is a
    liquid at 25 degC, so it gets the liquid tables too)."""
    names = TABLE_ORDER if liquid else ("gas_viscosity", "diffusion_volume", "boiling_molar_volume")
    found = {}
    for name in names:
        if name == "diffusion_volume":
            table = diffusion_volume(cas, formula)
        elif name == "boiling_molar_volume":
            table = boiling_molar_volume(cas)
        else:
            table = temperature_table(cas, name)
        if table is not None:
            found[name] = table
    return found


def temperature_table(cas, name):
    """One temperature-dependent table (see ``PROPERTIES``) as a stable polynomial in T."""
    correlation, output, unit, what = PROPERTIES[name]
    t_min, t_max = GAS_RANGE if name == "gas_viscosity" else LIQUID_RANGE
    if cas == WATER:
        if name == "gas_viscosity":
            function = lambda t: coolprop.PropsSI("V", "T", t, "Dmolar", 1e-3, "Water")  # noqa: E731
        else:
            function = lambda t: coolprop.PropsSI(output, "T", t, "Q", 0, "Water")  # noqa: E731
        key, citation = "iapws_transport", IAPWS_TRANSPORT.format(version=coolprop.get_global_param_string("version"))
        chosen = "the IAPWS formulation (CoolProp, Water)"
    else:
        model = correlation(CASRN=cas)
        methods = [m for m in model.ranked_methods if m in model.all_methods]
        if not methods:
            return None
        method = methods[0]
        low, high = model.T_limits[method]
        t_min, t_max = max(t_min, low), min(t_max, high)
        if t_max <= t_min:
            return None
        if name == "liquid_density":
            molar_mass = MW(cas) / 1000.0
            function = lambda t: molar_mass / model.calculate(t, method)  # noqa: E731
        else:
            function = lambda t: model.calculate(t, method)  # noqa: E731
        key = f"thermo_{name}_{method.lower()}"
        citation = citations.thermo_method_fit_citation(correlation.__name__, method)
        chosen = f"thermo's best-ranked method '{method}'"
    fit = fit_stable_polynomial(function, t_min, t_max)
    fields = {"form": "stable_polynomial", "coefficients": list(fit.coefficients), "unit": unit,
              "t_min": t_min, "t_max": t_max, "source": key,
              "note": f"The {what}: {chosen}, fitted here by a stable polynomial (largest fit error "
                      f"{100 * fit.max_relative_error:.2g} %). {RANGE_NOTE}"}
    return Table(fields, {key: citation})


def fuller_volume(cas, formula):
    """Fuller's diffusion volume [-]: the special-molecule value, else the sum of atomic
    increments over the molecular formula; None when an element has no increment."""
    if cas in FULLER_SPECIAL:
        return FULLER_SPECIAL[cas]
    total = 0.0
    for element, count in re.findall(r"([A-Z][a-z]?)(\d*)", formula):
        if element not in FULLER_ATOMS:
            return None
        total += FULLER_ATOMS[element] * (int(count) if count else 1)
    return total


def diffusion_volume(cas, formula):
    """Table of Fuller's diffusion volume (formula in Hill order, as chemicals gives it)."""
    value = fuller_volume(cas, formula)
    if value is None:
        return None
    how = "special-molecule value" if cas in FULLER_SPECIAL else "sum of atomic increments over the formula"
    fields = {"value": value, "unit": "1", "source": "fuller1969",
              "note": f"Fuller's diffusion volume ({how}); no ring corrections applied."}
    return Table(fields, {"fuller1969": FULLER_CITATION})


def boiling_molar_volume(cas):
    """Table of the liquid molar volume at the normal boiling point by Tyn and Calus [m3/mol]."""
    critical = Vc(cas)
    if critical is None:
        return None
    value = 0.285 * (critical * 1e6) ** 1.048 * 1e-6
    fields = {"value": value, "unit": "m3/mol", "source": "tyn_calus1975",
              "note": f"From the critical volume {critical * 1e6:.4g} cm3/mol (chemicals, Vc)."}
    return Table(fields, {"tyn_calus1975": TYN_CALUS_CITATION})
