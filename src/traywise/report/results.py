"""The full results record of a run, as written to results.json and printed by ``--json``.

Every key that carries a dimensioned number names its unit (``temperature_K``,
``vapour_flows_mol_per_s``); mole fractions, K-values and fractions are dimensionless. Values
that are not defined are ``null``: the fraction absorbed of a component the gas does not carry,
and the K-value of a component modelled as insoluble (infinite). Stage arrays run from stage 1
(top) to N; per-component arrays follow the order of ``components``. ``results_keys.RESULTS_KEYS``
documents every key; the tests check the written file against it.
"""

import math

import numpy as np

from .. import __version__
from ..column import actual_trays
from .cautions import SAFETY_CAUTIONS

# the units of a case that names none (common practice in basic-engineering documents)
DEFAULT_UNITS = {"temperature": {"unit": "degC", "scale": 1.0, "offset": -273.15},
                 "pressure": {"unit": "kPa", "scale": 1e-3, "offset": 0.0},
                 "flow": {"unit": "kmol/h", "scale": 3.6, "offset": 0.0, "basis": "molar"}}


def results_record(run, files):
    """The results record (a JSON-ready dict) of one run.

    Parameters
    ----------
    run : traywise.run.CaseRun       The case (fields path, title, notes, components, model,
        column, solvent, key_component, overall_efficiency, warnings, echo), its solution and
        side results
    files : list of str              File names of the results folder
    """
    from .comparison_view import comparison_json
    from .design_view import design_json
    from .sizing_view import sizing_json
    from .warning_units import in_display_units

    case, solution = run.case, run.solution
    units = getattr(case, "display_units", None) or DEFAULT_UNITS
    sizing = None if run.sizing is None else sizing_json(run.sizing)
    names = list(solution.component_names)
    column = solution.column
    molar_mass = np.asarray(solution.molar_mass, dtype=float)
    volumes = getattr(run, "liquid_volume_flows", None) or {}
    return {
        "software": {"name": "traywise", "version": __version__},
        "case": {"file": str(case.path), "title": case.title, "notes": case.notes},
        "inputs": plain(case.echo),
        "components": [
            {
                "name": component.name,
                "formula": component.formula,
                "cas": component.cas,
                "equilibrium_model": kind,
                "molar_mass_kg_per_mol": component.molar_mass.value,
            }
            for component, kind in zip(case.model.components, case.model.equilibrium)
        ],
        "column": {
            "theoretical_stages": solution.n_stages,
            "mode": column.mode,
            "top_pressure_Pa": column.top_pressure,
            "pressure_drop_Pa_per_stage": column.pressure_drop,
            "murphree_efficiency": plain(column.murphree),
            "overall_efficiency": case.overall_efficiency,
            "actual_trays": actual_trays(solution.n_stages, case.overall_efficiency),
            "solvent": case.solvent,
            "key_component": case.key_component,
        },
        "stages": {
            "stage": list(range(1, solution.n_stages + 1)),
            "temperature_K": plain(solution.temperature),
            "pressure_Pa": plain(solution.pressure),
            "vapour_flow_mol_per_s": plain(solution.vapour_flow),
            "liquid_flow_mol_per_s": plain(solution.liquid_flow),
            "vapour_flows_mol_per_s": plain(solution.vapour_flows),
            "liquid_flows_mol_per_s": plain(solution.liquid_flows),
            "vapour_mole_fractions": plain(solution.vapour_mole_fractions),
            "liquid_mole_fractions": plain(solution.liquid_mole_fractions),
            "k_values": plain(solution.k_values),
            "heat_removed_W": plain(solution.heat_removed),
        },
        "gas_in": _stream(names, molar_mass, column.gas.component_flows, column.gas.temperature, solution.pressure[-1]),
        "solvent_in": _stream(names, molar_mass, column.solvent.component_flows, column.solvent.temperature,
                              solution.pressure[0], volumes.get("solvent_in")),
        "gas_out": _stream(names, molar_mass, solution.gas_out, solution.temperature[0], solution.pressure[0]),
        "liquid_out": _stream(names, molar_mass, solution.liquid_out, solution.temperature[-1], solution.pressure[-1],
                              volumes.get("liquid_out")),
        "fraction_absorbed": _per_name(names, solution.fraction_absorbed),
        "solvent_lost_mol_per_s": _per_name(names, solution.solvent_lost),
        "temperatures": {
            "max_temperature_K": solution.max_temperature,
            "hottest_stage": solution.hottest_stage,
            "gas_out_temperature_K": solution.gas_out_temperature,
            "liquid_out_temperature_K": solution.liquid_out_temperature,
        },
        "heat": {**{f"{field}_W": plain(value) for field, value in vars(solution.heat).items() if field != "by_component"},
                 "by_component_W": _per_name(names, solution.heat.by_component or [None] * len(names))},
        "solvent_balance": _solvent_balance(case.solvent, run.solvent_balance),
        "electrolyte": _electrolyte(run.speciation, run.physical_henry),
        "display_units": units,
        "inputs_as_written": _as_written(getattr(case, "data", None)),
        "convergence": {
            "iterations": solution.convergence.iterations,
            "scaled_residual": solution.convergence.residual,
            "tolerance": solution.convergence.tolerance,
            "component_closure": _per_name(names, solution.convergence.component_closure),
            "energy_closure": solution.convergence.energy_closure,
            "method": solution.convergence.method,
        },
        "isothermal_comparison": comparison_json(run.comparison, run.kremser),
        "design": None if run.design is None else design_json(run.design),
        "sizing": sizing,
        "property_sources": {c.name: property_sources(c, kind, **_liquid_data(case.model, c.name))
                             for c, kind in zip(case.model.components, case.model.equilibrium)},
        "warnings": list(dict.fromkeys(in_display_units(w, units) for w in
                                       [*run.warnings, *(f"sizing: {w}" for w in (sizing or {}).get("warnings", ()))])),
        "files": sorted(files),
        "safety_cautions": list(SAFETY_CAUTIONS),
    }


