"""The report's section on the aqueous electrolyte liquid: pH, ionic strength and the molality of
every species on every stage, read from the results record's ``electrolyte`` section."""

from ..properties.constants import TRACE_MOLE_FRACTION
from ..properties.electrolyte.pitzer import WATER_MOLAR_MASS
from .tables import concentration, percent

# the trace floor as a molality in (nearly pure) water, about 5.6e-11 mol/kg: a solute's forms
# below it are not resolved by the solved column (its mole fraction is below TRACE_MOLE_FRACTION)
TRACE_MOLALITY = TRACE_MOLE_FRACTION / WATER_MOLAR_MASS
RESOLVED_ALWAYS = ("H+", "OH-")  # set by the water equilibrium and the charge balance, resolved at any level

SECTION = "Liquid chemistry (aqueous electrolyte)"
NOTE = ("Species molalities per kg of water on each stage, from the converged profile; pH is -log10 of "
        "the hydrogen-ion activity on the molality basis. Forms of a solute below "
        f"{TRACE_MOLALITY:.2g} mol/kg (a mole fraction of {TRACE_MOLE_FRACTION:g}) print as \"< {TRACE_MOLALITY:.2g}\": "
        "the solved column does not resolve them. The model's stated range and any caustic used up are in the warnings.")


def electrolyte_blocks(results):
    """Report blocks (heading, kind, body) of the electrolyte section, none without one."""
    chemistry = results.get("electrolyte")
    if chemistry is None:
        return []
    species = chemistry["species"]
    headers = ["stage", "pH", "I [mol/kg]"] + [f"{name} [mol/kg]" for name in species]
    rows = [
        (str(j + 1), f"{chemistry['pH'][j]:.2f}", f"{chemistry['ionic_strength_mol_per_kg'][j]:.3g}",
         *(_molality(name, chemistry['molality_mol_per_kg'][name][j]) for name in species))
        for j in range(len(chemistry["pH"]))
    ]
    return [(SECTION, "table", (headers, rows)), (None, "text", NOTE), *_with_and_without(results)]


def _molality(name, value):
    """A species molality [mol/kg] as text; "< 5.6e-11" for a solute's form below the trace floor."""
    if name not in RESOLVED_ALWAYS and 0.0 < value < TRACE_MOLALITY:
        return f"< {TRACE_MOLALITY:.2g}"
    return f"{value:.3g}"


def _with_and_without(results):
    """The same column with and without the electrolyte liquid: absorbed and left in the gas per
    solute, both closures."""
    physical = results["electrolyte"]["with_henry"]
    if physical is None:
        return []
    names = [c["name"] for c in results["components"] if c["equilibrium_model"] == "electrolyte"]
    gas_out = results["gas_out"]
    rigorous_left = {name: gas_out["component_flows_mol_per_s"][name] / gas_out["flow_mol_per_s"] for name in names}
    henry_gas = physical["gas_out_mol_per_s"]
    henry_left = {name: henry_gas[name] / sum(henry_gas.values()) for name in names}
    rows = []
    for name in names:
        rows.append((f"{name} absorbed [%]", percent(results["fraction_absorbed"][name]),
                     percent(physical["fraction_absorbed"][name])))
        rows.append((f"{name} in the gas out", concentration(rigorous_left[name]), concentration(henry_left[name])))
    closure = max(results["convergence"]["component_closure"].values())
    rows.append(("largest component balance closure [-]", f"{closure:.1e}", f"{physical['max_component_closure']:.1e}"))
    rows.append(("energy balance closure [-]", f"{results['convergence']['energy_closure']:.1e}",
                 f"{physical['energy_closure']:.1e}"))
    headers = ["", "electrolyte liquid (this run)", "physical Henry's law (same column)"]
    return [("With and without the electrolyte liquid", "table", (headers, rows))]
