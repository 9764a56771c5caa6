"""One function per table of a component file: each looks the data up in chemicals, thermo or
CoolProp, checks it against a second source where one exists, and returns the table (SI numbers,
``source`` key, ``note``) with the citations it uses.

Choices (the notes written into each file repeat them):
- heat capacities: thermo's fits to reference equations of state ('HEOS_FIT') where they exist,
  else a stable polynomial fitted here to thermo's best-ranked correlation, with its fit error;
- water's vapour pressure: IAPWS-IF97; other liquids: DIPPR 101 (Perry's 8th ed., Table 2-8);
- heat of vaporisation at 298.15 K: the reference equation of state (CoolProp) where one exists;
- Henry's constants in water: Sander's compilation ('Sander T dep'), except ammonia, taken from
  the measurement paper of Clegg and Brimblecombe, and acetone, taken from Staudinger and
  Roberts (see ``PUBLISHED_HENRY``).
"""

import functools
import json
from dataclasses import dataclass, field
from pathlib import Path

import numpy as np
import thermo
from chemicals import MW, Tm, Tm_methods
from CoolProp import CoolProp as coolprop
from thermo import EnthalpyVaporization, HeatCapacityGas, HeatCapacityLiquid, VaporPressure

from ..properties.component import WATER_CAS, HeatCapacity
from ..properties.constants import T_REFERENCE, ZERO_CELSIUS
from ..properties.correlations import dippr101
from . import citations
from .fits import fit_stable_polynomial
from .iapws_henry import iapws_henry_fields

WATER = WATER_CAS
HENRY_RANGE = (273.15, 353.15)  # K; judgement, see HENRY_RANGE_NOTE
HENRY_RANGE_NOTE = (
    "t_min/t_max are a judgement (common practice), not stated by the source: Sander's fits are "
    "meant near 298.15 K, and absorbers in water run between freezing and about 80 degC."
)
SECOND_SOURCE_RANGE = (300.0, 500.0)  # K; where ideal-gas Cp is compared with other correlations
SECOND_GAS_CP_METHODS = ("TRCIG", "WEBBOOK_SHOMATE", "JANAF", "POLING_POLY")
LIQUID_CHECK_RANGE = (ZERO_CELSIUS, 373.15)  # K; absorber liquid temperatures
WATER_LIQUID_CP_LIMIT = 0.005  # largest accepted deviation from IAPWS-95 [-]
FIT_EXCLUDED_METHODS = ("HEOS_FIT", "COOLPROP")  # fitted only when present; CoolProp is checked, not fitted

