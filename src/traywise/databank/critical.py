"""Critical constants and acentric factor of a component, for the equation of state.

Choice, in order: the reference equation of state (its critical point and acentric factor as
CoolProp gives them), then, as shipped in chemicals, the IUPAC critical compilations, the PSRK
parameter table (Horstmann et al. 2005) and Passut and Danner (acentric factor).
"""

import chemicals
from chemicals import Pc, Pc_methods, Tc, Tc_methods, omega, omega_methods
from CoolProp import CoolProp as coolprop

from . import citations

CHOICE = ("HEOS", "IUPAC", "PSRK", "PD")
METHOD_SOURCES = {
    "IUPAC": "IUPAC critical-property compilations, D. Ambrose, C. Tsonopoulos, K. N. Marsh, D. W. Morton et al., "
    "Vapor-liquid critical properties of elements and compounds, parts 1-12, J. Chem. Eng. Data (1995-2015)",
    "PSRK": "S. Horstmann, A. Jablonies, K. Fischer, J. Gmehling et al., PSRK group contribution equation of state: "
    "comprehensive revision and extension IV, Fluid Phase Equilib. 227 (2005) 157-164, parameter table",
    "PD": "R. A. Passut, R. P. Danner, Acentric factor: a valuable correlating parameter for the properties of "
    "hydrocarbons, Ind. Eng. Chem. Process Des. Dev. 12 (1973) 365-368",
}
KINDS = {  # table name: (chemicals function, its methods, unit, CoolProp output)
    "critical_temperature": (Tc, Tc_methods, "K", "Tcrit"),
    "critical_pressure": (Pc, Pc_methods, "Pa", "pcrit"),
    "acentric_factor": (omega, omega_methods, "-", "acentric"),
}


def _citation(method, cas):
    if method == "HEOS":
        return citations.coolprop_eos_citation(citations.coolprop_fluids_by_cas()[cas])
    return f"{METHOD_SOURCES[method]}; via chemicals {chemicals.__version__} (method '{method}')"


def critical_tables(cas):
    """{table name: (fields, {source key: citation})} for Tc, Pc and omega; tables chemicals has
    no value for are left out."""
    found = {}
    fluid = citations.coolprop_fluids_by_cas().get(cas)
    for name, (function, methods, unit, output) in KINDS.items():
        available = [m for m in CHOICE if m in methods(cas) and (m != "HEOS" or fluid is not None)]
        if not available and fluid is None:
            continue
        method = "HEOS" if fluid is not None else available[0]
        key = f"critical_{method.lower()}"
        value = coolprop.PropsSI(output, fluid) if method == "HEOS" else function(cas, method=method)
        fields = {"value": float(value), "unit": unit, "source": key}
        if method != CHOICE[0]:
            fields["note"] = f"No reference equation of state; chosen: '{method}' ({', '.join(CHOICE)} in that order)."
        found[name] = (fields, {key: _citation(method, cas)})
    return found
