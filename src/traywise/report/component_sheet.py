"""Plain-text sheets of component data: a one-line-per-component library table, and a sheet of
one component with every property, its valid range, full source citation and note.

Reads ``Component`` records only (no property library, no unit library), so listing the
library is instant.
"""

import math
import textwrap

from ..properties.constants import GAS_CONSTANT, T_REFERENCE
from .tables import text_table

WIDTH = 100


def library_table(components):
    """One line per component: name, formula, CAS number, molar mass [g/mol], default equilibrium."""
    rows = [(c.name, c.formula, c.cas or "-", f"{1000.0 * c.molar_mass.value:.4f}", default_models(c)) for c in components]
    return text_table(("component", "formula", "CAS", "molar mass [g/mol]", "equilibrium"), rows)


def default_models(component):
    """The library's default equilibrium model: 'henry', or 'electrolyte in water, else henry'."""
    if component.equilibrium_in_water:
        return f"{component.equilibrium_in_water} in water, else {component.equilibrium}"
    return component.equilibrium


def component_sheet(component):
    """Every property of one component with its value or coefficients, valid range, source and note."""
    title = f"{component.name} ({component.formula}, CAS {component.cas or '-'})"
    lines = [title, "=" * len(title)]
    if component.aliases:
        lines.append(f"also called: {', '.join(component.aliases)}")
    if component.equilibrium_in_water:
        lines.append(f"default equilibrium model with water as solvent: {component.equilibrium_in_water}; "
                     f"with another solvent: {component.equilibrium}")
    else:
        lines.append(f"default equilibrium model: {component.equilibrium}")
    lines.append(f"data from: {component.origin}")
    for key, heading, body, source in _properties(component):
        lines += ["", heading]
        for line in body:
            lines += textwrap.wrap(line, WIDTH, initial_indent="  ", subsequent_indent="    ", break_on_hyphens=False)
        lines += _wrapped("source: ", component.cite(source))
        if key in component.notes:
            lines += _wrapped("note: ", component.notes[key])
    return "\n".join(lines) + "\n"


def _wrapped(label, text):
    return textwrap.wrap(text, WIDTH, initial_indent=f"  {label}", subsequent_indent=" " * (2 + len(label)),
                         break_on_hyphens=False)


def _valid(record):
    return f"valid {record.t_min:.2f} K to {record.t_max:.2f} K"


def _coefficients(values):
    return ", ".join(f"{value:.10g}" for value in values)


def _heat_capacity(record):
    if record.offset == 0.0 and record.scale == 1.0:
        form = "Cp = sum c_k T**k [J/(mol K)], coefficients highest power first"
    else:
        form = "Cp = P(s) [J/(mol K)], s = (2T - t_max - t_min)/(t_max - t_min), coefficients highest power first"
    return [form, f"coefficients: {_coefficients(record.coefficients)}", _valid(record),
            f"Cp(298.15 K) = {record.heat_capacity(T_REFERENCE):.4f} J/(mol K)"]


def _properties(component):
    """(table key, heading, lines, source key) of each property the component has."""
    c = component
    found = [("molar_mass", "molar mass", [f"{1000.0 * c.molar_mass.value:.5f} g/mol"], c.molar_mass.source)]
    if c.melting_point is not None:
        found.append(("melting_point", "melting point", [f"{c.melting_point.value:.2f} K"], c.melting_point.source))
    for key, heading, unit in (("critical_temperature", "critical temperature", "K"),
                               ("critical_pressure", "critical pressure", "Pa"), ("acentric_factor", "acentric factor", "-")):
        record = getattr(c, key)
        if record is not None:
            found.append((key, heading, [f"{record.value:.6g} {unit}"], record.source))
    found.append(("ideal_gas_cp", "ideal-gas heat capacity", _heat_capacity(c.ideal_gas_cp), c.ideal_gas_cp.source))
    if c.liquid_cp is not None:
        found.append(("liquid_cp", "liquid heat capacity", _heat_capacity(c.liquid_cp), c.liquid_cp.source))
    if c.vapour_pressure is not None:
        record = c.vapour_pressure
        if record.form == "iapws_if97":
            body = ["IAPWS-IF97 saturation-pressure equation (region 4)"]
        else:
            body = ["ln(P/Pa) = a + b/T + c ln T + d T**e", f"a..e: {_coefficients(record.coefficients)}"]
        psat = math.exp(float(record.ln_pressure(T_REFERENCE)[0]))
        found.append(("vapour_pressure", "vapour pressure", body + [_valid(record), f"P(298.15 K) = {psat:.6g} Pa"],
                      record.source))
    if c.heat_of_vaporisation is not None:
        record = c.heat_of_vaporisation
        found.append(("heat_of_vaporisation", "heat of vaporisation",
                      [f"{record.value:.1f} J/mol at {record.temperature:.2f} K"], record.source))
    if c.henry_in_water is not None:
        record = c.henry_in_water
        h_reference = math.exp(float(record.ln_constant(T_REFERENCE)[0]))
        if record.form == "iapws_2004":
            form = ["ln(H/p1*) = A/Tr + B tau**0.355/Tr + C Tr**-0.41 exp(tau), Tr = T/647.096 K, tau = 1 - Tr, "
                    "p1* the vapour pressure of water, H = f/x (mole-fraction basis)",
                    f"A, B, C: {_coefficients(record.coefficients[:3])}"]
        else:
            form = ["ln(H/Pa) = a + b/T + c ln T + d T + e/T**2 + f T**2, H = p/x (mole-fraction basis)",
                    f"a..f: {_coefficients(record.coefficients)}"]
        body = [*form, _valid(record),
                f"H(298.15 K) = {h_reference:.5g} Pa; enthalpy of solution at 298.15 K = "
                f"{float(record.solution_enthalpy(T_REFERENCE)) / 1000.0:.2f} kJ/mol "
                f"(d ln H/d(1/T) = {float(record.solution_enthalpy(T_REFERENCE)) / GAS_CONSTANT:.1f} K)"]
        found.append(("henry_in_water", "Henry's constant in water", body, record.source))
    if c.partial_molar_volume is not None:
        record = c.partial_molar_volume
        found.append(("partial_molar_volume_in_water", "partial molar volume at infinite dilution in water",
                      [f"{record.value * 1e6:.1f} cm3/mol at {record.temperature:.2f} K"], record.source))
    return found + _transport(component)


def _transport(component):
    """The sizing tables (properties/transport.py): curves with their 25 degC value, and scalars."""
    from ..properties.transport import CURVES, transport_data

    data, found = transport_data(component), []
    for key, unit in CURVES.items():
        curve = getattr(data, key)
        if curve is not None:
            body = ["stable polynomial in s = (2T - t_max - t_min)/(t_max - t_min)", _valid(curve),
                    f"at 298.15 K: {float(curve(T_REFERENCE)):.5g} {unit}"]
            found.append((key, f"{key.replace('_', ' ')} (for sizing)", body, curve.source))
    for key, heading, unit in (("diffusion_volume", "Fuller diffusion volume (for sizing)", ""),
                               ("boiling_molar_volume", "molar volume at the normal boiling point (for sizing)", " m3/mol")):
        value = getattr(data, key)
        if value is not None:
            found.append((key, heading, [f"{value:.5g}{unit}"], data.citations[key]))
    return found