# Henry's constants taken from a single measurement paper instead of thermo's 'Sander T dep'
# table, by CAS number: (a, b, c, d of ln(H/Pa), (t_min, t_max) [K], source key, citation, note).
PUBLISHED_HENRY = {
    # Clegg & Brimblecombe: ln(K_H / (mol kg-1 atm-1)) = -8.09694 + 3917.507/T - 0.00314 T. With
    # H = p/x = 1/(K_H M_water) in atm for the dilute solution: ln(H/Pa) = 8.09694
    # - ln(0.0180153) + ln(101325) - 3917.507/T + 0.00314 T.
    "7664-41-7": (
        (8.09694 - np.log(0.0180153) + np.log(101325.0), -3917.507, 0.0, 0.00314),
        (273.15, 313.15),
        "clegg1989",
        citations.CLEGG_BRIMBLECOMBE_1989,
        "Chosen over thermo's 'Sander T dep' entry, which is 40 % less soluble at 298.15 K than this "
        "measurement and most values in Sander's compilation, and whose temperature dependence implies "
        "-27 kJ/mol against about -34 kJ/mol calorimetric (NBS tables). Valid range as stated for the "
        "equation (recalled from memory); hotter ammonia absorbers extrapolate it and are warned.",
    ),
    # Staudinger & Roberts, as listed in Sander's compilation: Hscp = 0.28 mol/(m3 Pa) at 298.15 K,
    # d ln Hscp/d(1/T) = 4800 K (values recalled from memory). With H = p/x = c_water/Hscp, c_water
    # the molar concentration of liquid water at 298.15 K (IAPWS-95): ln(H/Pa) = ln(c_water/0.28)
    # + 4800/298.15 - 4800/T.
    "67-64-1": (
        (np.log(coolprop.PropsSI("Dmolar", "T", T_REFERENCE, "Q", 0, "Water") / 0.28) + 4800.0 / T_REFERENCE, -4800.0, 0.0, 0.0),
        HENRY_RANGE,
        "staudinger2001",
        citations.STAUDINGER_ROBERTS_2001,
        "Chosen over thermo's 'Sander T dep' entry (Hscp 0.18 mol/(m3 Pa)), which lies below every measured "
        "value Sander lists (0.24-0.35, values recalled from memory): with it acetone's activity coefficient at "
        "infinite dilution in water comes out 10 against about 7 measured. " + HENRY_RANGE_NOTE,
    ),
}
# Limitations of the physical (molecular) Henry's constant, by CAS number.
DISSOCIATION_NOTES = {
    "7647-01-0": "Sander's value is the physical (intrinsic) Henry's constant of molecular HCl. In water "
    "HCl dissociates almost completely, so its apparent solubility is many orders of magnitude higher; "
    "this constant does not describe HCl absorption into water (limitation).",
    "7446-09-5": "Physical Henry's constant of molecular SO2; dissociation to bisulfite raises the apparent "
    "solubility at low loadings, which this constant does not include.",
    "7664-41-7": "Physical Henry's constant of molecular NH3; dissociation to ammonium is small in pure "
    "water but not included.",
    "124-38-9": "Physical Henry's constant of molecular CO2; dissociation is small in pure water but not "
    "included.",
    "7783-06-4": "Physical Henry's constant of molecular H2S; dissociation is small in pure water but not "
    "included.",
    "7782-50-5": "Physical Henry's constant of molecular Cl2; in water chlorine hydrolyses to HOCl and HCl, "
    "which raises its apparent solubility several-fold in dilute solution; that reaction is not included "
    "(limitation).",
}


@dataclass
class Table:
    """One table of a component file: ordered fields (SI numbers, form, unit, source, note) and
    the citations of the source keys it uses."""

    fields: dict
    sources: dict = field(default_factory=dict)


@functools.cache
def _interaction_table(file_name):
    """One of thermo's Henry's-law tables, read directly from its JSON file."""
    path = Path(thermo.__file__).parent / "Interaction Parameters" / file_name
    return json.loads(path.read_text(encoding="utf-8"))["data"]


def sander_coefficients(cas, file_name="Sander_henry_T_dep.json"):
    """(A, B, C, D, E, F) of ln(H/Pa) for the solute in water, or None."""
    entry = _interaction_table(file_name).get(f"{cas} {WATER}")
    return None if entry is None else tuple(float(entry[k]) for k in "ABCDEF")


def _percent(values, reference):
    """Largest deviation of values from reference, signed, in percent."""
    deviation = np.asarray(values) / np.asarray(reference) - 1.0
    return 100.0 * float(deviation[np.argmax(np.abs(deviation))])


def molar_mass(cas):
    """Molar mass [kg/mol] from chemicals (formula and atomic weights)."""
    return Table({"value": MW(cas) / 1000.0, "unit": "kg/mol", "source": "chemicals"},
                 {"chemicals": citations.CHEMICALS_MOLAR_MASS})


def melting_point(cas):
    """Melting point [K] from chemicals' first-ranked source for this CAS number."""
    method = Tm_methods(cas)[0]
    key = f"melting_{method.lower()}"
    return Table({"value": Tm(cas, method=method), "unit": "K", "source": key},
                 {key: citations.melting_point_citation(method)})