def property_sources(component, equilibrium_model, *, activity=None, table=None):
    """Property -> full citation of the data a component contributes under its equilibrium
    model; ``activity`` is the liquid's activity model (Unifac or Nrtl) when the component is
    one of its members, ``table`` its EquilibriumTable under the model 'table'."""
    used = {"molar mass": component.molar_mass, "ideal-gas heat capacity": component.ideal_gas_cp}
    if equilibrium_model in ("henry", "activity"):
        used["Henry's constant in water"] = component.henry_in_water
    if equilibrium_model in ("raoult", "nonvolatile"):
        used["liquid heat capacity"] = component.liquid_cp
    if equilibrium_model in ("raoult", "activity"):
        used["vapour pressure"] = component.vapour_pressure
    if equilibrium_model == "raoult":
        used["heat of vaporisation"] = component.heat_of_vaporisation
    sources = {label: component.cite(data.source) for label, data in used.items() if data is not None}
    if activity is not None:
        label = "activity coefficients"
        if equilibrium_model == "activity":
            label += " (corrected to the Henry's constant at infinite dilution in water)"
        sources[label] = activity_citation(activity)
    if table is not None:
        sources[f"equilibrium table in {table.solvent}"] = table.source
    return sources


def activity_citation(activity):
    """The citation of an activity model: UNIFAC's publications, or NRTL's with the user's source."""
    if activity.version == "nrtl":
        return f"NRTL: H. Renon, J. M. Prausnitz, AIChE J. 14 (1968) 135; parameters: {activity.source}"
    return activity.source


def _liquid_data(model, name):
    """The activity model (when ``name`` is a member) and equilibrium table of one component."""
    activity = model.activity if model.activity is not None and name in model.activity.names else None
    return {"activity": activity, "table": model.tables.get(name)}


def _per_name(names, values):
    return {name: plain(value) for name, value in zip(names, values)}


def _stream(names, molar_mass, flows, temperature, pressure, volume=None):
    flows = np.asarray(flows, dtype=float)
    total, masses = float(np.sum(flows)), flows * molar_mass
    mass = float(masses.sum())
    return {
        "temperature_K": float(temperature),
        "pressure_Pa": float(pressure),
        "flow_mol_per_s": total,
        "component_flows_mol_per_s": {name: float(f) for name, f in zip(names, flows)},
        "mole_fractions": {name: float(f) / total for name, f in zip(names, flows)},
        "mass_flow_kg_per_s": mass,
        "mass_fractions": {name: float(m) / mass for name, m in zip(names, masses)},
        "liquid_volume_flow_m3_per_s": None if volume is None else float(volume),
    }


def _electrolyte(speciation, physical):
    if speciation is None:
        return None
    with_henry = None if physical is None else {
        "fraction_absorbed": _per_name(list(physical.component_names), physical.fraction_absorbed),
        "gas_out_mol_per_s": _per_name(list(physical.component_names), physical.gas_out),
        "max_component_closure": float(np.max(physical.convergence.component_closure)),
        "energy_closure": float(physical.convergence.energy_closure),
    }
    return {
        "species": list(speciation.species),
        "pH": plain(speciation.ph),
        "ionic_strength_mol_per_kg": plain(speciation.ionic_strength),
        "molality_mol_per_kg": {name: plain(speciation.molality[:, k]) for k, name in enumerate(speciation.species)},
        "caustic_left_mol_per_kg": plain(speciation.caustic_left),
        "with_henry": with_henry,
    }


def _solvent_balance(solvent, balance):
    if balance is None:
        return None
    mass = balance.solvent_molar_mass
    return {"solvent": solvent, "evaporated_kg_per_s": balance.evaporated * mass,
            "condensed_kg_per_s": balance.condensed * mass, "make_up_kg_per_s": balance.make_up * mass,
            "gained_kg_per_s": balance.gained * mass}


def _as_written(data):
    """The case's tables as written, without title and notes (they head the report)."""
    if data is None:
        return None
    return plain({key: value for key, value in data.items() if key not in ("title", "notes")})


def plain(value):
    """numpy values, arrays, tuples and dicts as JSON-ready Python; NaN and infinity as None."""
    if isinstance(value, dict):
        return {str(key): plain(item) for key, item in value.items()}
    if isinstance(value, (list, tuple, np.ndarray)):
        return [plain(item) for item in value]
    if isinstance(value, (bool, np.bool_)):
        return bool(value)
    if isinstance(value, (int, np.integer)):
        return int(value)
    if isinstance(value, (float, np.floating)):
        return float(value) if math.isfinite(value) else None
    return value