def _heat_capacity_table(correlation, kind, fluid):
    """(table, fitted method) from thermo's HEOS_FIT (fitted method None), or from a fit to thermo's
    best-ranked method valid at 298.15 K; (None, None) when thermo has neither."""
    heos = getattr(correlation, "stable_polynomial_parameters", {}).get("HEOS_FIT")
    if heos is not None:
        fields = {"form": "stable_polynomial", "coefficients": [float(c) for c in heos["coeffs"]],
                  "unit": "J/(mol K)", "t_min": float(heos["Tmin"]), "t_max": float(heos["Tmax"]),
                  "source": "thermo_eos_fit", "note": "Chosen: thermo's fit to the reference equation of state."}
        citation = citations.thermo_eos_fit_citation(fluid) if fluid else (
            f"thermo {thermo.__version__} (C. Bell et al.), 'HEOS_FIT' fit to the reference equation of state "
            f"for CAS {correlation.CASRN} (no CoolProp fluid to name the publication)")
        return Table(fields, {"thermo_eos_fit": citation}), None
    methods = [m for m in correlation.ranked_methods if m in correlation.all_methods
               and m not in FIT_EXCLUDED_METHODS and correlation.test_method_validity(T_REFERENCE, m)]
    if not methods:
        return None, None
    method = methods[0]
    t_low, t_high = correlation.T_limits[method]
    t_min, t_max = max(t_low, 200.0), min(t_high, 1000.0)
    fit = fit_stable_polynomial(lambda t: correlation.calculate(t, method), t_min, t_max)
    key = f"thermo_{method.lower()}_fit"
    fields = {"form": "stable_polynomial", "coefficients": list(fit.coefficients), "unit": "J/(mol K)",
              "t_min": t_min, "t_max": t_max, "source": key,
              "note": f"No fit to a reference equation of state in thermo; fitted here to thermo's '{method}' "
                      f"(largest fit error {100 * fit.max_relative_error:.2g} % on {t_min:.1f}-{t_max:.1f} K)."}
    return Table(fields, {key: citations.thermo_method_fit_citation(kind, method)}), method


def _evaluate(fields, temperature):
    """Cp [J/(mol K)] of a stable-polynomial table at temperature [K], as the loader will read it."""
    return HeatCapacity.stable(fields["coefficients"], fields["t_min"], fields["t_max"], "").heat_capacity(temperature)


def ideal_gas_cp(cas):
    """Ideal-gas heat capacity, checked against CoolProp and thermo's other correlations."""
    gas = HeatCapacityGas(CASRN=cas)
    fluid = citations.coolprop_fluids_by_cas().get(cas)
    table, fitted = _heat_capacity_table(gas, "HeatCapacityGas", fluid)
    if table is None:
        raise LookupError(f"CAS {cas}: thermo has no ideal-gas heat capacity")
    fields = table.fields
    checks = []
    if fluid is not None:
        t_low = max(fields["t_min"], coolprop.PropsSI("Tmin", fluid))
        t_high = min(fields["t_max"], coolprop.PropsSI("Tmax", fluid))
        grid = np.linspace(t_low, t_high, 60)
        reference = [coolprop.PropsSI("CP0MOLAR", "T", t, "Dmolar", 1e-3, fluid) for t in grid]
        checks.append(f"the ideal-gas Cp of the reference equation of state in CoolProp ({fluid}) by at most "
                      f"{_percent(_evaluate(fields, grid), reference):+.2g} % over {t_low:.1f}-{t_high:.1f} K")
    grid = np.linspace(*SECOND_SOURCE_RANGE, 21)
    grid = grid[(grid >= fields["t_min"]) & (grid <= fields["t_max"])]
    own = _evaluate(fields, grid)
    for method in SECOND_GAS_CP_METHODS:
        usable = method != fitted and method in gas.all_methods
        if usable and gas.test_method_validity(grid[0], method) and gas.test_method_validity(grid[-1], method):
            other = [gas.calculate(t, method) for t in grid]
            checks.append(f"'{method}' by {_percent(other, own):+.2f} %")
    comparison = "; ".join(checks) if checks else "no second source available"
    fields["note"] += f" Largest deviation from it ({grid[0]:.0f}-{grid[-1]:.0f} K unless stated): {comparison}."
    return table


def liquid_cp(cas):
    """Saturated-liquid heat capacity; water's must agree with IAPWS-95 within 0.5 % at 0-100 degC."""
    liquid = HeatCapacityLiquid(CASRN=cas)
    fluid = citations.coolprop_fluids_by_cas().get(cas)
    table, _ = _heat_capacity_table(liquid, "HeatCapacityLiquid", fluid)
    if table is None:
        return None
    fields = table.fields
    if fluid is not None:
        t_low = max(LIQUID_CHECK_RANGE[0], fields["t_min"], coolprop.PropsSI("Ttriple", fluid))
        t_high = min(LIQUID_CHECK_RANGE[1], fields["t_max"], 0.95 * coolprop.PropsSI("Tcrit", fluid))
        grid = np.linspace(t_low, t_high, 40)
        reference = [coolprop.PropsSI("CPMOLAR", "T", t, "Q", 0, fluid) for t in grid]
        deviation = _percent(_evaluate(fields, grid), reference)
        if cas == WATER and abs(deviation) > 100 * WATER_LIQUID_CP_LIMIT:
            raise ValueError(f"water liquid Cp deviates {deviation:.3f} % from IAPWS-95; limit 0.5 %")
        fields["note"] += (f" Deviates from the saturated-liquid Cp of the reference equation of state (CoolProp, "
                           f"{fluid}) by at most {deviation:+.3f} % over {t_low:.2f}-{t_high:.2f} K.")
    return table


def vapour_pressure(cas):
    """IAPWS-IF97 for water, else DIPPR 101 from Perry's 8th ed., compared with CoolProp."""
    if cas == WATER:
        fields = {"form": "iapws_if97", "unit": "Pa", "t_min": 273.15, "t_max": 647.096, "source": "iapws_if97",
                  "note": "IAPWS-IF97 region 4; agrees with IAPWS-95 within about 0.025 % (IAPWS R7-97)."}
        return Table(fields, {"iapws_if97": citations.IAPWS_IF97})
    parameters = getattr(VaporPressure(CASRN=cas), "DIPPR101_parameters", {}).get("DIPPR_PERRY_8E")
    if parameters is None:
        return None
    fields = {"form": "dippr101", "a": parameters["A"], "b": parameters["B"], "c": parameters["C"],
              "d": parameters["D"], "e": parameters["E"], "unit": "Pa",
              "t_min": float(parameters["Tmin"]), "t_max": float(parameters["Tmax"]), "source": "perry8_dippr101",
              "note": "Chosen: the handbook correlation (Perry's 8th ed., DIPPR 101)."}
    fluid = citations.coolprop_fluids_by_cas().get(cas)
    if fluid is not None:
        t_low = max(LIQUID_CHECK_RANGE[0], fields["t_min"], coolprop.PropsSI("Ttriple", fluid))
        t_high = min(LIQUID_CHECK_RANGE[1], fields["t_max"], 0.95 * coolprop.PropsSI("Tcrit", fluid))
        grid = np.linspace(t_low, t_high, 30)
        own = np.exp(dippr101(grid, *(fields[k] for k in "abcde"))[0])
        reference = [coolprop.PropsSI("P", "T", t, "Q", 0, fluid) for t in grid]
        fields["note"] += (f" Deviates from the reference equation of state (CoolProp, {fluid}) by at most "
                           f"{_percent(own, reference):+.2f} % over {t_low:.2f}-{t_high:.2f} K.")
    return Table(fields, {"perry8_dippr101": citations.PERRY_8E_DIPPR101})


# Temperature at which a solvent's latent heat anchors its liquid enthalpy, by CAS number, where
# it is not 298.15 K. Water: the model's vapour is an ideal gas, so its latent heat drifts from
# the real one by the change of saturated steam's residual enthalpy from the anchor; anchored
# at 50 degC, the middle of the range absorbers run in, the drift stays within -0.11 % to +0.43 %
# from 0 to 100 degC (IAPWS-95), against up to 0.52 % when anchored at 25 degC.
LATENT_HEAT_TEMPERATURE = {WATER: 323.15}


def heat_of_vaporisation(cas):
    """Latent heat at 298.15 K (or LATENT_HEAT_TEMPERATURE): the reference equation of state
    where CoolProp has one."""
    fluid = citations.coolprop_fluids_by_cas().get(cas)
    latent = EnthalpyVaporization(CASRN=cas)
    if fluid is not None:
        anchor = LATENT_HEAT_TEMPERATURE.get(cas, T_REFERENCE)
        molar_mass_fluid = coolprop.PropsSI("molar_mass", fluid)
        value = molar_mass_fluid * (coolprop.PropsSI("H", "T", anchor, "Q", 1, fluid)
                                    - coolprop.PropsSI("H", "T", anchor, "Q", 0, fluid))
        note = f"Chosen: the reference equation of state (CoolProp, {fluid})."
        if cas in LATENT_HEAT_TEMPERATURE:
            note += (f" Taken at {anchor - ZERO_CELSIUS:.0f} degC, the middle of the absorber range, which centres "
                     "the error of the ideal-gas vapour's latent heat on 0-100 degC (see the build script).")
        if "CRC_HVAP_298" in latent.all_methods and anchor == T_REFERENCE:
            handbook = latent.calculate(T_REFERENCE, "CRC_HVAP_298")
            difference = 100 * (handbook / value - 1)
            note += f" The CRC Handbook value via thermo ('CRC_HVAP_298') differs by {difference:+.2f} %."
        fields = {"value": value, "unit": "J/mol", "temperature": anchor, "source": "coolprop_eos", "note": note}
        return Table(fields, {"coolprop_eos": citations.coolprop_eos_citation(fluid)})
    methods = [m for m in latent.ranked_methods
               if m in latent.all_methods and latent.test_method_validity(T_REFERENCE, m)]
    if not methods:
        return None
    key = f"thermo_{methods[0].lower()}"
    fields = {"value": latent.calculate(T_REFERENCE, methods[0]), "unit": "J/mol", "temperature": T_REFERENCE,
              "source": key,
              "note": f"No reference equation of state in CoolProp; thermo's best-ranked method '{methods[0]}'."}
    return Table(fields, {key: citations.thermo_method_citation("EnthalpyVaporization", methods[0])})


def henry_in_water(cas):
    """Henry's constant (volatility form, Pa): the IAPWS guideline's where it covers the gas, else
    Sander's, or a measurement paper's (PUBLISHED_HENRY)."""
    guideline = iapws_henry_fields(cas, sander_coefficients(cas))
    if guideline is not None:
        fields, sources = guideline
        if cas in DISSOCIATION_NOTES:
            fields["note"] += " " + DISSOCIATION_NOTES[cas]
        return Table(fields, sources)
    t_range, notes = HENRY_RANGE, [HENRY_RANGE_NOTE]
    if cas in PUBLISHED_HENRY:
        coefficients, t_range, source, citation, note = PUBLISHED_HENRY[cas]
        a, b, c, d, e, f = (*coefficients, 0.0, 0.0)
        sources, notes = {source: citation}, [note]
    else:
        coefficients = sander_coefficients(cas)
        if coefficients is None:
            return None
        a, b, c, d, e, f = coefficients
        sources, source = {"sander2015": citations.SANDER_2015}, "sander2015"
    single = sander_coefficients(cas, "Sander_henry_const.json")
    if single is not None:
        ratio = np.exp(single[0]) / np.exp(a + b / T_REFERENCE)
        notes.append(f"thermo's single-temperature table ('Sander Const') gives {ratio:.3g} times this H at 298.15 K.")
    if cas in DISSOCIATION_NOTES:
        notes.append(DISSOCIATION_NOTES[cas])
    fields = {"form": "ln_h", "a": a, "b": b}
    fields.update({name: value for name, value in zip("cdef", (c, d, e, f)) if value})
    fields.update({"unit": "Pa", "t_min": t_range[0], "t_max": t_range[1], "source": source,
                   "note": " ".join(notes)})
    return Table(fields, sources)


# Non-volatile solutes of aqueous solvent feeds (the aqueous electrolyte liquid's sodium hydroxide):
# CAS -> standard partial molar heat capacity at infinite dilution in water at 25 degC [J/(mol K)].
DISSOLVED_SOLUTES = {"1310-73-2": -102.1}  # NBS tables 1982 (citations.NBS_TABLES_1982)
SOLUTION_CP_RANGE = (273.15, 373.15)  # K, the liquid-water range the constant is used over


def solution_cp(cas):
    """The heat capacity of a dissolved non-volatile solute: its standard partial molar heat
    capacity in water at infinite dilution, held constant (the electrolyte liquid adds the excess
    part); negative for sodium hydroxide, as the hydroxide ion orders the water around it."""
    value = DISSOLVED_SOLUTES[cas]
    fields = {"form": "polynomial", "coefficients": [value], "unit": "J/(mol K)",
              "t_min": SOLUTION_CP_RANGE[0], "t_max": SOLUTION_CP_RANGE[1], "source": "nbs_tables_1982",
              "note": "Solution basis: the standard partial molar heat capacity in water at infinite dilution at "
                      "25 degC (not the pure solid's or melt's), held constant over 0-100 degC (its "
                      "temperature dependence is not represented)."}
    return Table(fields, {"nbs_tables_1982": citations.NBS_TABLES_1982})
